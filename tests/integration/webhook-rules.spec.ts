// Issue 9, item 4: the webhook binds money to the ledger only when the money matches, refuses
// signatures from the future, acknowledges what it cannot use, never acts for a store through the
// platform's own events, and a store connects only an account Stripe has for it.
import { LOCAL_STRIPE_WEBHOOK_SECRET } from '$lib/server/config';
import * as jobs from '$lib/server/db/queries/jobs';
import * as payments from '$lib/server/db/queries/payments';
import { stripeAccount } from '$lib/server/db/queries/settings';
import { readInStore } from '$lib/server/db/tenant';
import { jobScope } from '$lib/server/object-access';
import { connectStripeAccount } from '$lib/server/payments/connect';
import { reconcile } from '$lib/server/payments/reconcile';
import { handleEvent } from '$lib/server/payments/webhook';
import { grantsOf } from '$lib/server/permissions';
import { verifiedEvent } from '$lib/server/stripe';
import { signatureHeader } from '$mocks/stripe';
import { stripeFakeForTests } from '$mocks/stripe/testing';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeStore, unique, type TestStore } from './factories';
import {
	acceptedJob,
	depositSession as sessionFor,
	eventsFor as eventsForIn,
	newAccount
} from './card-jobs';

let t: ReturnType<typeof stripeFakeForTests>;
beforeAll(() => {
	t = stripeFakeForTests({ dataDir: null, webhookSecret: LOCAL_STRIPE_WEBHOOK_SECRET });
});
afterAll(async () => {
	await t.close();
});

const route = await import('../../src/routes/api/webhooks/stripe/+server');
const post = (body: string, header: string) =>
	route.POST({
		request: new Request('http://127.0.0.1/api/webhooks/stripe', {
			method: 'POST',
			body,
			headers: { 'stripe-signature': header, 'content-type': 'application/json' }
		})
	} as Parameters<typeof route.POST>[0]);

const owner = (store: TestStore) => jobScope(grantsOf('owner'), store.owner.id);
const depositSession = (store: TestStore, jobId: string) => sessionFor(t, store, jobId);
const eventsFor = (account: string, after: number) => eventsForIn(t, account, after);

