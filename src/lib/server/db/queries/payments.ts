import { and, asc, desc, eq, isNotNull, or, sql } from 'drizzle-orm';
import type { JobStatus } from '../../../jobs/status';
import { ledger, type Ledger } from '../../../payments/ledger';
import { changeOrder, job, payment, quote, refund, stripeEvent, user } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { oneOf, runShape } from '../named';

export type Payment = typeof payment.$inferSelect;
export type Refund = typeof refund.$inferSelect;
export type PaymentPurpose = Payment['purpose'];
export type PaymentMethod = Payment['method'];
export type RefundReason = Refund['reason'];

/** What a job's money is owed on, of its accepted quote. */
const quoteMoney = {
	currency: quote.currency,
	totalCents: quote.totalCents,
	depositCents: quote.depositCents
};

/** The accepted quote a job's money is owed on (the newest accepted version). */
async function acceptedQuote(tx: StoreTx, jobId: string) {
	const [row] = await runShape(
		tx,
		'payments.acceptedQuote',
		() =>
			tx
				.select({ id: quote.id, version: quote.version, ...quoteMoney })
				.from(quote)
				.where(
					and(
						eq(quote.organizationId, sql.placeholder('store')),
						eq(quote.jobId, sql.placeholder('job')),
						eq(quote.status, 'accepted')
					)
				)
				.orderBy(desc(quote.version))
				.limit(1),
		{ store: tx.storeId, job: jobId }
	);
	return row;
}

export interface JobMoney {
	quote: Awaited<ReturnType<typeof acceptedQuote>> | undefined;
	payments: (Payment & { recordedByName: string | null })[];
	refunds: Refund[];
	ledger: Ledger;
	currency: string;
}

/** The sum of a job's approved change orders, in cents (a credit is negative). */
async function approvedChangeOrdersCents(tx: StoreTx, jobId: string): Promise<number> {
	const [row] = await runShape(
		tx,
		'payments.approvedChangeOrders',
		() =>
			tx
				.select({ total: sql<string | null>`sum(${changeOrder.totalCents})` })
				.from(changeOrder)
				.where(
					and(
						eq(changeOrder.organizationId, sql.placeholder('store')),
						eq(changeOrder.jobId, sql.placeholder('job')),
						eq(changeOrder.status, 'approved')
					)
				),
		{ store: tx.storeId, job: jobId }
	);
	return Number(row?.total ?? 0);
}

/** The refunds of `paymentIds`, oldest first. */
async function refundsOf(tx: StoreTx, paymentIds: string[]): Promise<Refund[]> {
	if (!paymentIds.length) return [];
	return runShape(
		tx,
		'payments.refundsOf',
		() =>
			tx
				.select()
				.from(refund)
				.where(
					and(
						eq(refund.organizationId, sql.placeholder('store')),
						oneOf(refund.paymentId, sql.placeholder('ids'))
					)
				)
				.orderBy(asc(refund.createdAt)),
		{ store: tx.storeId, ids: paymentIds }
	);
}

/**
 * A job's ledger and currency from its rows: its accepted quote (none: nothing owed on a quote),
 * its approved change orders, payments and refunds, and its state. `moneyFor` and `balancesFor`
 * read the rows; this is the one place they become a balance.
 */
function jobLedger(
	accepted: { currency: string; totalCents: number; depositCents: number } | undefined,
	changeOrdersCents: number,
	payments: Payment[],
	refunds: Refund[],
	status: JobStatus | undefined
): { ledger: Ledger; currency: string } {
	return {
		currency: accepted?.currency ?? payments[0]?.currency ?? 'USD',
		ledger: ledger({
			quoteTotalCents: accepted?.totalCents ?? 0,
			depositCents: accepted?.depositCents ?? 0,
			changeOrdersCents,
			payments,
			refunds,
			cancelled: status === 'cancelled'
		})
	};
}

/** The most jobs `balancesFor` works out at once (its lists are bound by it). */
export const BALANCES_MAX = 100;

/**
 * The balance of each of `jobIds` (at most `BALANCES_MAX`), by the same ledger as `moneyFor` and
 * from the same rows, read for all of them in five statements instead of five each. A job not
 * in the store is left out.
 */
