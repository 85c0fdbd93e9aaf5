import { log } from '../log';
import { jobLabel, payableNow, type PayablePurpose } from '$lib/jobs/status';
import type Stripe from 'stripe';
import { config } from '../config';
import * as customers from '../db/queries/customers';
import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import { stripeAccount } from '../db/queries/settings';
import { readStore } from '../db/queries/stores';
import { inStore } from '../db/tenant';
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
	const prepared = await inStore(storeId, async (tx) => {
		const account = await stripeAccount(tx);
		if (!account) return { ok: false, reason: 'no_account' } as const;
		const status = await jobs.lockStatus(tx, jobId);
		const job = status ? await jobs.readForStore(tx, jobId) : undefined;
		if (!status || !job) return { ok: false, reason: 'not_found' } as const;
		if (payableNow(status) !== purpose) return { ok: false, reason: 'not_payable' } as const;
		const money = await payments.moneyFor(tx, jobId);
		const due = purpose === 'deposit' ? money.ledger.depositDueCents : money.ledger.balanceDueCents;
		if (!money.quote || due <= 0) return { ok: false, reason: 'nothing_due' } as const;
		const store = await readStore(tx);
		const customer = await customers.read(tx, job.customerId);
		const found = { job, account, storeName: store?.name ?? '', email: customer?.email ?? null };
		const open = money.payments.find((p) => p.purpose === purpose && stillOpen(p));
		if (open && open.amountCents === due) return { ok: true, payment: open, ...found } as const;
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
		return { ok: true, payment: row, ...found } as const;
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
								name: `${purpose === 'deposit' ? 'Deposit' : 'Balance'} for ${jobLabel(job.number)} ${job.title}`
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
