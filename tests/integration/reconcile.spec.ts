// The reconciliation, seeded with a mismatch of each kind, flags each one; payouts show the fees
// they netted.
import { LOCAL_STRIPE_WEBHOOK_SECRET } from '$lib/server/config';
import * as payments from '$lib/server/db/queries/payments';
import { saveStripeAccount } from '$lib/server/db/queries/settings';
import { payment } from '$lib/server/db/schema';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { startCheckout } from '$lib/server/payments/checkout';
import { reconcile } from '$lib/server/payments/reconcile';
import { syncStripeActivity } from '$lib/server/payments/stripe-activity';
import { handleEvent } from '$lib/server/payments/webhook';
import { stripeFakeForTests } from '$mocks/stripe/testing';
import { resendHandlers } from '$mocks/resend';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeQuotedJob, makeStore, sendAndAccept, unique } from './factories';

let t: ReturnType<typeof stripeFakeForTests>;
beforeAll(() => {
	t = stripeFakeForTests({ dataDir: null, webhookSecret: LOCAL_STRIPE_WEBHOOK_SECRET });
	t.server.use(...resendHandlers(mkdtempSync(path.join(tmpdir(), 'reconcile-outbox-'))));
});
afterAll(async () => {
	await t.close();
});

describe('reconciliation', () => {
	it('flags matched, Stripe-only, ledger-only and differing lines, and shows payouts with their fees', async () => {
		const store = await makeStore('Reconcile Floors');
		const account = `acct_${unique('r').replace(/[^a-z0-9]/gi, '')}`;
		await inStore(store.id, (tx) => saveStripeAccount(tx, account));
		const from = new Date(Date.now() - 60_000);

		/** A job paid by card through Checkout, its events handled. */
		async function paidJob() {
			const made = await makeQuotedJob(store);
			await sendAndAccept(store, made);
			const since = Math.floor(Date.now() / 1000) - 1;
			const started = await startCheckout(
				{ storeId: store.id, jobId: made.job.id, purpose: 'deposit', linkToken: 'x' },
				t.stripe
			);
			if (!started.ok) throw new Error(started.reason);
			await t.fake.pay(/(cs_\w+)/.exec(started.url)![1], 'success');
			for (const e of t.fake
				.events()
				.filter((e) => e.account === account && e.created >= since)
				.reverse()) {
				await handleEvent(e, t.stripe);
			}
			return (await inStore(store.id, (tx) => payments.moneyFor(tx, made.job.id))).payments[0];
		}

		const matched = await paidJob();
		const differing = await paidJob();
		await inStore(store.id, (tx) =>
			tx
				.update(payment)
				.set({ amountCents: differing.amountCents - 500 })
				.where(and(eq(payment.organizationId, store.id), eq(payment.id, differing.id)))
		);

		// A charge made in Stripe that the ledger never heard of.
		const loose = await t.stripe.checkout.sessions.create(
			{
				mode: 'payment',
				line_items: [
					{
						price_data: {
							currency: 'usd',
							unit_amount: 12_345,
							product_data: { name: 'Counter sale' }
						},
						quantity: 1
					}
				],
				success_url: 'http://127.0.0.1/x',
				cancel_url: 'http://127.0.0.1/y'
			},
			{ stripeAccount: account }
		);
		await t.fake.pay(loose.id, 'success');

		// A card payment the ledger has that Stripe lacks.
		const [ghost] = await inStore(store.id, (tx) =>
			tx
				.insert(payment)
				.values({
					organizationId: store.id,
					jobId: matched.jobId,
					purpose: 'balance',
					method: 'card',
					status: 'succeeded',
					currency: 'USD',
					amountCents: 7_000,
					stripeChargeId: 'ch_nowhere_to_be_found',
					succeededAt: new Date()
				})
				.returning()
		);

		// A refund made in Stripe's dashboard, on the matched charge.
		await t.stripe.refunds.create(
			{ charge: matched.stripeChargeId!, amount: 1_000 },
			{ stripeAccount: account }
		);
		const [payout] = await t.fake.payout(undefined, account);

		const to = new Date(Date.now() + 60_000);
		await syncStripeActivity(store.id, { from, to }, t.stripe);
		const report = await readInStore(store.id, (tx) => reconcile(tx, from, to));
		const find = (status: string, kind = 'charge') =>
			report.rows.filter((r) => r.status === status && r.kind === kind);
		expect(find('matched').map((r) => r.paymentId)).toEqual([matched.id]);
		expect(find('amount_differs')).toEqual([
			expect.objectContaining({
				paymentId: differing.id,
				stripeCents: differing.amountCents,
				ledgerCents: differing.amountCents - 500
			})
		]);
		expect(find('stripe_only')).toEqual([
			expect.objectContaining({ stripeCents: 12_345, paymentId: null })
		]);
		expect(find('ledger_only')).toEqual([
			expect.objectContaining({ paymentId: ghost.id, ledgerCents: 7_000 })
		]);
		expect(find('stripe_only', 'refund')).toEqual([
			expect.objectContaining({ stripeCents: -1_000 })
		]);
		expect(report.counts).toEqual({
			matched: 1,
			amount_differs: 1,
			stripe_only: 2,
			ledger_only: 1
		});

		// The ledger's side of the totals, from the one ledger function: the charges it has (the
		// differing one at its own amount, the ghost too), none of Stripe's dashboard refund.
		expect(report.ledgerTotals).toEqual({
			receivedCents: matched.amountCents + differing.amountCents - 500 + 7_000,
			refundedCents: 0,
			feeCents: (matched.feeCents ?? 0) + (differing.feeCents ?? 0)
		});

		// The matched charge's fee is in the ledger as Stripe has it.
		expect(find('matched')[0].stripeFeeCents).toBe(matched.feeCents);
		// The payout netted the charges less their fees and the refund.
		const row = report.payouts.find((p) => p.id === payout.id)!;
		expect(row.netCents).toBe(row.grossCents - row.feeCents - row.refundCents);
		expect(row.feeCents).toBe(report.totals.feeCents);
		expect(row.grossCents).toBe(matched.amountCents + differing.amountCents + 12_345);
	});

	it('says when the store has no Stripe account', async () => {
		const store = await makeStore('Cash Only Floors');
		await syncStripeActivity(store.id, {}, t.stripe);
		const report = await readInStore(store.id, (tx) => reconcile(tx, new Date(0), new Date()));
		expect(report).toMatchObject({ connected: false, rows: [] });
	});
});
