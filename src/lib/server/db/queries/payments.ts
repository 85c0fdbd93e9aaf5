import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import { ledger, refundable, type Ledger } from '../../../payments/ledger';
import { job, payment, quote, refund, stripeEvent, user } from '../schema';
import { inStore, type Tx } from '../tenant';
import { moveIn } from './jobs';

export type Payment = typeof payment.$inferSelect;
export type Refund = typeof refund.$inferSelect;
export type PaymentPurpose = Payment['purpose'];
export type PaymentMethod = Payment['method'];
export type RefundReason = Refund['reason'];

/** The accepted quote a job's money is owed on (the newest accepted version). */
async function acceptedQuote(tx: Tx, storeId: string, jobId: string) {
	const [row] = await tx
		.select({
			id: quote.id,
			version: quote.version,
			currency: quote.currency,
			totalCents: quote.totalCents,
			depositCents: quote.depositCents
		})
		.from(quote)
		.where(
			and(eq(quote.organizationId, storeId), eq(quote.jobId, jobId), eq(quote.status, 'accepted'))
		)
		.orderBy(desc(quote.version))
		.limit(1);
	return row;
}

export interface JobMoney {
	quote: Awaited<ReturnType<typeof acceptedQuote>> | undefined;
	payments: (Payment & { recordedByName: string | null })[];
	refunds: Refund[];
	ledger: Ledger;
	currency: string;
}

