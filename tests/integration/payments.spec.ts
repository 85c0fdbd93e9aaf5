// The money path against the real database and the Stripe fake, through the real SDK: deposits
// by Checkout, webhooks replayed, late, out of order or forged, declines, two tabs, refunds, and a
// webhook the app never got.
import { inStore } from '$lib/server/db/tenant';
import { LOCAL_STRIPE_WEBHOOK_SECRET } from '$lib/server/config';
import * as jobs from '$lib/server/db/queries/jobs';
import * as payments from '$lib/server/db/queries/payments';
import { saveStripeAccount } from '$lib/server/db/queries/settings';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { startCheckout } from '$lib/server/payments/checkout';
import { refundCard } from '$lib/server/payments/refunds';
import { catchUp } from '$lib/server/payments/sync';
import { handleEvent } from '$lib/server/payments/webhook';
import { buildQuote } from '$lib/server/quotes/build';
import { verifiedEvent } from '$lib/server/stripe';
import { signatureHeader } from '$mocks/stripe';
import { stripeFakeForTests } from '$mocks/stripe/testing';
import { resendHandlers } from '$mocks/resend';
import { readOutbox } from '$mocks/outbox';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeQuotedJob, makeStore, sendAndAccept, unique, type TestStore } from './factories';
import { acceptedJob, depositSession, eventsFor as eventsForIn } from './card-jobs';
import { eventually, startTestWorker } from './task-worker';
import type { TaskWorker } from '$lib/server/tasks/worker';
import { jobScope } from '$lib/server/object-access';
import { grantsOf } from '$lib/server/permissions';

const outbox = mkdtempSync(path.join(tmpdir(), 'payments-outbox-'));
let t: ReturnType<typeof stripeFakeForTests>;
let worker: TaskWorker;
beforeAll(async () => {
	t = stripeFakeForTests({ dataDir: null, webhookSecret: LOCAL_STRIPE_WEBHOOK_SECRET });
	t.server.use(...resendHandlers(outbox));
	// Receipts and notices are tasks: the worker sends them once the payment has committed.
	worker = await startTestWorker(t.stripe);
});
afterAll(async () => {
	await worker.stop();
	await t.close();
});

const owner = (store: TestStore) => jobScope(grantsOf('owner'), store.owner.id);

const deposit = (store: TestStore, jobId: string) => depositSession(t, store, jobId);
const eventsFor = (account: string, after: number) => eventsForIn(t, account, after);

