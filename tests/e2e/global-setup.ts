import { execFileSync } from 'node:child_process';

/** Every run starts from the demo data: empty the tables, then seed. */
export default function globalSetup() {
	if (!process.env.DATABASE_OWNER_URL) throw new Error('Run the browser tests through `npm test`');
	execFileSync('npx', ['tsx', 'scripts/seed.ts', '--reset'], {
		stdio: 'inherit',
		env: process.env
	});
}