describe('a paid checkout that names a payment', () => {
	it('whose amount is not the payment’s is stored, flagged, and marks nothing paid', async () => {
		const { store, account, job, quote } = await acceptedJob('Cheap Session Floors');
		await depositSession(store, job.id);
		const [pending] = (await readInStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments;
		expect(pending.amountCents).toBe(quote.depositCents);
		const since = Math.floor(Date.now() / 1000) - 1;
		// A session for 50¢ carrying the deposit's payment id in its metadata.
		const cheap = await t.stripe.checkout.sessions.create(
			{
				mode: 'payment',
				line_items: [
					{
						price_data: { currency: 'usd', unit_amount: 50, product_data: { name: 'x' } },
						quantity: 1
					}
				],
				success_url: 'http://127.0.0.1/ok',
				cancel_url: 'http://127.0.0.1/no',
				metadata: { store_id: store.id, payment_id: pending.id, job_id: job.id },
				payment_intent_data: { metadata: { store_id: store.id, payment_id: pending.id } }
			},
			{ stripeAccount: account }
		);
		expect((await t.fake.pay(cheap.id, 'success')).outcome).toBe('paid');
		for (const e of eventsFor(account, since)) await handleEvent(e, t.stripe);

		const money = await readInStore(store.id, (tx) => payments.moneyFor(tx, job.id));
		expect(money.payments).toHaveLength(1);
		expect(money.payments[0].status).toBe('pending');
		expect(money.payments[0].mismatch).toMatch(/paid 50 USD/);
		expect(money.ledger.depositDueCents).toBe(quote.depositCents);
		expect(
			(await readInStore(store.id, (tx) => jobs.readForViewer(tx, job.id, owner(store))))?.status
		).toBe('accepted');
		const report = await readInStore(store.id, (tx) =>
			reconcile(tx, new Date(Date.now() - 86_400_000), new Date(Date.now() + 60_000))
		);
		expect(report.mismatches.map((m) => m.paymentId)).toEqual([pending.id]);
	});

	it('in another currency is refused the same way', async () => {
		const { store, account, job, quote } = await acceptedJob('Wrong Currency Floors');
		await depositSession(store, job.id);
		const [pending] = (await readInStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments;
		const since = Math.floor(Date.now() / 1000) - 1;
		const other = await t.stripe.checkout.sessions.create(
			{
				mode: 'payment',
				line_items: [
					{
						price_data: {
							currency: 'eur',
							unit_amount: quote.depositCents,
							product_data: { name: 'x' }
						},
						quantity: 1
					}
				],
				success_url: 'http://127.0.0.1/ok',
				cancel_url: 'http://127.0.0.1/no',
				metadata: { store_id: store.id, payment_id: pending.id }
			},
			{ stripeAccount: account }
		);
		await t.fake.pay(other.id, 'success');
		for (const e of eventsFor(account, since)) await handleEvent(e, t.stripe);
		const [after] = (await readInStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments;
		expect(after.status).toBe('pending');
		expect(after.mismatch).toMatch(/EUR/);
	});
});

describe('webhook requests', () => {
	const event = (over: Record<string, unknown> = {}) =>
		JSON.stringify({
			id: `evt_${unique('e').replace(/[^a-z0-9]/gi, '')}`,
			object: 'event',
			type: 'checkout.session.completed',
			created: Math.floor(Date.now() / 1000),
			data: { object: { id: 'cs_test_nowhere', object: 'checkout.session', metadata: {} } },
			...over
		});

	it('refuses a signature dated beyond the tolerance in the future', async () => {
		const body = event();
		// A minute past the 300 s tolerance: a second past it was admitted once the test itself
		// took over a second to get there (a busy machine).
		const future = Math.floor(Date.now() / 1000) + 360;
		const request = new Request('http://x/api/webhooks/stripe', {
			method: 'POST',
			body,
			headers: { 'stripe-signature': signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET, future) }
		});
		await expect(verifiedEvent(request)).rejects.toBeInstanceOf(
			Stripe.errors.StripeSignatureVerificationError
		);
		expect(
			(await post(body, signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET, future))).status
		).toBe(400);
		// Within the tolerance, a clock a little ahead is still admitted.
		const soon = Math.floor(Date.now() / 1000) + 30;
		expect(
			(await post(body, signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET, soon))).status
		).toBe(200);
	});

	it('acknowledges a signed body that is not JSON or not an event, without acting', async () => {
		for (const body of ['not json at all', '{"id": 5}', '[]', 'null', event({ data: null })]) {
			const res = await post(body, signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET));
			expect(res.status, body).toBe(200);
		}
	});

	it('acknowledges a signed event naming an object the store’s account does not have', async () => {
		const { store, account } = await acceptedJob('Unknown Object Floors');
		t.fake.account(account);
		for (const object of [
			{ id: 'cs_test_nowhere', object: 'checkout.session', metadata: { store_id: store.id } },
			{ id: 'ch_nowhere', object: 'charge', metadata: { payment_id: 'nope' } },
			{ id: 'po_nowhere', object: 'payout' },
			{ id: 're_nowhere', object: 'refund', payment_intent: 'pi_nowhere', metadata: [1, 2] }
		]) {
			const body = event({ account, data: { object } });
			const res = await post(body, signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET));
			expect(res.status, object.id).toBe(200);
		}
	});

	it('without a connected account does nothing for a store that has one', async () => {
		const { store, account, job } = await acceptedJob('Platform Event Floors');
		const since = Math.floor(Date.now() / 1000) - 1;
		await t.fake.pay(await depositSession(store, job.id), 'success');
		const events = eventsFor(account, since);
		for (const real of events) {
			const platform = structuredClone(real) as Stripe.Event;
			platform.id = `${real.id}_platform`;
			delete (platform as { account?: string }).account;
			expect(await handleEvent(platform, t.stripe)).toBe('ignored');
		}
		const [p] = (await readInStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments;
		expect(p.status).toBe('pending');
		// The store's own events still do.
		for (const e of events) await handleEvent(e, t.stripe);
		const [paid] = (await readInStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments;
		expect(paid.status).toBe('succeeded');
	});
});

describe('connecting a Stripe account', () => {
	it('saves only an account Stripe has for the platform, and never says whose one is', async () => {
		const first = await makeStore('First Account Floors');
		const second = await makeStore('Second Account Floors');
		const known = newAccount();
		t.fake.account(known);
		expect(await connectStripeAccount(first.id, newAccount(), t.stripe)).toEqual({
			ok: false,
			reason: 'unknown'
		});
		expect(await readInStore(first.id, (tx) => stripeAccount(tx))).toBeNull();
		expect(await connectStripeAccount(first.id, known, t.stripe)).toEqual({ ok: true });
		expect(await readInStore(first.id, (tx) => stripeAccount(tx))).toBe(known);
		// Another store's account: the same answer as an unknown one.
		expect(await connectStripeAccount(second.id, known, t.stripe)).toEqual({
			ok: false,
			reason: 'unknown'
		});
		const made = await t.stripe.accounts.create({ type: 'standard' });
		expect(await connectStripeAccount(second.id, made.id, t.stripe)).toEqual({ ok: true });
		expect(await connectStripeAccount(second.id, null, t.stripe)).toEqual({ ok: true });
		expect(await readInStore(second.id, (tx) => stripeAccount(tx))).toBeNull();
	});
});
