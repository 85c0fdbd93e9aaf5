import {
	and,
	asc,
	eq,
	getTableColumns,
	gte,
	inArray,
	lte,
	sql,
	type AnyColumn,
	type SQL
} from 'drizzle-orm';
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core';
import { stripeCharge, stripePayout, stripeRefund, stripeSync } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';

export type StripeCharge = typeof stripeCharge.$inferSelect;
export type StripeRefund = typeof stripeRefund.$inferSelect;
export type StripePayout = typeof stripePayout.$inferSelect;
export type StripeSyncState = typeof stripeSync.$inferSelect;

type Row<T> = Omit<T, 'organizationId' | 'syncedAt'>;

/** Every column but the key, set from the row being written (`excluded.*`), for an upsert. */
function replaced(table: PgTable, keep: string[]) {
	const set: Record<string, SQL> = {};
	for (const [field, column] of Object.entries(getTableColumns(table))) {
		if (!keep.includes(field)) set[field] = sql.raw(`excluded."${column.name}"`);
	}
	return set;
}

/** Upserts rows as Stripe has them now, 500 to a statement; a row already kept is replaced. */
async function save<T extends PgTable & { organizationId: PgColumn; id: PgColumn }>(
	tx: StoreWriteTx,
	table: T,
	rows: Record<string, unknown>[]
) {
	const set = replaced(table, ['organizationId', 'id']);
	for (let at = 0; at < rows.length; at += 500) {
		const values = rows
			.slice(at, at + 500)
			.map((row) => ({ ...row, organizationId: tx.storeId, syncedAt: new Date() }));
		await tx
			.insert(table)
			.values(values as never)
			.onConflictDoUpdate({ target: [table.organizationId, table.id], set });
	}
}

export const saveCharges = (tx: StoreWriteTx, rows: Row<StripeCharge>[]) =>
	save(tx, stripeCharge, rows);
export const saveRefunds = (tx: StoreWriteTx, rows: Row<StripeRefund>[]) =>
	save(tx, stripeRefund, rows);
export const savePayouts = (tx: StoreWriteTx, rows: Row<StripePayout>[]) =>
	save(tx, stripePayout, rows);

/** At most this many of each kind in one period: a store's month is far below it. */
const MOST_IN_PERIOD = 10_000;

/** Rows of the store that Stripe created in the period (both ends included). */
const createdIn = (
	tx: StoreTx,
	table: { organizationId: AnyColumn; stripeCreated: AnyColumn },
	from: Date,
	to: Date
) =>
	and(
		eq(table.organizationId, tx.storeId),
		gte(table.stripeCreated, from),
		lte(table.stripeCreated, to)
	);

/** The store's charges Stripe created in the period, oldest first. */
export const chargesIn = (tx: StoreTx, from: Date, to: Date) =>
	tx
		.select()
		.from(stripeCharge)
		.where(createdIn(tx, stripeCharge, from, to))
		.orderBy(asc(stripeCharge.stripeCreated))
		.limit(MOST_IN_PERIOD);

export const refundsIn = (tx: StoreTx, from: Date, to: Date) =>
	tx
		.select()
		.from(stripeRefund)
		.where(createdIn(tx, stripeRefund, from, to))
		.orderBy(asc(stripeRefund.stripeCreated))
		.limit(MOST_IN_PERIOD);

export const payoutsIn = (tx: StoreTx, from: Date, to: Date) =>
	tx
		.select()
		.from(stripePayout)
		.where(createdIn(tx, stripePayout, from, to))
		.orderBy(asc(stripePayout.stripeCreated))
		.limit(MOST_IN_PERIOD);

/** Payouts still on their way to the bank, whose state may yet change (the oldest `limit`). */
export async function unfinishedPayouts(tx: StoreTx, limit = 100): Promise<string[]> {
	const rows = await tx
		.select({ id: stripePayout.id })
		.from(stripePayout)
		.where(
			and(
				eq(stripePayout.organizationId, tx.storeId),
				inArray(stripePayout.status, ['pending', 'in_transit'])
			)
		)
		.orderBy(asc(stripePayout.stripeCreated))
		.limit(limit);
	return rows.map((r) => r.id);
}

export async function readSync(tx: StoreTx): Promise<StripeSyncState | undefined> {
	const [row] = await tx.select().from(stripeSync).where(eq(stripeSync.organizationId, tx.storeId));
	return row;
}

/** A sync that ran: when, and (when it reached back to the last one) how far it is complete. */
export async function noteSync(tx: StoreWriteTx, syncedUntil: Date | null) {
	const now = new Date();
	const values = { lastRunAt: now, lastError: null, lastErrorAt: null };
	await tx
		.insert(stripeSync)
		.values({ organizationId: tx.storeId, syncedUntil, ...values })
		.onConflictDoUpdate({
			target: stripeSync.organizationId,
			set: {
				...values,
				...(syncedUntil
					? { syncedUntil: sql`greatest(${stripeSync.syncedUntil}, ${syncedUntil})` }
					: {})
			}
		});
}

export async function noteSyncError(tx: StoreWriteTx, message: string) {
	const now = new Date();
	await tx
		.insert(stripeSync)
		.values({ organizationId: tx.storeId, lastError: message, lastErrorAt: now })
		.onConflictDoUpdate({
			target: stripeSync.organizationId,
			set: { lastError: message, lastErrorAt: now }
		});
}
