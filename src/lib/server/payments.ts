import { log } from './log';
import { and, eq, or } from 'drizzle-orm';
import type Stripe from 'stripe';
import { formatMoney } from '../format';
import { jobLabel } from '../jobs/status';
import { config } from './config';
import * as customers from './db/queries/customers';
import * as jobs from './db/queries/jobs';
import { WHOLE_STORE } from './db/queries/access';
import {
	afterSuccess,
	lockForRefund,
	firstSight,
	moneyIn,
	type Payment,
	type RefundReason
} from './db/queries/payments';
import { stripeAccount } from './db/queries/settings';
import { emailOf, readProfile, readStore } from './db/queries/stores';
import { payment, refund, stripeEvent, job as jobTable } from './db/schema';
import { inStore } from './db/tenant';
import { mailer } from './mail';
import { paidNoticeMail, receiptMail } from './mail/templates';
import { customerLink } from './quote-service';
import { stripe as appStripe, idOf } from './stripe';

/**
 * Card payments through Stripe Checkout in the store's own Stripe account. The ledger follows
 * what Stripe says now (each sync reads the object's current state), so webhooks delivered
 * twice, late or out of order end in the same ledger; the reconciliation page runs the same
 * sync for anything a missed webhook left pending.
 */

export type PayablePurpose = 'deposit' | 'balance';

const PURPOSE_WORDS: Record<Payment['purpose'], string> = {
	deposit: 'deposit',
	balance: 'balance',
	change_order: 'change order'
};

export type CheckoutStart =
	| { ok: true; url: string }
	| {
			ok: false;
			reason: 'no_account' | 'nothing_due' | 'not_payable' | 'not_found' | 'stripe';
			message?: string;
	  };

/** A payment not yet finished whose checkout can still be used. */
const stillOpen = (p: Payment) =>
	p.status === 'pending' &&
	p.method === 'card' &&
	(!p.checkoutExpiresAt || p.checkoutExpiresAt.getTime() > Date.now() + 60_000);

/**
 * Opens (or reopens) the customer's checkout for what is due now: the deposit of an accepted
 * job, or the balance of a completed one. Two tabs, or a click twice, reach the same Checkout
 * Session: the pending payment is found under a lock on the job, and its session is created
 * with the payment's id as idempotency key.
 */
