import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import { log } from '../log';
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

/**
 * A pool and its Drizzle database. A connection PostgreSQL ends while it sits idle in the pool (a
 * restart, a failover) makes the pool emit `error`: logged and dropped (the pool discards that
 * client and opens a new one on the next use), never an uncaught event that ends the process.
 * A connection attempt gives up after 10 s, so a database that does not answer is a quick 503,
 * not a request hanging.
 */
export function createDb(url: string, max = DEFAULT_POOL_SIZE) {
	const pool = new pg.Pool({ connectionString: url, max, connectionTimeoutMillis: 10_000 });
	pool.on('error', (err) => log.warn({ err: err.message }, 'A database connection ended'));
	// A connection that ends while lent out, between two queries (the server shut down in the
	// middle of a transaction), emits `error` on its client, which the pool does not listen to
	// then: without this the process would end. The next query on it fails, the transaction is
	// rolled back and the client is dropped when released.
	pool.on('connect', (client) => {
		client.on('error', (err) => log.debug({ err: err.message }, 'A database connection ended'));
	});
	const db = drizzle(pool, { schema, casing: 'snake_case' });
	return { pool, db };
}

export type Db = ReturnType<typeof createDb>['db'];
