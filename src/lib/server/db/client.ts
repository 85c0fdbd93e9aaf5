import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

/** A pool and its Drizzle database. */
export function createDb(url: string, max = 10) {
	const pool = new pg.Pool({ connectionString: url, max });
	const db = drizzle(pool, { schema, casing: 'snake_case' });
	return { pool, db };
}

export type Db = ReturnType<typeof createDb>['db'];