export async function startCheckout(
	input: { storeId: string; jobId: string; purpose: PayablePurpose; linkToken: string },
	client: Stripe = appStripe
): Promise<CheckoutStart> {
	const { storeId, jobId, purpose } = input;
	const account = await stripeAccount(storeId);
	if (!account) return { ok: false, reason: 'no_account' };
	const store = await readStore(storeId);
	const prepared = await inStore(storeId, async (tx) => {
		const [j] = await tx
			.select({
				status: jobTable.status,
				number: jobTable.number,
				title: jobTable.title,
				customerId: jobTable.customerId
			})
			.from(jobTable)
			.where(and(eq(jobTable.organizationId, storeId), eq(jobTable.id, jobId)))
			.for('update');
		if (!j) return { ok: false, reason: 'not_found' } as const;
		const payable = purpose === 'deposit' ? j.status === 'accepted' : j.status === 'completed';
		if (!payable) return { ok: false, reason: 'not_payable' } as const;
		const money = await moneyIn(tx, storeId, jobId);
		const due = purpose === 'deposit' ? money.ledger.depositDueCents : money.ledger.balanceDueCents;
		if (!money.quote || due <= 0) return { ok: false, reason: 'nothing_due' } as const;
		const open = money.payments.find((p) => p.purpose === purpose && stillOpen(p));
		if (open && open.amountCents === due) return { ok: true, payment: open, job: j } as const;
		if (open) {
			// What is due changed (an in-store payment since): the old checkout must not be paid.
			await tx
				.update(payment)
				.set({
					status: 'failed',
					failureMessage: 'Replaced by a checkout for the amount now due',
					updatedAt: new Date()
				})
				.where(and(eq(payment.organizationId, storeId), eq(payment.id, open.id)));
		}
		const [row] = await tx
			.insert(payment)
			.values({
				organizationId: storeId,
				jobId,
				quoteId: money.quote.id,
				purpose,
				method: 'card',
				status: 'pending',
				currency: money.quote.currency,
				amountCents: due
			})
			.returning();
		return { ok: true, payment: row, job: j } as const;
	});
	if (!prepared.ok) return prepared;
	const { payment: p, job: j } = prepared;
	if (p.checkoutUrl) return { ok: true, url: p.checkoutUrl };

	const customer = await customers.read(storeId, j.customerId);
	const base = `${config.origin}/c/${input.linkToken}`;
	const metadata = {
		store_id: storeId,
		store_name: store?.name ?? '',
		job_id: jobId,
		payment_id: p.id,
		purpose
	};
	let session: Stripe.Checkout.Session;
	try {
		session = await client.checkout.sessions.create(
			{
				mode: 'payment',
				line_items: [
					{
						price_data: {
							currency: p.currency.toLowerCase(),
							unit_amount: p.amountCents,
							product_data: {
								name: `${purpose === 'deposit' ? 'Deposit' : 'Balance'} for ${jobLabel(j.number)} ${j.title}`
							}
						},
						quantity: 1
					}
				],
				...(customer?.email ? { customer_email: customer.email } : {}),
				client_reference_id: p.id,
				success_url: `${base}?paid={CHECKOUT_SESSION_ID}`,
				cancel_url: `${base}?cancelled=1`,
				metadata,
				payment_intent_data: { metadata }
			},
			{ idempotencyKey: `checkout:${p.id}`, stripeAccount: account }
		);
	} catch (e) {
		log.error({ err: e, paymentId: p.id }, 'Checkout could not be created');
		return { ok: false, reason: 'stripe', message: (e as Error).message };
	}
	await inStore(storeId, (tx) =>
		tx
			.update(payment)
			.set({
				stripeCheckoutSessionId: session.id,
				checkoutUrl: session.url,
				checkoutExpiresAt: session.expires_at ? new Date(session.expires_at * 1000) : null,
				updatedAt: new Date()
			})
			.where(and(eq(payment.organizationId, storeId), eq(payment.id, p.id)))
	);
	return { ok: true, url: session.url ?? base };
}

export type SyncOutcome = 'succeeded' | 'failed' | 'pending' | 'unchanged' | 'unknown';

/**
 * Brings a payment in line with its Checkout Session as Stripe has it now. A payment that
 * succeeded never goes back; the first time one succeeds, a deposit moves the job to sold (in
 * the same transaction) and the customer's receipt and the salesperson's notice go out.
 */
export async function syncSession(
	storeId: string,
	sessionId: string,
	client: Stripe = appStripe
): Promise<SyncOutcome> {
	const account = await stripeAccount(storeId);
	return account ? syncSessionIn({ storeId, account }, sessionId, client) : 'unknown';
}

/** A store and its Stripe account, looked up once by whoever syncs several things. */
interface StoreAccount {
	storeId: string;
	account: string;
}

