// `npm run db:migrate`: applies the migrations in `drizzle/` to the database at
// DATABASE_OWNER_URL (the schema owner; the app's own role cannot change the schema). The app
// servers never migrate: run this once, as a step before a new release is rolled out (README,
// "Deploying on several servers"). Two runs at once take turns on an advisory lock, so the
// second applies nothing.
import { migrate } from './lib/postgres.js';

const url = process.env.DATABASE_OWNER_URL || process.env.MIGRATION_DATABASE_URL;
if (!url) {
	console.error('Set DATABASE_OWNER_URL to the schema owner\u2019s connection string');
	process.exit(1);
}
migrate(url).then(
	() => console.log('Migrations applied'),
	(e) => {
		console.error(`Migrations failed: ${e.message}`);
		process.exit(1);
	}
);
