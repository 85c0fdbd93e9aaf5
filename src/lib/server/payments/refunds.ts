import { refundable } from '$lib/payments/ledger';
import type Stripe from 'stripe';
import * as payments from '../db/queries/payments';
import { inStore, type StoreWriteTx } from '../db/tenant';
import { stripe as appStripe } from '../stripe';
import { announceRefund } from './notices';
import { storeAccount, syncRefundsIn } from './sync';

export type RefundInput = { amountCents: number; reason: payments.RefundReason; note: string };

export type RefundCheck =
	| { ok: true; payment: payments.Payment; refundableCents: number }
	| { ok: false; reason: 'not_found' | 'nothing_to_refund' | 'more_than_paid' };

/** Locks a payment and checks that `amountCents` can be given back on it. */
async function lockForRefund(
	tx: StoreWriteTx,
	paymentId: string,
	amountCents: number
): Promise<RefundCheck> {
	const p = await payments.lock(tx, paymentId);
	if (!p) return { ok: false, reason: 'not_found' };
	// Refunds still pending at Stripe count as given back, so two refunds cannot overlap.
	const left = refundable(p) - (await payments.pendingRefundCents(tx, p.id));
	if (left <= 0) return { ok: false, reason: 'nothing_to_refund' };
	if (amountCents > left) return { ok: false, reason: 'more_than_paid' };
	return { ok: true, payment: p, refundableCents: left };
}

/** Money given back in the store (cash, cheque) on a payment, never more than is left on it. */
export async function refundInStore(
	tx: StoreWriteTx,
	paymentId: string,
	input: RefundInput,
	actorId: string
): Promise<
	| { ok: true; refund: payments.Refund }
	| { ok: false; reason: 'not_found' | 'nothing_to_refund' | 'more_than_paid' | 'card' }
> {
	const check = await lockForRefund(tx, paymentId, input.amountCents);
	if (!check.ok) return check;
	if (check.payment.method === 'card') return { ok: false, reason: 'card' };
	const row = await payments.insertRefund(tx, {
		paymentId,
		...input,
		status: 'succeeded',
		createdBy: actorId
	});
	await payments.applyRefund(tx, paymentId, input.amountCents);
	await announceRefund(tx, (await payments.read(tx, paymentId))!, row);
	return { ok: true, refund: row };
}

const STRIPE_REASON: Record<payments.RefundReason, Stripe.RefundCreateParams.Reason | undefined> = {
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

/**
 * Refunds part or all of a card payment through Stripe; never more than is left on it. The refund
 * is written as pending first (so a second one cannot overlap), then asked of Stripe with its id
 * as the idempotency key, then synced from the charge.
 */
export async function refundCard(
	storeId: string,
	paymentId: string,
	input: RefundInput,
	actorId: string,
	client: Stripe = appStripe
): Promise<RefundResult> {
	const store = await storeAccount(storeId);
	const held = await inStore(storeId, async (tx) => {
		const check = await lockForRefund(tx, paymentId, input.amountCents);
		if (!check.ok) return check;
		if (check.payment.method !== 'card' || !check.payment.stripePaymentIntentId)
			return { ok: false, reason: 'not_card' } as const;
		if (!store) {
			const message = 'The store has no Stripe account connected';
			return { ok: false, reason: 'stripe', message } as const;
		}
		const row = await payments.insertRefund(tx, {
			paymentId,
			...input,
			status: 'pending',
			createdBy: actorId
		});
		return { ok: true, refund: row, payment: check.payment } as const;
	});
	if (!held.ok || !store) return held.ok ? { ok: false, reason: 'stripe' } : held;
	try {
		const made = await client.refunds.create(
			{
				payment_intent: held.payment.stripePaymentIntentId!,
				amount: input.amountCents,
				...(STRIPE_REASON[input.reason] ? { reason: STRIPE_REASON[input.reason] } : {}),
				metadata: { store_id: storeId, payment_id: paymentId, refund_id: held.refund.id }
			},
			{ idempotencyKey: `refund:${held.refund.id}`, stripeAccount: store.account }
		);
		await inStore(storeId, (tx) =>
			payments.updateRefund(tx, held.refund.id, { stripeRefundId: made.id })
		);
	} catch (e) {
		const message = (e as Error).message;
		await inStore(storeId, (tx) =>
			payments.updateRefund(tx, held.refund.id, {
				status: 'failed',
				note: `${input.note}${input.note ? ' · ' : ''}Stripe refused: ${message}`
			})
		);
		return { ok: false, reason: 'stripe', message };
	}
	await syncRefundsIn(store, paymentId, client);
	return { ok: true };
}