async function syncSessionIn(
	{ storeId, account }: StoreAccount,
	sessionId: string,
	client: Stripe
): Promise<SyncOutcome> {
	const session = await client.checkout.sessions.retrieve(
		sessionId,
		{ expand: ['payment_intent.latest_charge.balance_transaction'] },
		{ stripeAccount: account }
	);
	const intent = typeof session.payment_intent === 'object' ? session.payment_intent : null;
	const charge = intent && typeof intent.latest_charge === 'object' ? intent.latest_charge : null;
	const txn =
		charge && typeof charge.balance_transaction === 'object' ? charge.balance_transaction : null;
	const paymentId = session.metadata?.payment_id;

	const result = await inStore(storeId, async (tx) => {
		const [p] = await tx
			.select()
			.from(payment)
			.where(
				and(
					eq(payment.organizationId, storeId),
					or(
						eq(payment.stripeCheckoutSessionId, session.id),
						paymentId ? eq(payment.id, paymentId) : undefined
					)
				)
			)
			.for('update');
		if (!p) return { outcome: 'unknown' as const };
		if (p.status === 'succeeded' || p.status === 'refunded')
			return { outcome: 'unchanged' as const };
		const now = new Date();
		if (session.payment_status === 'paid') {
			const [row] = await tx
				.update(payment)
				.set({
					status: 'succeeded',
					stripeCheckoutSessionId: session.id,
					stripePaymentIntentId: intent?.id ?? idOf(session.payment_intent),
					stripeChargeId: charge?.id ?? null,
					stripeBalanceTransactionId: txn?.id ?? null,
					feeCents: txn?.fee ?? null,
					failureMessage: null,
					succeededAt: charge ? new Date(charge.created * 1000) : now,
					updatedAt: now
				})
				.where(and(eq(payment.organizationId, storeId), eq(payment.id, p.id)))
				.returning();
			await afterSuccess(tx, storeId, row, null);
			return { outcome: 'succeeded' as const, payment: row };
		}
		if (session.status === 'expired') {
			await tx
				.update(payment)
				.set({
					status: 'failed',
					failureMessage: 'The checkout expired before it was paid',
					updatedAt: now
				})
				.where(and(eq(payment.organizationId, storeId), eq(payment.id, p.id)));
			return { outcome: 'failed' as const };
		}
		const declined = intent?.last_payment_error?.message ?? null;
		await tx
			.update(payment)
			.set({
				stripeCheckoutSessionId: session.id,
				stripePaymentIntentId: intent?.id ?? p.stripePaymentIntentId,
				failureMessage: declined,
				updatedAt: now
			})
			.where(and(eq(payment.organizationId, storeId), eq(payment.id, p.id)));
		return { outcome: 'pending' as const };
	});
	if (result.outcome === 'succeeded' && result.payment) await announce(storeId, result.payment);
	return result.outcome;
}

/**
 * Brings a card payment's refunds in line with its charge as Stripe has it now: each refund
 * made here gets its state, one made in Stripe's dashboard is added, and the payment's refunded
 * amount is the charge's.
 */
export async function syncRefunds(storeId: string, paymentId: string, client: Stripe = appStripe) {
	const account = await stripeAccount(storeId);
	if (account) await syncRefundsIn({ storeId, account }, paymentId, client);
}

async function syncRefundsIn(
	{ storeId, account }: StoreAccount,
	paymentId: string,
	client: Stripe
) {
	const p = await inStore(storeId, async (tx) => {
		const [row] = await tx
			.select()
			.from(payment)
			.where(and(eq(payment.organizationId, storeId), eq(payment.id, paymentId)));
		return row;
	});
	if (!p?.stripeChargeId) return;
	const charge = await client.charges.retrieve(
		p.stripeChargeId,
		{ expand: ['refunds'] },
		{ stripeAccount: account }
	);
	const refunds = charge.refunds?.data ?? [];
	await inStore(storeId, async (tx) => {
		await tx
			.select({ id: payment.id })
			.from(payment)
			.where(and(eq(payment.organizationId, storeId), eq(payment.id, p.id)))
			.for('update');
		for (const r of refunds) {
			const status =
				r.status === 'succeeded'
					? 'succeeded'
					: r.status === 'failed' || r.status === 'canceled'
						? 'failed'
						: 'pending';
			const ours = r.metadata?.refund_id;
			const [existing] = await tx
				.select({ id: refund.id })
				.from(refund)
				.where(
					and(
						eq(refund.organizationId, storeId),
						or(eq(refund.stripeRefundId, r.id), ours ? eq(refund.id, ours) : undefined)
					)
				);
			if (existing) {
				await tx
					.update(refund)
					.set({ status, stripeRefundId: r.id, updatedAt: new Date() })
					.where(and(eq(refund.organizationId, storeId), eq(refund.id, existing.id)));
			} else {
				await tx.insert(refund).values({
					organizationId: storeId,
					paymentId: p.id,
					amountCents: r.amount,
					reason: 'other',
					note: 'Refunded in Stripe',
					status,
					stripeRefundId: r.id
				});
			}
		}
		await tx
			.update(payment)
			.set({
				refundedCents: charge.amount_refunded,
				status: charge.amount_refunded > 0 ? 'refunded' : 'succeeded',
				updatedAt: new Date()
			})
			.where(and(eq(payment.organizationId, storeId), eq(payment.id, p.id)));
	});
}

