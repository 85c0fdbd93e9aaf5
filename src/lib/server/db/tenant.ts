import { log } from '../log';
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import type pg from 'pg';
import { pool as appPool } from './index';
import { databaseUnavailable, isDatabaseUnavailable } from './unavailable';

declare const storeTxBrand: unique symbol;

/** What a store transaction may do: read only (a consistent snapshot), or read and write. */
export type TxMode = 'read' | 'write';

/**
 * One database transaction scoped to one store: `app.store_id` is set for row-level security,
 * and `storeId` says which store, so query functions never take a second, possibly different,
 * store id. The brand keeps it apart from the pool (`db`) and from a plain transaction: neither
 * can be passed where a store transaction is wanted. It is opened once per load, action or
 * workflow (`inStore`, `readInStore`) and handed down to the query functions.
 */
export type StoreTx<M extends TxMode = TxMode> = Omit<
	NodePgDatabase,
	'transaction' | '$client' | '$cache'
> & {
	readonly storeId: string;
	readonly [storeTxBrand]: M;
};

/** A store transaction that may write: what writing query functions ask for. */
export type StoreWriteTx = StoreTx<'write'>;

interface Internals {
	client: pg.PoolClient;
	afterCommit: (() => void | Promise<void>)[];
}

// What the tasks module needs from a transaction (its pg client, to enqueue in it, and work to
// run once it commits), kept off the transaction's public face.
const internals = new WeakMap<object, Internals>();

/**
 * The pg client of a store transaction, for libraries that run their own SQL in it (pg-boss), and
 * for statements prepared once and run in any transaction (`runShape`).
 */
export function clientOf(tx: StoreTx): pg.PoolClient {
	const found = internals.get(tx);
	if (!found) throw new Error('Not a store transaction');
	return found.client;
}

/** Runs `work` once the transaction has committed (never when it rolls back). */
export function afterCommit(tx: StoreWriteTx, work: () => void | Promise<void>) {
	const found = internals.get(tx);
	if (!found) throw new Error('Not a store transaction');
	found.afterCommit.push(work);
}

const BEGIN: Record<TxMode, string> = {
	// Reads of one page agree with each other: one snapshot for the whole transaction.
	read: 'begin isolation level repeatable read read only',
	// Writes keep READ COMMITTED: a row lock taken with FOR UPDATE waits for the other writer and
	// then sees what it committed, which is what the state checks after a lock rely on.
	write: 'begin'
};

/**
 * A transaction that could not reach the database (PostgreSQL restarting, no connection to be
 * had) is rolled back by PostgreSQL itself: the request is answered 503 "try again", not 500.
 */
async function run<T, M extends TxMode>(
	mode: M,
	storeId: string,
	work: (tx: StoreTx<M>) => Promise<T>,
	pool: pg.Pool,
	plans?: Plans
): Promise<T> {
	try {
		return await runOnce(mode, storeId, work, pool, plans);
	} catch (e) {
		if (!isDatabaseUnavailable(e)) throw e;
		log.warn({ err: e instanceof Error ? e.message : String(e), storeId }, 'Database unavailable');
		throw databaseUnavailable();
	}
}

async function runOnce<T, M extends TxMode>(
	mode: M,
	storeId: string,
	work: (tx: StoreTx<M>) => Promise<T>,
	pool: pg.Pool,
	plans?: Plans
): Promise<T> {
	if (!storeId) throw new Error('A store transaction needs a store id');
	const client = await pool.connect();
	const own: Internals = { client, afterCommit: [] };
	let broken: Error | undefined;
	let result: T;
	try {
		// The store for row-level security; and no parallel workers: a store's transaction reads a
		// page or a few rows, and starting a worker (tens of milliseconds on a busy two-core host)
		// costs more than any scan here saves (bench/README.md, the installer's today page). Sent
		// with BEGIN as one simple query, one round trip for both: the id is therefore quoted as a
		// literal (pg's escapeLiteral), not sent as a parameter, which a simple query cannot carry.
		// Generic plans, when asked for, are set the same way, for this transaction only.
		const generic =
			plans === 'generic' ? `, set_config('plan_cache_mode', 'force_generic_plan', true)` : '';
		await client.query(
			`${BEGIN[mode]}; select set_config('app.store_id', ${client.escapeLiteral(storeId)}, true), set_config('max_parallel_workers_per_gather', '0', true)${generic}`
		);
		const tx = drizzle(client, { casing: 'snake_case' }) as unknown as StoreTx<M>;
		Object.defineProperty(tx, 'storeId', { value: storeId, enumerable: true });
		internals.set(tx, own);
		result = await work(tx);
		await client.query('commit');
	} catch (e) {
		try {
			await client.query('rollback');
		} catch (rollbackFailed) {
			// The connection is unusable: the pool must drop it rather than lend it out again.
			broken = rollbackFailed as Error;
		}
		throw e;
	} finally {
		client.release(broken);
	}
	for (const next of own.afterCommit) {
		try {
			await next();
		} catch (e) {
			log.error({ err: e, storeId }, 'Work after a commit failed');
		}
	}
	return result;
}

/**
 * Runs `work` in one read-write transaction of the store. The setting of `app.store_id` ends with
 * the transaction, so a pooled connection never carries it to the next request. Throw SvelteKit's
 * `error()`/`redirect()` after it returns, not inside: a throw inside rolls everything back.
 */
export function inStore<T>(
	storeId: string,
	work: (tx: StoreWriteTx) => Promise<T>,
	pool: pg.Pool = appPool
): Promise<T> {
	return run('write', storeId, work, pool);
}

/**
 * How a read transaction's statements are planned. By default as PostgreSQL chooses: a kept
 * statement is planned for its values on each of its first five runs, then keeps one generic plan
 * unless that is priced above the plans for the values. `generic`: every statement takes its
 * generic plan, made once per connection for a kept statement; for a read whose plan PostgreSQL
 * would otherwise make again on every run although the generic one reads the same way (a page
 * of the big store's job list: bench/README.md).
 */
export type Plans = 'generic';

/** Runs `work` in one read-only transaction of the store: every read sees the same snapshot. */
export function readInStore<T>(
	storeId: string,
	work: (tx: StoreTx<'read'>) => Promise<T>,
	{ pool = appPool, plans }: { pool?: pg.Pool; plans?: Plans } = {}
): Promise<T> {
	return run('read', storeId, work, pool, plans);
}
