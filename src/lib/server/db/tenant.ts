import { sql } from 'drizzle-orm';
import type { Db } from './client';
import { db as appDb } from './index';

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/**
 * Runs `work` in one transaction with `app.store_id` set to the store, for row-level security:
 * inside, the domain tables show only that store's rows; the setting ends with the transaction,
 * so a pooled connection never carries it to the next request.
 */
export async function inStore<T>(
	storeId: string,
	work: (tx: Tx) => Promise<T>,
	database: Db = appDb
): Promise<T> {
	if (!storeId) throw new Error('inStore needs a store id');
	return database.transaction(async (tx) => {
		await tx.execute(sql`select set_config('app.store_id', ${storeId}, true)`);
		return work(tx);
	});
}