const STRIPE_REASON: Record<RefundReason, Stripe.RefundCreateParams.Reason | undefined> = {
	cancellation: 'requested_by_customer',
	overcharge: 'requested_by_customer',
	other: undefined
};

export type RefundResult =
	| { ok: true }
	| {
			ok: false;
			reason: 'not_found' | 'nothing_to_refund' | 'more_than_paid' | 'not_card' | 'stripe';
			message?: string;
	  };

/** Refunds part or all of a card payment through Stripe; never more than is left on it. */
export async function refundCard(
	storeId: string,
	paymentId: string,
	input: { amountCents: number; reason: RefundReason; note: string },
	actorId: string,
	client: Stripe = appStripe
): Promise<RefundResult> {
	const account = await stripeAccount(storeId);
	const held = await inStore(storeId, async (tx) => {
		const check = await lockForRefund(tx, storeId, paymentId, input.amountCents);
		if (!check.ok) return check;
		if (check.payment.method !== 'card' || !check.payment.stripePaymentIntentId)
			return { ok: false, reason: 'not_card' } as const;
		const [row] = await tx
			.insert(refund)
			.values({
				organizationId: storeId,
				paymentId,
				amountCents: input.amountCents,
				reason: input.reason,
				note: input.note,
				status: 'pending',
				createdBy: actorId
			})
			.returning();
		return { ok: true, refund: row, payment: check.payment } as const;
	});
	if (!held.ok) return held;
	if (!account)
		return { ok: false, reason: 'stripe', message: 'The store has no Stripe account connected' };
	try {
		const made = await client.refunds.create(
			{
				payment_intent: held.payment.stripePaymentIntentId!,
				amount: input.amountCents,
				...(STRIPE_REASON[input.reason] ? { reason: STRIPE_REASON[input.reason] } : {}),
				metadata: { store_id: storeId, payment_id: paymentId, refund_id: held.refund.id }
			},
			{ idempotencyKey: `refund:${held.refund.id}`, stripeAccount: account }
		);
		await inStore(storeId, (tx) =>
			tx
				.update(refund)
				.set({ stripeRefundId: made.id, updatedAt: new Date() })
				.where(and(eq(refund.organizationId, storeId), eq(refund.id, held.refund.id)))
		);
	} catch (e) {
		const message = (e as Error).message;
		await inStore(storeId, (tx) =>
			tx
				.update(refund)
				.set({
					status: 'failed',
					note: `${input.note}${input.note ? ' · ' : ''}Stripe refused: ${message}`,
					updatedAt: new Date()
				})
				.where(and(eq(refund.organizationId, storeId), eq(refund.id, held.refund.id)))
		);
		return { ok: false, reason: 'stripe', message };
	}
	await syncRefundsIn({ storeId, account }, paymentId, client);
	return { ok: true };
}

export type EventOutcome = 'handled' | 'duplicate' | 'ignored';

/** The store an event's object names, if the store's Stripe account is the one it came from. */
async function storeOfEvent(event: Stripe.Event): Promise<StoreAccount | null> {
	const object = event.data.object as { metadata?: Record<string, string> | null };
	const storeId = object.metadata?.store_id;
	if (!storeId || !(await readStore(storeId))) return null;
	const account = await stripeAccount(storeId);
	if (!account || (event.account && event.account !== account)) return null;
	return { storeId, account };
}

async function seen(storeId: string, eventId: string) {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select({ id: stripeEvent.id })
			.from(stripeEvent)
			.where(and(eq(stripeEvent.organizationId, storeId), eq(stripeEvent.id, eventId)));
		return Boolean(row);
	});
}

async function paymentBy(storeId: string, by: { id?: string | null; intent?: string | null }) {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select()
			.from(payment)
			.where(
				and(
					eq(payment.organizationId, storeId),
					or(
						by.id ? eq(payment.id, by.id) : undefined,
						by.intent ? eq(payment.stripePaymentIntentId, by.intent) : undefined
					)
				)
			);
		return row;
	});
}

