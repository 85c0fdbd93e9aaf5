import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import { log } from '../log';
import * as schema from './schema';

/**
 * A pool and its Drizzle database. A connection PostgreSQL ends while it sits idle in the pool (a
 * restart, a failover) makes the pool emit `error`: logged and dropped (the pool discards that
 * client and opens a new one on the next use), never an uncaught event that ends the process.
 * A connection attempt gives up after 10 s, so a database that does not answer is a quick 503,
 * not a request hanging.
 */
export function createDb(url: string, max = 10) {
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
