import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

/** The pool's size unless DATABASE_POOL_MAX says otherwise. */
export const DEFAULT_POOL_SIZE = 10;
/** The most a server may ask for: a managed PostgreSQL shares its connections among servers. */
export const MAX_POOL_SIZE = 200;

/**
 * `DATABASE_POOL_MAX`: how many connections one server opens for requests (its task worker keeps
 * 3 more). A whole number from 1 to 200; anything else stops start-up with this message.
 */
export function poolSize(raw: string | undefined): number {
	if (raw === undefined || raw === '') return DEFAULT_POOL_SIZE;
	const n = Number(raw);
	if (!/^\d+$/.test(raw) || n < 1 || n > MAX_POOL_SIZE) {
		throw new Error(
			`DATABASE_POOL_MAX must be a whole number from 1 to ${MAX_POOL_SIZE} (got "${raw}")`
		);
	}
	return n;
}

/** A pool and its Drizzle database. */
export function createDb(url: string, max = DEFAULT_POOL_SIZE) {
	const pool = new pg.Pool({ connectionString: url, max });
	const db = drizzle(pool, { schema, casing: 'snake_case' });
	return { pool, db };
}

export type Db = ReturnType<typeof createDb>['db'];
