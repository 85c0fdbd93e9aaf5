import { log } from '../log';
import { jobLabel, payableNow, type PayablePurpose } from '$lib/jobs/status';
import type Stripe from 'stripe';
import { config } from '../config';
import { changeOrderLabel } from '$lib/jobs/change-order-status';
import * as changeOrders from '../db/queries/change-orders';
import * as customers from '../db/queries/customers';
import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import { stripeAccount } from '../db/queries/settings';
import { readStore } from '../db/queries/stores';
import { inStore, type StoreWriteTx } from '../db/tenant';
import { stripe as appStripe } from '../stripe';

export type CheckoutStart =
	| { ok: true; url: string }
	| {
			ok: false;
			reason: 'no_account' | 'nothing_due' | 'not_payable' | 'not_found' | 'stripe';
			message?: string;
	  };

/** A payment not yet finished whose checkout can still be used. */
const stillOpen = (p: payments.Payment) =>
	p.status === 'pending' &&
	p.method === 'card' &&
	(!p.checkoutExpiresAt || p.checkoutExpiresAt.getTime() > Date.now() + 60_000);

/** What a checkout pays: the deposit, the balance, or one approved change order. */
export type CheckoutPurpose =
	| { purpose: PayablePurpose; changeOrderId?: undefined }
	| { purpose: 'change_order'; changeOrderId: string };

/**
 * Opens (or reopens) the customer's checkout for what is due now: the deposit of an accepted
 * job, the balance of a completed one, or a change order the customer approved. Two tabs, or a
 * click twice, reach the same Checkout Session: the pending payment is found under a lock on the
 * job, and its session is created with the payment's id as idempotency key.
 */
export async function startCheckout(
	input: { storeId: string; jobId: string; linkToken: string } & CheckoutPurpose,
	client: Stripe = appStripe
): Promise<CheckoutStart> {
	const { storeId, jobId } = input;
	const prepared = await inStore(storeId, async (tx) => {
		const account = await stripeAccount(tx);
		if (!account) return { ok: false, reason: 'no_account' } as const;
		const status = await jobs.lockStatus(tx, jobId);
		const job = status ? await jobs.readForStore(tx, jobId) : undefined;
		if (!status || !job) return { ok: false, reason: 'not_found' } as const;
		if (input.purpose === 'change_order') {
			return prepareChangeOrder(tx, job, account, input.changeOrderId);
		}
		const purpose = input.purpose;
		if (payableNow(status) !== purpose) return { ok: false, reason: 'not_payable' } as const;
		const money = await payments.moneyFor(tx, jobId);
		const due = purpose === 'deposit' ? money.ledger.depositDueCents : money.ledger.balanceDueCents;
		if (!money.quote || due <= 0) return { ok: false, reason: 'nothing_due' } as const;
		const store = await readStore(tx);
		const customer = await customers.read(tx, job.customerId);
		const found = { job, account, storeName: store?.name ?? '', email: customer?.email ?? null };
		const open = money.payments.find((p) => p.purpose === purpose && stillOpen(p));
		if (open && open.amountCents === due)
			return { ok: true, payment: open, ...found, what: purposeWord(purpose) } as const;
		if (open) {
			// What is due changed (an in-store payment since): the old checkout must not be paid.
			await payments.update(tx, open.id, {
				status: 'failed',
				failureMessage: 'Replaced by a checkout for the amount now due'
			});
		}
		const row = await payments.insert(tx, {
			jobId,
			quoteId: money.quote.id,
			purpose,
			method: 'card',
			status: 'pending',
			currency: money.quote.currency,
			amountCents: due
		});
		return { ok: true, payment: row, ...found, what: purposeWord(purpose) } as const;
	});
	if (!prepared.ok) return prepared;
	const { payment: p, job, account } = prepared;
	if (p.checkoutUrl) return { ok: true, url: p.checkoutUrl };

	const base = `${config.origin}/c/${input.linkToken}`;
	const metadata = {
		store_id: storeId,
		store_name: prepared.storeName,
		job_id: jobId,
		payment_id: p.id,
		purpose: input.purpose
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
								name: `${prepared.what} for ${jobLabel(job.number)} ${job.title}`
							}
						},
						quantity: 1
					}
				],
				...(prepared.email ? { customer_email: prepared.email } : {}),
				client_reference_id: p.id,
				success_url: `${base}?paid={CHECKOUT_SESSION_ID}`,
				cancel_url: `${base}?cancelled=1`,
				metadata,
				payment_intent_data: { metadata }
			},
			{ idempotencyKey: `checkout:${p.id}`, stripeAccount: account }
		);
	} catch (e) {
		log.error({ err: e }, 'Checkout could not be created');
		return { ok: false, reason: 'stripe', message: (e as Error).message };
	}
	await inStore(storeId, (tx) =>
		payments.update(tx, p.id, {
			stripeCheckoutSessionId: session.id,
			checkoutUrl: session.url,
			checkoutExpiresAt: session.expires_at ? new Date(session.expires_at * 1000) : null
		})
	);
	return { ok: true, url: session.url ?? base };
}

const purposeWord = (purpose: PayablePurpose) => (purpose === 'deposit' ? 'Deposit' : 'Balance');

/**
 * The payment for an approved change order, under the job's lock: exactly its total (the
 * database refuses any other amount, and a paid session for another amount is a mismatch, never
 * paid); only once (a change order already paid, or one the balance has since covered, is
 * refused); a credit is never paid, it lowers the balance.
 */
async function prepareChangeOrder(
	tx: StoreWriteTx,
	job: NonNullable<Awaited<ReturnType<typeof jobs.readForStore>>>,
	account: string,
	changeOrderId: string
) {
	const co = await changeOrders.lock(tx, job.id, changeOrderId);
	if (!co) return { ok: false, reason: 'not_found' } as const;
	// A finished job's balance takes in every approved change order: it is paid with that.
	if (co.status !== 'approved' || co.totalCents <= 0 || payableNow(job.status) === 'balance') {
		return { ok: false, reason: 'not_payable' } as const;
	}
	const made = await changeOrders.paymentsOf(tx, co.id);
	if (made.some((p) => p.status === 'succeeded' || p.status === 'refunded')) {
		return { ok: false, reason: 'nothing_due' } as const;
	}
	const money = await payments.moneyFor(tx, job.id);
	// Paid with the balance already (or in the store): nothing of it is left to pay.
	if (!money.quote || money.ledger.balanceDueCents < co.totalCents) {
		return { ok: false, reason: 'nothing_due' } as const;
	}
	const store = await readStore(tx);
	const customer = await customers.read(tx, job.customerId);
	const found = { job, account, storeName: store?.name ?? '', email: customer?.email ?? null };
	const what = `Change order ${changeOrderLabel(co.number)}`;
	const open = made.find(stillOpen);
	if (open) return { ok: true, payment: open, ...found, what } as const;
	for (const p of made.filter((p) => p.status === 'pending')) {
		// An expired checkout, or one paid in the store meanwhile: it must not be paid now.
		await payments.update(tx, p.id, { status: 'failed', failureMessage: 'Checkout expired' });
	}
	const row = await payments.insert(tx, {
		jobId: job.id,
		quoteId: money.quote.id,
		purpose: 'change_order',
		changeOrderId: co.id,
		method: 'card',
		status: 'pending',
		currency: co.currency,
		amountCents: co.totalCents
	});
	return { ok: true, payment: row, ...found, what } as const;
}