/**
 * Handles one verified webhook event: once per event id, in the store its object names (and
 * whose Stripe account sent it). The ledger is set from Stripe's current state, not the event's
 * snapshot, so the order events arrive in does not matter.
 */
export async function handleEvent(
	event: Stripe.Event,
	client: Stripe = appStripe
): Promise<EventOutcome> {
	const store = await storeOfEvent(event);
	if (!store) return 'ignored';
	const { storeId } = store;
	if (await seen(storeId, event.id)) return 'duplicate';
	const object = event.data.object as {
		id: string;
		object: string;
		metadata?: Record<string, string> | null;
		payment_intent?: string | { id: string } | null;
	};
	let outcome = 'no change';
	if (object.object === 'checkout.session') {
		outcome = await syncSessionIn(store, object.id, client);
	} else if (
		object.object === 'payment_intent' ||
		object.object === 'charge' ||
		object.object === 'refund'
	) {
		const found = await paymentBy(storeId, {
			id: object.metadata?.payment_id,
			intent: object.object === 'payment_intent' ? object.id : idOf(object.payment_intent)
		});
		if (found?.stripeCheckoutSessionId)
			outcome = await syncSessionIn(store, found.stripeCheckoutSessionId, client);
		if (found && (object.object === 'charge' || object.object === 'refund')) {
			await syncRefundsIn(store, found.id, client);
			outcome = `${outcome}; refunds synced`;
		}
		if (!found) outcome = 'not in the ledger';
	}
	await inStore(storeId, (tx) =>
		firstSight(
			tx,
			storeId,
			{ id: event.id, type: event.type, objectId: object.id, created: event.created },
			outcome
		)
	);
	return 'handled';
}

/** Every card payment still pending in the store, synced from Stripe (a missed webhook caught up). */
export async function catchUp(storeId: string, client: Stripe = appStripe) {
	const pending = await inStore(storeId, (tx) =>
		tx
			.select({ session: payment.stripeCheckoutSessionId })
			.from(payment)
			.where(
				and(
					eq(payment.organizationId, storeId),
					eq(payment.method, 'card'),
					eq(payment.status, 'pending')
				)
			)
	);
	const account = await stripeAccount(storeId);
	const outcomes: SyncOutcome[] = [];
	if (!account) return outcomes;
	for (const p of pending) {
		if (p.session) outcomes.push(await syncSessionIn({ storeId, account }, p.session, client));
	}
	return outcomes;
}

/** The customer's receipt and the salesperson's notice; a failed e-mail never undoes a payment. */
async function announce(storeId: string, paid: Payment) {
	try {
		const [store, profile, job, money] = await Promise.all([
			readStore(storeId),
			readProfile(storeId),
			jobs.read(storeId, paid.jobId, WHOLE_STORE),
			inStore(storeId, (tx) => moneyIn(tx, storeId, paid.jobId))
		]);
		if (!store || !job) return;
		const customer = await customers.read(storeId, job.customerId);
		const amount = formatMoney(paid.amountCents, paid.currency);
		const what = PURPOSE_WORDS[paid.purpose];
		if (customer?.email) {
			await mailer(
				receiptMail({
					to: customer.email,
					storeName: store.name,
					storePhone: profile.phone,
					customerName: customer.name,
					jobLabel: jobLabel(job.number),
					jobTitle: job.title,
					what,
					amount,
					balance: formatMoney(money.ledger.balanceDueCents, money.currency),
					paidAt: paid.succeededAt ?? new Date(),
					reference: paid.stripeChargeId ?? paid.id,
					url: customerLink(storeId, job.id),
					timeZone: store.timeZone
				})
			);
		}
		const seller = await emailOf(job.salespersonId);
		if (seller) {
			await mailer(
				paidNoticeMail({
					to: seller,
					storeName: store.name,
					customerName: job.customerName,
					jobLabel: jobLabel(job.number),
					jobTitle: job.title,
					what,
					amount,
					url: `${config.origin}/app/jobs/${job.id}/payments`
				})
			);
		}
	} catch (e) {
		log.error({ err: e, paymentId: paid.id }, 'Could not send the receipt');
	}
}
