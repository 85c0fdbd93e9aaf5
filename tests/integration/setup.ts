import { afterAll } from 'vitest';
import { pool } from '$lib/server/db';

if (!process.env.DATABASE_URL) {
	throw new Error(
		'Integration tests need the test database: run `npm test`, or see DEVELOPERS.md ("One test file")'
	);
}

afterAll(async () => {
	await pool.end();
});
