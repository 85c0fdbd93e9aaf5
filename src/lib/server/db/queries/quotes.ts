import { and, desc, eq, ne, sql } from 'drizzle-orm';
import { quote, user } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { runShape } from '../named';

export type Quote = typeof quote.$inferSelect;
export type QuoteStatus = Quote['status'];

/** A quote version without its stored input and result, for lists. */
const summaryColumns = {
	id: quote.id,
	jobId: quote.jobId,
	version: quote.version,
	status: quote.status,
	currency: quote.currency,
	subtotalCents: quote.subtotalCents,
	taxCents: quote.taxCents,
	totalCents: quote.totalCents,
	depositCents: quote.depositCents,
	validUntil: quote.validUntil,
	sentAt: quote.sentAt,
	sentTo: quote.sentTo,
	acceptedAt: quote.acceptedAt,
	acceptedName: quote.acceptedName,
	changeNote: quote.changeNote,
	changeRequestedAt: quote.changeRequestedAt,
	createdAt: quote.createdAt,
	createdByName: user.name
};

export type QuoteSummary = Awaited<ReturnType<typeof list>>[number];

/** Every version of a job's quote, newest first. */
export async function list(tx: StoreTx, jobId: string) {
	return runShape(
		tx,
		'quotes.list',
		() =>
			tx
				.select(summaryColumns)
				.from(quote)
				.leftJoin(user, eq(user.id, quote.createdBy))
				.where(
					and(
						eq(quote.organizationId, sql.placeholder('store')),
						eq(quote.jobId, sql.placeholder('job'))
					)
				)
				.orderBy(desc(quote.version)),
		{ store: tx.storeId, job: jobId }
	);
}

/** One version with what it was built from and what the engine said. */
export async function read(tx: StoreTx, id: string): Promise<Quote | undefined> {
	const [row] = await runShape(
		tx,
		'quotes.read',
		() =>
			tx
				.select()
				.from(quote)
				.where(
					and(
						eq(quote.organizationId, sql.placeholder('store')),
						eq(quote.id, sql.placeholder('id'))
					)
				),
		{ store: tx.storeId, id }
	);
	return row;
}

export async function readVersion(tx: StoreTx, jobId: string, version: number) {
	const [row] = await tx
		.select()
		.from(quote)
		.where(
			and(eq(quote.organizationId, tx.storeId), eq(quote.jobId, jobId), eq(quote.version, version))
		);
	return row;
}

/**
 * The version a customer's link shows: the newest one that was sent (it may since have been
 * accepted or sent back for changes). Drafts are never shown to customers.
 */
export async function forCustomer(tx: StoreTx, jobId: string): Promise<Quote | undefined> {
	const [row] = await tx
		.select()
		.from(quote)
		.where(
			and(
				eq(quote.organizationId, tx.storeId),
				eq(quote.jobId, jobId),
				ne(quote.status, 'draft'),
				ne(quote.status, 'superseded')
			)
		)
		.orderBy(desc(quote.version))
		.limit(1);
	return row;
}

/** The newest accepted version of a job's quote, whole (the one the work is sold on). */
export async function accepted(tx: StoreTx, jobId: string): Promise<Quote | undefined> {
	const [row] = await tx
		.select()
		.from(quote)
		.where(
			and(
				eq(quote.organizationId, tx.storeId),
				eq(quote.jobId, jobId),
				eq(quote.status, 'accepted')
			)
		)
		.orderBy(desc(quote.version))
		.limit(1);
	return row;
}

/** The newest version of a job's quote (any status), without its input and result. */
export async function latest(tx: StoreTx, jobId: string) {
	const [row] = await tx
		.select({ id: quote.id, version: quote.version, status: quote.status })
		.from(quote)
		.where(and(eq(quote.organizationId, tx.storeId), eq(quote.jobId, jobId)))
		.orderBy(desc(quote.version))
		.limit(1);
	return row;
}

export type NewQuote = Omit<typeof quote.$inferInsert, 'organizationId' | 'id'>;

export async function insert(tx: StoreWriteTx, values: NewQuote): Promise<Quote> {
	const [row] = await tx
		.insert(quote)
		.values({ ...values, organizationId: tx.storeId })
		.returning();
	return row;
}

export async function update(
	tx: StoreWriteTx,
	id: string,
	values: Partial<NewQuote>
): Promise<Quote> {
	const [row] = await tx
		.update(quote)
		.set({ ...values, updatedAt: new Date() })
		.where(and(eq(quote.organizationId, tx.storeId), eq(quote.id, id)))
		.returning();
	return row;
}

/** A quote of the store (of the job, when given), locked until the transaction ends. */
export async function lock(
	tx: StoreWriteTx,
	id: string,
	jobId?: string
): Promise<Quote | undefined> {
	const [row] = await tx
		.select()
		.from(quote)
		.where(
			and(
				eq(quote.organizationId, tx.storeId),
				eq(quote.id, id),
				jobId ? eq(quote.jobId, jobId) : undefined
			)
		)
		.for('update');
	return row;
}

/** Marks the job's other versions still before the customer as superseded by a newer one. */
export async function supersedeOthers(tx: StoreWriteTx, jobId: string, keepId: string) {
	await tx
		.update(quote)
		.set({ status: 'superseded', updatedAt: new Date() })
		.where(
			and(
				eq(quote.organizationId, tx.storeId),
				eq(quote.jobId, jobId),
				ne(quote.id, keepId),
				sql`${quote.status} in ('sent', 'changes_requested')`
			)
		);
}

/** Withdraws the job's versions still before the customer (sent): they can no longer be answered. */
export async function withdrawOpen(tx: StoreWriteTx, jobId: string) {
	await tx
		.update(quote)
		.set({ status: 'withdrawn', updatedAt: new Date() })
		.where(
			and(eq(quote.organizationId, tx.storeId), eq(quote.jobId, jobId), eq(quote.status, 'sent'))
		);
}

/** The statuses of the job's quote versions (what the moves by hand check: `factsFrom`). */
export async function statusesOf(tx: StoreTx, jobId: string): Promise<QuoteStatus[]> {
	const rows = await tx
		.select({ status: quote.status })
		.from(quote)
		.where(and(eq(quote.organizationId, tx.storeId), eq(quote.jobId, jobId)));
	return rows.map((r) => r.status);
}