export async function balancesFor(
	tx: StoreTx,
	jobIds: string[]
): Promise<Map<string, { balanceDueCents: number; currency: string }>> {
	const ids = [...new Set(jobIds)];
	if (ids.length > BALANCES_MAX) throw new Error(`At most ${BALANCES_MAX} jobs at once`);
	const out = new Map<string, { balanceDueCents: number; currency: string }>();
	if (!ids.length) return out;
	// Each read is kept by its text (`runShape`), its ids one array parameter: one statement for
	// any number of jobs, parsed once per connection.
	const values = { store: tx.storeId, ids };
	const jobs = await runShape(
		tx,
		'payments.balances jobs',
		() =>
			tx
				.select({ id: job.id, status: job.status })
				.from(job)
				.where(
					and(
						eq(job.organizationId, sql.placeholder('store')),
						oneOf(job.id, sql.placeholder('ids'))
					)
				),
		values
	);
	// The newest accepted version of each job, as `acceptedQuote` reads it.
	const quotes = await runShape(
		tx,
		'payments.balances quotes',
		() =>
			tx
				.selectDistinctOn([quote.jobId], { jobId: quote.jobId, ...quoteMoney })
				.from(quote)
				.where(
					and(
						eq(quote.organizationId, sql.placeholder('store')),
						oneOf(quote.jobId, sql.placeholder('ids')),
						eq(quote.status, 'accepted')
					)
				)
				.orderBy(quote.jobId, desc(quote.version)),
		values
	);
	const changeOrders = await runShape(
		tx,
		'payments.balances change orders',
		() =>
			tx
				.select({
					jobId: changeOrder.jobId,
					total: sql<string | null>`sum(${changeOrder.totalCents})`
				})
				.from(changeOrder)
				.where(
					and(
						eq(changeOrder.organizationId, sql.placeholder('store')),
						oneOf(changeOrder.jobId, sql.placeholder('ids')),
						eq(changeOrder.status, 'approved')
					)
				)
				.groupBy(changeOrder.jobId),
		values
	);
	const payments = await runShape(
		tx,
		'payments.balances payments',
		() =>
			tx
				.select(paymentColumns)
				.from(payment)
				.where(
					and(
						eq(payment.organizationId, sql.placeholder('store')),
						oneOf(payment.jobId, sql.placeholder('ids'))
					)
				)
				.orderBy(asc(payment.createdAt)),
		values
	);
	// Each job has a few payments; 100 jobs, a few hundred at most.
	const refunds = await refundsOf(
		tx,
		payments.map((p) => p.id)
	);
	const quoteOf = new Map(quotes.map((q) => [q.jobId, q]));
	const changeOrdersOf = new Map(changeOrders.map((c) => [c.jobId, Number(c.total ?? 0)]));
	const jobOfPayment = new Map(payments.map((p) => [p.id, p.jobId]));
	for (const { id, status } of jobs) {
		const paid = payments.filter((p) => p.jobId === id);
		const money = jobLedger(
			quoteOf.get(id),
			changeOrdersOf.get(id) ?? 0,
			paid,
			refunds.filter((r) => jobOfPayment.get(r.paymentId) === id),
			status
		);
		out.set(id, { balanceDueCents: money.ledger.balanceDueCents, currency: money.currency });
	}
	return out;
}

/**
 * A job's payments, refunds and balance: what it owes is its accepted quote plus the change
 * orders the customer approved.
 */
export async function moneyFor(tx: StoreTx, jobId: string): Promise<JobMoney> {
	const accepted = await acceptedQuote(tx, jobId);
	const changeOrdersCents = await approvedChangeOrdersCents(tx, jobId);
	const [status] = await runShape(
		tx,
		'payments.jobStatus',
		() =>
			tx
				.select({ status: job.status })
				.from(job)
				.where(
					and(eq(job.organizationId, sql.placeholder('store')), eq(job.id, sql.placeholder('job')))
				),
		{ store: tx.storeId, job: jobId }
	);
	const payments = await runShape(
		tx,
		'payments.forJob',
		() =>
			tx
				.select({ ...paymentColumns, recordedByName: user.name })
				.from(payment)
				.leftJoin(user, eq(user.id, payment.recordedBy))
				.where(
					and(
						eq(payment.organizationId, sql.placeholder('store')),
						eq(payment.jobId, sql.placeholder('job'))
					)
				)
				.orderBy(asc(payment.createdAt)),
		{ store: tx.storeId, job: jobId }
	);
	const refunds = await refundsOf(
		tx,
		payments.map((p) => p.id)
	);
	return {
		quote: accepted,
		payments,
		refunds,
		...jobLedger(accepted, changeOrdersCents, payments, refunds, status?.status)
	};
}

