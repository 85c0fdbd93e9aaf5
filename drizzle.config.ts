import { defineConfig } from 'drizzle-kit';

// `db:generate` needs no database; `db:migrate` runs as the schema owner (the app's own role
// cannot create tables). `npm start` and `npm test` migrate on their own (scripts/lib/postgres.js).
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