export async function moneyIn(tx: Tx, storeId: string, jobId: string): Promise<JobMoney> {
	const accepted = await acceptedQuote(tx, storeId, jobId);
	const payments = await tx
		.select({ ...paymentColumns, recordedByName: user.name })
		.from(payment)
		.leftJoin(user, eq(user.id, payment.recordedBy))
		.where(and(eq(payment.organizationId, storeId), eq(payment.jobId, jobId)))
		.orderBy(asc(payment.createdAt));
	const refunds = payments.length
		? await tx
				.select()
				.from(refund)
				.where(
					and(
						eq(refund.organizationId, storeId),
						inArray(
							refund.paymentId,
							payments.map((p) => p.id)
						)
					)
				)
				.orderBy(asc(refund.createdAt))
		: [];
	return {
		quote: accepted,
		payments,
		refunds,
		currency: accepted?.currency ?? payments[0]?.currency ?? 'USD',
		ledger: ledger({
			quoteTotalCents: accepted?.totalCents ?? 0,
			depositCents: accepted?.depositCents ?? 0,
			payments
		})
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

/** A job's payments, refunds and balance, from its accepted quote. */
export async function moneyFor(storeId: string, jobId: string): Promise<JobMoney> {
	return inStore(storeId, (tx) => moneyIn(tx, storeId, jobId));
}

/**
 * A deposit that succeeded moves an accepted job to sold; in the same transaction as the
 * payment, so the two never disagree.
 */
export async function afterSuccess(
	tx: Tx,
	storeId: string,
	p: Pick<Payment, 'jobId' | 'purpose'>,
	actorId: string | null
) {
	if (p.purpose !== 'deposit') return;
	const [j] = await tx
		.select({ status: job.status })
		.from(job)
		.where(and(eq(job.organizationId, storeId), eq(job.id, p.jobId)));
	if (j?.status === 'accepted') await moveIn(tx, storeId, p.jobId, 'sold', actorId, 'Deposit paid');
}

export type RecordResult =
	| { ok: true; payment: Payment }
	| { ok: false; reason: 'not_found' | 'no_accepted_quote' | 'more_than_due' };

/** A payment taken in the store (cash, cheque, card terminal, transfer), with its reference. */
export async function recordInStore(
	storeId: string,
	jobId: string,
	input: {
		purpose: PaymentPurpose;
		method: Exclude<PaymentMethod, 'card'>;
		amountCents: number;
		reference: string;
	},
	actorId: string
): Promise<RecordResult> {
	return inStore(storeId, async (tx) => {
		const [j] = await tx
			.select({ id: job.id })
			.from(job)
			.where(and(eq(job.organizationId, storeId), eq(job.id, jobId)))
			.for('update');
		if (!j) return { ok: false, reason: 'not_found' };
		const money = await moneyIn(tx, storeId, jobId);
		if (!money.quote) return { ok: false, reason: 'no_accepted_quote' };
		if (input.amountCents > money.ledger.balanceDueCents)
			return { ok: false, reason: 'more_than_due' };
		const now = new Date();
		const [row] = await tx
			.insert(payment)
			.values({
				organizationId: storeId,
				jobId,
				quoteId: money.quote.id,
				purpose: input.purpose,
				method: input.method,
				status: 'succeeded',
				currency: money.quote.currency,
				amountCents: input.amountCents,
				reference: input.reference,
				recordedBy: actorId,
				succeededAt: now
			})
			.returning();
		await afterSuccess(tx, storeId, row, actorId);
		return { ok: true, payment: row };
	});
}

export type RefundCheck =
	| { ok: true; payment: Payment; refundableCents: number }
	| { ok: false; reason: 'not_found' | 'nothing_to_refund' | 'more_than_paid' };

/** Locks a payment and checks that `amountCents` can be given back on it. */
export async function lockForRefund(
	tx: Tx,
	storeId: string,
	paymentId: string,
	amountCents: number
): Promise<RefundCheck> {
	const [p] = await tx
		.select()
		.from(payment)
		.where(and(eq(payment.organizationId, storeId), eq(payment.id, paymentId)))
		.for('update');
	if (!p) return { ok: false, reason: 'not_found' };
	// Refunds still pending at Stripe count as given back, so two refunds cannot overlap.
	const [{ pending }] = await tx
		.select({ pending: sql<number>`coalesce(sum(${refund.amountCents}), 0)::int` })
		.from(refund)
		.where(
			and(
				eq(refund.organizationId, storeId),
				eq(refund.paymentId, p.id),
				eq(refund.status, 'pending')
			)
		);
	const left = refundable(p) - pending;
	if (left <= 0) return { ok: false, reason: 'nothing_to_refund' };
	if (amountCents > left) return { ok: false, reason: 'more_than_paid' };
	return { ok: true, payment: p, refundableCents: left };
}

/** Adds a refund that has happened to its payment's refunded amount (and status). */
export async function applyRefund(tx: Tx, storeId: string, paymentId: string, amountCents: number) {
	await tx
		.update(payment)
		.set({
			refundedCents: sql`${payment.refundedCents} + ${amountCents}`,
			status: 'refunded',
			updatedAt: new Date()
		})
		.where(and(eq(payment.organizationId, storeId), eq(payment.id, paymentId)));
}

/** Money given back in the store (cash, cheque) on a payment, never more than is left on it. */
export async function refundInStore(
	storeId: string,
	paymentId: string,
	input: { amountCents: number; reason: RefundReason; note: string },
	actorId: string
): Promise<
	| { ok: true; refund: Refund }
	| { ok: false; reason: 'not_found' | 'nothing_to_refund' | 'more_than_paid' | 'card' }
> {
	return inStore(storeId, async (tx) => {
		const check = await lockForRefund(tx, storeId, paymentId, input.amountCents);
		if (!check.ok) return check;
		if (check.payment.method === 'card') return { ok: false, reason: 'card' };
		const [row] = await tx
			.insert(refund)
			.values({
				organizationId: storeId,
				paymentId,
				amountCents: input.amountCents,
				reason: input.reason,
				note: input.note,
				status: 'succeeded',
				createdBy: actorId
			})
			.returning();
		await applyRefund(tx, storeId, paymentId, input.amountCents);
		return { ok: true, refund: row };
	});
}

/**
 * Records that a Stripe event was handled, once. Returns false when the event id was already
 * seen: the caller then changes nothing (a redelivery).
 */
export async function firstSight(
	tx: Tx,
	storeId: string,
	event: { id: string; type: string; objectId: string | null; created: number },
	outcome = ''
): Promise<boolean> {
	const inserted = await tx
		.insert(stripeEvent)
		.values({
			id: event.id,
			organizationId: storeId,
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
export async function noteOutcome(tx: Tx, storeId: string, eventId: string, outcome: string) {
	await tx
		.update(stripeEvent)
		.set({ outcome })
		.where(and(eq(stripeEvent.organizationId, storeId), eq(stripeEvent.id, eventId)));
}