const paymentColumns = {
	id: payment.id,
	organizationId: payment.organizationId,
	jobId: payment.jobId,
	quoteId: payment.quoteId,
	purpose: payment.purpose,
	method: payment.method,
	status: payment.status,
	currency: payment.currency,
	amountCents: payment.amountCents,
	refundedCents: payment.refundedCents,
	feeCents: payment.feeCents,
	reference: payment.reference,
	failureMessage: payment.failureMessage,
	mismatch: payment.mismatch,
	stripeCheckoutSessionId: payment.stripeCheckoutSessionId,
	stripePaymentIntentId: payment.stripePaymentIntentId,
	stripeChargeId: payment.stripeChargeId,
	stripeBalanceTransactionId: payment.stripeBalanceTransactionId,
	changeOrderId: payment.changeOrderId,
	checkoutUrl: payment.checkoutUrl,
	checkoutExpiresAt: payment.checkoutExpiresAt,
	recordedBy: payment.recordedBy,
	succeededAt: payment.succeededAt,
	createdAt: payment.createdAt,
	updatedAt: payment.updatedAt
};

/** A payment of the store, locked until the transaction ends; undefined when not the store's. */
export async function lock(tx: StoreWriteTx, id: string): Promise<Payment | undefined> {
	const [row] = await tx
		.select()
		.from(payment)
		.where(and(eq(payment.organizationId, tx.storeId), eq(payment.id, id)))
		.for('update');
	return row;
}

export async function read(tx: StoreTx, id: string): Promise<Payment | undefined> {
	const [row] = await tx
		.select()
		.from(payment)
		.where(and(eq(payment.organizationId, tx.storeId), eq(payment.id, id)));
	return row;
}

/** The payment a Checkout Session was made for, by the session's id or our own, locked. */
export async function lockBySession(tx: StoreWriteTx, sessionId: string, paymentId?: string) {
	const [row] = await tx
		.select()
		.from(payment)
		.where(
			and(
				eq(payment.organizationId, tx.storeId),
				or(
					eq(payment.stripeCheckoutSessionId, sessionId),
					paymentId ? eq(payment.id, paymentId) : undefined
				)
			)
		)
		.for('update');
	return row;
}

/** A payment by our id or by its Stripe PaymentIntent, whichever is known. */
export async function findByIdOrIntent(
	tx: StoreTx,
	by: { id?: string | null; intent?: string | null }
): Promise<Payment | undefined> {
	if (!by.id && !by.intent) return undefined;
	const [row] = await tx
		.select()
		.from(payment)
		.where(
			and(
				eq(payment.organizationId, tx.storeId),
				or(
					by.id ? eq(payment.id, by.id) : undefined,
					by.intent ? eq(payment.stripePaymentIntentId, by.intent) : undefined
				)
			)
		);
	return row;
}

/** The Checkout Sessions of the store's card payments still pending (the oldest 500). */
export async function pendingCardSessions(tx: StoreTx): Promise<string[]> {
	const rows = await tx
		.select({ session: payment.stripeCheckoutSessionId })
		.from(payment)
		.where(
			and(
				eq(payment.organizationId, tx.storeId),
				eq(payment.method, 'card'),
				eq(payment.status, 'pending'),
				isNotNull(payment.stripeCheckoutSessionId)
			)
		)
		.orderBy(asc(payment.createdAt))
		.limit(500);
	return rows.map((r) => r.session!);
}

export type NewPayment = Omit<typeof payment.$inferInsert, 'organizationId' | 'id'>;

export async function insert(tx: StoreWriteTx, values: NewPayment): Promise<Payment> {
	const [row] = await tx
		.insert(payment)
		.values({ ...values, organizationId: tx.storeId })
		.returning();
	return row;
}

