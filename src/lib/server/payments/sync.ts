import { statusAfterRefunds } from '$lib/payments/ledger';
import type Stripe from 'stripe';
import * as payments from '../db/queries/payments';
import { stripeAccount } from '../db/queries/settings';
import { inStore, readInStore } from '../db/tenant';
import { stripe as appStripe, idOf } from '../stripe';
import { announcePayment, announceRefund } from './notices';
import { paymentSucceeded } from './succeeded';

/**
 * The ledger follows what Stripe says now: each sync reads the object's current state, so
 * webhooks delivered twice, late or out of order end in the same ledger, and the reconciliation
 * page runs the same sync for anything a missed webhook left pending.
 */

export type SyncOutcome = 'succeeded' | 'failed' | 'pending' | 'unchanged' | 'unknown' | 'mismatch';

/**
 * Why a paid session does not pay this payment (its amount or currency is not the payment's), or
 * null when it does. A session carries our payment's id in its metadata, which alone proves
 * nothing: the money must be the payment's too.
 */
export function sessionMismatch(
	session: Pick<Stripe.Checkout.Session, 'id' | 'amount_total' | 'currency'>,
	p: Pick<payments.Payment, 'amountCents' | 'currency'>
): string | null {
	const currency = (session.currency ?? '').toUpperCase();
	if (session.amount_total === p.amountCents && currency === p.currency.toUpperCase()) return null;
	return `Checkout ${session.id} was paid ${session.amount_total ?? '?'} ${currency || '?'} (smallest unit); this payment is ${p.amountCents} ${p.currency.toUpperCase()}. Not taken as paid.`;
}

/** A store and its Stripe account, looked up once by whoever syncs several things. */
export interface StoreAccount {
	storeId: string;
	account: string;
}

/** The store's Stripe account, or null when it takes no card payments. */
export async function storeAccount(storeId: string): Promise<StoreAccount | null> {
	const account = await readInStore(storeId, (tx) => stripeAccount(tx));
	return account ? { storeId, account } : null;
}

/**
 * Brings a payment in line with its Checkout Session as Stripe has it now. A payment that
 * succeeded never goes back; the first time one succeeds, a deposit moves the job to sold and the
 * customer's receipt and the salesperson's notice are queued, in the same transaction.
 */
export async function syncSession(
	storeId: string,
	sessionId: string,
	client: Stripe = appStripe
): Promise<SyncOutcome> {
	const store = await storeAccount(storeId);
	return store ? syncSessionIn(store, sessionId, client) : 'unknown';
}

export async function syncSessionIn(
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

	const result = await inStore(storeId, async (tx) => {
		const p = await payments.lockBySession(tx, session.id, session.metadata?.payment_id);
		if (!p) return { outcome: 'unknown' as const };
		if (p.status === 'succeeded' || p.status === 'refunded') {
			return { outcome: 'unchanged' as const };
		}
		if (session.payment_status === 'paid') {
			const mismatch = sessionMismatch(session, p);
			if (mismatch) {
				// Stored and flagged on the reconciliation page; nothing is marked paid.
				await payments.update(tx, p.id, { mismatch });
				return { outcome: 'mismatch' as const };
			}
			const row = await payments.update(tx, p.id, {
				status: 'succeeded',
				stripeCheckoutSessionId: session.id,
				stripePaymentIntentId: intent?.id ?? idOf(session.payment_intent),
				stripeChargeId: charge?.id ?? null,
				stripeBalanceTransactionId: txn?.id ?? null,
				feeCents: txn?.fee ?? null,
				failureMessage: null,
				succeededAt: charge ? new Date(charge.created * 1000) : new Date()
			});
			await paymentSucceeded(tx, row!, null);
			await announcePayment(tx, row!);
			return { outcome: 'succeeded' as const };
		}
		if (session.status === 'expired') {
			await payments.update(tx, p.id, {
				status: 'failed',
				failureMessage: 'The checkout expired before it was paid'
			});
			return { outcome: 'failed' as const };
		}
		await payments.update(tx, p.id, {
			stripeCheckoutSessionId: session.id,
			stripePaymentIntentId: intent?.id ?? p.stripePaymentIntentId,
			failureMessage: intent?.last_payment_error?.message ?? null
		});
		return { outcome: 'pending' as const };
	});
	return result.outcome;
}

/**
 * Brings a card payment's refunds in line with its charge as Stripe has it now: each refund
 * made here gets its state, one made in Stripe's dashboard is added, and the payment's refunded
 * amount is the charge's.
 */
export async function syncRefunds(storeId: string, paymentId: string, client: Stripe = appStripe) {
	const store = await storeAccount(storeId);
	if (store) await syncRefundsIn(store, paymentId, client);
}

const REFUND_STATUS = (status: string | null) =>
	status === 'succeeded'
		? ('succeeded' as const)
		: status === 'failed' || status === 'canceled'
			? ('failed' as const)
			: ('pending' as const);

export async function syncRefundsIn(
	{ storeId, account }: StoreAccount,
	paymentId: string,
	client: Stripe
) {
	const p = await readInStore(storeId, (tx) => payments.read(tx, paymentId));
	if (!p?.stripeChargeId) return;
	const charge = await client.charges.retrieve(
		p.stripeChargeId,
		{ expand: ['refunds'] },
		{ stripeAccount: account }
	);
	const refunds = charge.refunds?.data ?? [];
	await inStore(storeId, async (tx) => {
		await payments.lock(tx, p.id);
		// Refunds that became money given back in this sync: the customer is told of each.
		const made: Pick<payments.Refund, 'id' | 'amountCents' | 'reason' | 'stripeRefundId'>[] = [];
		for (const r of refunds) {
			const status = REFUND_STATUS(r.status);
			const existing = await payments.findRefund(tx, {
				stripeId: r.id,
				id: typeof r.metadata?.refund_id === 'string' ? r.metadata.refund_id : null
			});
			if (existing) {
				await payments.updateRefund(tx, existing.id, { status, stripeRefundId: r.id });
				if (status === 'succeeded' && existing.status !== 'succeeded') {
					const row = await payments.readRefund(tx, existing.id);
					if (row) made.push(row);
				}
			} else {
				const row = await payments.insertRefund(tx, {
					paymentId: p.id,
					amountCents: r.amount,
					reason: 'other',
					note: 'Refunded in Stripe',
					status,
					stripeRefundId: r.id
				});
				if (status === 'succeeded') made.push(row);
			}
		}
		const updated = await payments.update(tx, p.id, {
			refundedCents: charge.amount_refunded,
			status: statusAfterRefunds(p.amountCents, charge.amount_refunded)
		});
		for (const given of made) await announceRefund(tx, updated!, given);
	});
}

/** Every card payment still pending in the store, synced from Stripe (a missed webhook caught up). */
export async function catchUp(storeId: string, client: Stripe = appStripe) {
	const store = await storeAccount(storeId);
	const outcomes: SyncOutcome[] = [];
	if (!store) return outcomes;
	const sessions = await readInStore(storeId, (tx) => payments.pendingCardSessions(tx));
	for (const session of sessions) outcomes.push(await syncSessionIn(store, session, client));
	return outcomes;
}
