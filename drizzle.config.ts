import { defineConfig } from 'drizzle-kit';

// `db:generate` needs no database. Migrations are applied by scripts/lib/postgres.js (`npm start`,
// `npm test`, and `npm run db:migrate` with DATABASE_OWNER_URL, the schema owner: the app's own
// role cannot create tables), under an advisory lock; drizzle-kit's own `migrate` takes no lock.
export default defineConfig({
	schema: './src/lib/server/db/schema.ts',
	out: './drizzle',
	dialect: 'postgresql',
	dbCredentials: {
		url:
			process.env.MIGRATION_DATABASE_URL ?? 'postgres://flushline_owner@127.0.0.1:54320/flushline'
	},
	strict: true,
	verbose: true
});