export async function update(
	tx: StoreWriteTx,
	id: string,
	values: Partial<NewPayment>
): Promise<Payment | undefined> {
	const [row] = await tx
		.update(payment)
		.set({ ...values, updatedAt: new Date() })
		.where(and(eq(payment.organizationId, tx.storeId), eq(payment.id, id)))
		.returning();
	return row;
}

/** What is still pending at Stripe of a payment's refunds: counted as given back. */
export async function pendingRefundCents(tx: StoreTx, paymentId: string): Promise<number> {
	const [{ pending }] = await tx
		.select({ pending: sql<number>`coalesce(sum(${refund.amountCents}), 0)::int` })
		.from(refund)
		.where(
			and(
				eq(refund.organizationId, tx.storeId),
				eq(refund.paymentId, paymentId),
				eq(refund.status, 'pending')
			)
		);
	return pending;
}

export type NewRefund = Omit<typeof refund.$inferInsert, 'organizationId' | 'id'>;

/** The one place a refund row is written, whoever gave the money back (the store, or Stripe). */
export async function insertRefund(tx: StoreWriteTx, values: NewRefund): Promise<Refund> {
	const [row] = await tx
		.insert(refund)
		.values({ ...values, organizationId: tx.storeId })
		.returning();
	return row;
}

export async function updateRefund(
	tx: StoreWriteTx,
	id: string,
	values: Partial<NewRefund>
): Promise<void> {
	await tx
		.update(refund)
		.set({ ...values, updatedAt: new Date() })
		.where(and(eq(refund.organizationId, tx.storeId), eq(refund.id, id)));
}

export async function readRefund(tx: StoreTx, id: string): Promise<Refund | undefined> {
	const [row] = await tx
		.select()
		.from(refund)
		.where(and(eq(refund.organizationId, tx.storeId), eq(refund.id, id)));
	return row;
}

/** A refund by its Stripe id, or by our own id when Stripe carries it in its metadata. */
export async function findRefund(tx: StoreTx, by: { stripeId: string; id?: string | null }) {
	const [row] = await tx
		.select({ id: refund.id, status: refund.status })
		.from(refund)
		.where(
			and(
				eq(refund.organizationId, tx.storeId),
				or(eq(refund.stripeRefundId, by.stripeId), by.id ? eq(refund.id, by.id) : undefined)
			)
		);
	return row;
}

/** Adds a refund that has happened to its payment's refunded amount (and status). */
export async function applyRefund(tx: StoreWriteTx, paymentId: string, amountCents: number) {
	await tx
		.update(payment)
		.set({
			refundedCents: sql`${payment.refundedCents} + ${amountCents}`,
			// Refunded only when nothing is left on it (see `statusAfterRefunds`).
			status: sql`case when ${payment.refundedCents} + ${amountCents} >= ${payment.amountCents} then 'refunded' else 'succeeded' end::payment_status`,
			updatedAt: new Date()
		})
		.where(and(eq(payment.organizationId, tx.storeId), eq(payment.id, paymentId)));
}

/** Whether a Stripe event was already handled in the store. */
export async function seenEvent(tx: StoreTx, eventId: string): Promise<boolean> {
	const [row] = await tx
		.select({ id: stripeEvent.id })
		.from(stripeEvent)
		.where(and(eq(stripeEvent.organizationId, tx.storeId), eq(stripeEvent.id, eventId)));
	return Boolean(row);
}

/**
 * Records that a Stripe event was handled, once. Returns false when the event id was already
 * seen: the caller then changes nothing (a redelivery).
 */
export async function firstSight(
	tx: StoreWriteTx,
	event: { id: string; type: string; objectId: string | null; created: number },
	outcome = ''
): Promise<boolean> {
	const inserted = await tx
		.insert(stripeEvent)
		.values({
			id: event.id,
			organizationId: tx.storeId,
			type: event.type,
			objectId: event.objectId,
			stripeCreated: new Date(event.created * 1000),
			outcome
		})
		.onConflictDoNothing()
		.returning({ id: stripeEvent.id });
	return inserted.length > 0;
}

/** Notes what handling an event did, for the store's records. */
export async function noteOutcome(tx: StoreWriteTx, eventId: string, outcome: string) {
	await tx
		.update(stripeEvent)
		.set({ outcome })
		.where(and(eq(stripeEvent.organizationId, tx.storeId), eq(stripeEvent.id, eventId)));
}