describe('a deposit by card', () => {
	it('is recorded once from its webhooks, with its fee; the job becomes sold and the customer gets a receipt', async () => {
		const { store, account, job, quote } = await acceptedJob();
		const since = Math.floor(Date.now() / 1000) - 1;
		const session = await deposit(store, job.id);
		expect((await t.fake.pay(session, 'success')).outcome).toBe('paid');
		const events = eventsFor(account, since);
		expect(events.map((e) => e.type)).toContain('checkout.session.completed');
		for (const e of events) expect(await handleEvent(e, t.stripe)).toBe('handled');

		const money = await inStore(store.id, (tx) => payments.moneyFor(tx, job.id));
		expect(money.payments).toHaveLength(1);
		expect(money.payments[0]).toMatchObject({
			status: 'succeeded',
			method: 'card',
			amountCents: quote.depositCents
		});
		// The fake's own fee rule: 2.9 % rounded half up, plus 30 of the smallest unit (mocks/stripe/money.ts).
		expect(money.payments[0].feeCents).toBe(Math.round(quote.depositCents * 0.029) + 30);
		expect(
			(await inStore(store.id, (tx) => jobs.readForViewer(tx, job.id, owner(store))))?.status
		).toBe('sold');
		const receipt = await eventually(() =>
			readOutbox(outbox).find((m) => m.subject.startsWith('Receipt from Card Floors'))
		);
		expect(receipt?.to).toEqual(['customer@test.example']);

		// The same events again change nothing.
		for (const e of events) expect(await handleEvent(e, t.stripe)).toBe('duplicate');
		expect((await inStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments).toHaveLength(
			1
		);
	});

	it('ends in the same state when its events arrive out of order', async () => {
		const { store, account, job } = await acceptedJob('Shuffled Floors');
		const since = Math.floor(Date.now() / 1000) - 1;
		const session = await deposit(store, job.id);
		await t.fake.pay(session, 'success');
		for (const e of eventsFor(account, since).reverse()) await handleEvent(e, t.stripe);
		const money = await inStore(store.id, (tx) => payments.moneyFor(tx, job.id));
		expect(money.payments.map((p) => p.status)).toEqual(['succeeded']);
		expect(money.ledger.depositDueCents).toBe(0);
		expect(
			(await inStore(store.id, (tx) => jobs.readForViewer(tx, job.id, owner(store))))?.status
		).toBe('sold');
	});

	it('declined, leaves the job accepted, with the decline for the customer', async () => {
		const { store, account, job } = await acceptedJob('Declined Floors');
		const since = Math.floor(Date.now() / 1000) - 1;
		const session = await deposit(store, job.id);
		expect((await t.fake.pay(session, 'decline')).outcome).toBe('declined');
		for (const e of eventsFor(account, since)) await handleEvent(e, t.stripe);
		const [p] = (await inStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments;
		expect(p.status).toBe('pending');
		expect(p.failureMessage).toMatch(/declined/i);
		expect(
			(await inStore(store.id, (tx) => jobs.readForViewer(tx, job.id, owner(store))))?.status
		).toBe('accepted');
	});

	it('opened in two tabs at once is one checkout and one charge', async () => {
		const { store, job } = await acceptedJob('Two Tab Floors');
		const [a, b] = await Promise.all([
			startCheckout(
				{ storeId: store.id, jobId: job.id, purpose: 'deposit', linkToken: 'tok' },
				t.stripe
			),
			startCheckout(
				{ storeId: store.id, jobId: job.id, purpose: 'deposit', linkToken: 'tok' },
				t.stripe
			)
		]);
		expect(a.ok && b.ok && a.url === b.url).toBe(true);
		expect((await inStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments).toHaveLength(
			1
		);
	});

	it('paid while the app missed the webhook is caught up from Stripe', async () => {
		const { store, job } = await acceptedJob('Offline Floors');
		const session = await deposit(store, job.id);
		await t.fake.pay(session, 'success');
		expect(
			(await inStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments[0].status
		).toBe('pending');
		expect(await catchUp(store.id, t.stripe)).toEqual(['succeeded']);
		expect(
			(await inStore(store.id, (tx) => jobs.readForViewer(tx, job.id, owner(store))))?.status
		).toBe('sold');
	});

	it('is not payable before the quote is accepted, and nothing is due twice', async () => {
		const store = await makeStore('Early Floors');
		await inStore(store.id, (tx) =>
			saveStripeAccount(tx, `acct_${unique('e').replace(/[^a-z0-9]/gi, '')}`)
		);
		const { job } = await makeQuotedJob(store);
		const early = await startCheckout(
			{ storeId: store.id, jobId: job.id, purpose: 'deposit', linkToken: 'tok' },
			t.stripe
		);
		expect(early).toEqual({ ok: false, reason: 'not_payable' });
	});
});

describe('webhook signatures', () => {
	const request = (body: string, header: string) =>
		new Request('http://x/api/webhooks/stripe', {
			method: 'POST',
			body,
			headers: { 'stripe-signature': header }
		});
	const body = JSON.stringify({
		id: 'evt_test',
		object: 'event',
		type: 'charge.succeeded',
		created: 1_700_000_000,
		data: { object: { id: 'ch_test', object: 'charge' } }
	});

	it('admits a body signed with the endpoint secret', async () => {
		const event = await verifiedEvent(
			request(body, signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET))
		);
		expect(event.id).toBe('evt_test');
	});

	it('refuses a wrong signature, a changed body and a stale timestamp (over 300 s)', async () => {
		await expect(
			verifiedEvent(request(body, signatureHeader(body, 'whsec_someone_else')))
		).rejects.toThrow();
		await expect(
			verifiedEvent(request(`${body} `, signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET)))
		).rejects.toThrow();
		const stale = Math.floor(Date.now() / 1000) - 301;
		await expect(
			verifiedEvent(request(body, signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET, stale)))
		).rejects.toThrow(/tolerance/i);
	});
});

describe('refunds of a card payment', () => {
	it('in parts sum to the charge, and no more can be refunded', async () => {
		const { store, account, job } = await acceptedJob('Refund Floors');
		const since = Math.floor(Date.now() / 1000) - 1;
		const session = await deposit(store, job.id);
		await t.fake.pay(session, 'success');
		for (const e of eventsFor(account, since)) await handleEvent(e, t.stripe);
		const [paid] = (await inStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments;
		const third = Math.floor(paid.amountCents / 3);
		const parts = [third, third, paid.amountCents - 2 * third];
		for (const amountCents of parts) {
			expect(
				await refundCard(
					store.id,
					paid.id,
					{ amountCents, reason: 'cancellation', note: '' },
					store.owner.id,
					t.stripe
				)
			).toEqual({ ok: true });
		}
		const after = await inStore(store.id, (tx) => payments.moneyFor(tx, job.id));
		expect(after.payments[0]).toMatchObject({
			status: 'refunded',
			refundedCents: paid.amountCents
		});
		expect(after.refunds.map((r) => r.status)).toEqual(['succeeded', 'succeeded', 'succeeded']);
		expect(after.refunds.reduce((s, r) => s + r.amountCents, 0)).toBe(paid.amountCents);
		expect(
			await refundCard(
				store.id,
				paid.id,
				{ amountCents: 1, reason: 'other', note: '' },
				store.owner.id,
				t.stripe
			)
		).toEqual({
			ok: false,
			reason: 'nothing_to_refund'
		});
	});

	it('larger than what is left is refused, and nothing is written', async () => {
		const { store, account, job } = await acceptedJob('Over Refund Floors');
		const since = Math.floor(Date.now() / 1000) - 1;
		await t.fake.pay(await deposit(store, job.id), 'success');
		for (const e of eventsFor(account, since)) await handleEvent(e, t.stripe);
		const [paid] = (await inStore(store.id, (tx) => payments.moneyFor(tx, job.id))).payments;
		expect(
			await refundCard(
				store.id,
				paid.id,
				{ amountCents: paid.amountCents + 1, reason: 'overcharge', note: '' },
				store.owner.id,
				t.stripe
			)
		).toEqual({ ok: false, reason: 'more_than_paid' });
		expect((await inStore(store.id, (tx) => payments.moneyFor(tx, job.id))).refunds).toEqual([]);
	});
});

describe('events across stores', () => {
	it('ignores an event naming another store than the account it came from', async () => {
		const a = await acceptedJob('Alpha Card Floors');
		const b = await acceptedJob('Beta Card Floors');
		const since = Math.floor(Date.now() / 1000) - 1;
		await t.fake.pay(await deposit(a.store, a.job.id), 'success');
		const real = eventsFor(a.account, since).find((e) => e.type === 'checkout.session.completed')!;
		// The same event, as if it said it belonged to store B.
		const forged = structuredClone(real) as Stripe.Event;
		(forged.data.object as { metadata: Record<string, string> }).metadata.store_id = b.store.id;
		forged.id = `${real.id}_forged`;
		expect(await handleEvent(forged, t.stripe)).toBe('ignored');
		expect((await inStore(b.store.id, (tx) => payments.moneyFor(tx, b.job.id))).payments).toEqual(
			[]
		);
	});
});

describe('a store in a zero-decimal currency', () => {
	it('charges whole yen, as Stripe counts them', async () => {
		const store = await makeStore('Yen Floors');
		const account = `acct_${unique('y').replace(/[^a-z0-9]/gi, '')}`;
		await inStore(store.id, (tx) => saveStripeAccount(tx, account));
		const made = await makeQuotedJob(store);
		const trade = await inStore(store.id, (tx) => tradeSettings.read(tx));
		await inStore(store.id, (tx) => tradeSettings.save(tx, { ...trade, currency: 'JPY' }));
		const yen = await inStore(store.id, (tx) => buildQuote(tx, made.job.id, store.owner.id));
		if (!yen.ok) throw new Error('rebuild');
		await sendAndAccept(store, { job: made.job, quote: yen.quote });
		const session = await deposit(store, made.job.id);
		const created = await t.stripe.checkout.sessions.retrieve(
			session,
			{},
			{ stripeAccount: account }
		);
		expect(created.currency).toBe('jpy');
		expect(created.amount_total).toBe(yen.quote.depositCents);
		expect(Number.isInteger(created.amount_total)).toBe(true);
	});
});
