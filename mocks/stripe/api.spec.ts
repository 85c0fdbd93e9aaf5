import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Stripe from 'stripe';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createStripeFake } from './index';
import { stripeFakeForTests } from './testing';

let t: ReturnType<typeof stripeFakeForTests>;
beforeEach(() => {
	t = stripeFakeForTests();
});
afterEach(async () => {
	await t.close();
});

/** The StripeError a call threw (fails the test when it did not throw one). */
async function refusal(call: Promise<unknown>): Promise<Stripe.errors.StripeError> {
	try {
		await call;
	} catch (e) {
		expect(e).toBeInstanceOf(Stripe.errors.StripeError);
		return e as Stripe.errors.StripeError;
	}
	throw new Error('expected the call to be refused');
}

const deposit = (
	overrides: Partial<Stripe.Checkout.SessionCreateParams> = {},
	request?: Stripe.RequestOptions
) =>
	t.stripe.checkout.sessions.create(
		{
			mode: 'payment',
			line_items: [
				{
					price_data: {
						currency: 'usd',
						unit_amount: 125_000,
						product_data: { name: 'Deposit for job J-1042' }
					},
					quantity: 1
				}
			],
			customer_email: 'ada.quill@example.example',
			success_url: 'http://127.0.0.1:4173/paid?session={CHECKOUT_SESSION_ID}',
			cancel_url: 'http://127.0.0.1:4173/quote',
			metadata: { store_id: 'org_1', store_name: 'Tallow Creek Floors', purpose: 'deposit' },
			payment_intent_data: { metadata: { store_id: 'org_1', job_id: 'job_1' } },
			client_reference_id: 'quote_1',
			...overrides
		},
		request
	);

/** A paid deposit: the session, its PaymentIntent and its charge. */
async function paidDeposit(amount = 10_000, currency = 'usd') {
	const session = await deposit({
		line_items: [
			{
				price_data: { currency, unit_amount: amount, product_data: { name: 'Deposit' } },
				quantity: 1
			}
		]
	});
	const result = await t.fake.pay(session.id, 'success', { name: 'Ada Quill' });
	expect(result.outcome).toBe('paid');
	const intent = await t.stripe.paymentIntents.retrieve(String(result.session.payment_intent));
	const charge = await t.stripe.charges.retrieve(String(intent.latest_charge));
	return { session, intent, charge };
}

describe('customers', () => {
	it('creates, retrieves and lists customers in Stripe’s shape', async () => {
		const created = await t.stripe.customers.create({
			email: 'ada.quill@example.example',
			name: 'Ada Quill',
			metadata: { store_id: 'org_1' }
		});
		expect(created).toMatchObject({
			object: 'customer',
			email: 'ada.quill@example.example',
			name: 'Ada Quill',
			livemode: false,
			metadata: { store_id: 'org_1' }
		});
		expect(created.id).toMatch(/^cus_/);
		expect(Math.abs(created.created - Date.now() / 1000)).toBeLessThan(5);
		expect((await t.stripe.customers.retrieve(created.id)).id).toBe(created.id);
		const byEmail = await t.stripe.customers.list({ email: 'ada.quill@example.example' });
		expect(byEmail.data.map((c) => c.id)).toEqual([created.id]);
		expect(byEmail).toMatchObject({ object: 'list', has_more: false, url: '/v1/customers' });
	});

	it('answers 404 resource_missing for an unknown id and 400 for unknown parameters', async () => {
		const missing = await refusal(t.stripe.customers.retrieve('cus_nope'));
		expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
		expect(missing).toMatchObject({ statusCode: 404, code: 'resource_missing', param: 'id' });
		expect(missing.message).toBe("No such customer: 'cus_nope'");
		const unknown = await refusal(
			t.stripe.customers.create({ colour: 'blue' } as Stripe.CustomerCreateParams)
		);
		expect(unknown).toMatchObject({ statusCode: 400, code: 'parameter_unknown', param: 'colour' });
	});

	it('refuses requests without a test secret key (401)', async () => {
		const live = new Stripe('sk_live_not_here', { maxNetworkRetries: 0 });
		const refused = await refusal(live.customers.list());
		expect(refused).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
		const bare = await fetch('https://api.stripe.com/v1/customers');
		expect(bare.status).toBe(401);
		expect((await bare.json()).error.type).toBe('invalid_request_error');
	});

	it('answers errors in Stripe’s body shape, with a request id', async () => {
		const response = await fetch('https://api.stripe.com/v1/charges/ch_nope', {
			headers: { authorization: 'Bearer sk_test_local_fake' }
		});
		expect(response.status).toBe(404);
		expect(response.headers.get('request-id')).toMatch(/^req_/);
		expect(await response.json()).toEqual({
			error: {
				type: 'invalid_request_error',
				code: 'resource_missing',
				doc_url: 'https://docs.stripe.com/error-codes/resource_missing',
				message: "No such charge: 'ch_nope'",
				param: 'id'
			}
		});
		const unknownPath = await fetch('https://api.stripe.com/v1/subscriptions', {
			headers: { authorization: 'Bearer sk_test_local_fake' }
		});
		expect(unknownPath.status).toBe(404);
		expect((await unknownPath.json()).error.message).toMatch(/^Unrecognized request URL/);
	});
});

describe('pagination', () => {
	it('pages newest first with has_more, and autoPagingEach walks every object once', async () => {
		const ids: string[] = [];
		for (let i = 0; i < 25; i++) ids.push((await t.stripe.customers.create({ name: `P${i}` })).id);
		const newestFirst = [...ids].reverse();

		const first = await t.stripe.customers.list({ limit: 10 });
		expect(first.data.map((c) => c.id)).toEqual(newestFirst.slice(0, 10));
		expect(first.has_more).toBe(true);
		const after = await t.stripe.customers.list({ limit: 10, starting_after: first.data[9].id });
		expect(after.data.map((c) => c.id)).toEqual(newestFirst.slice(10, 20));
		const last = await t.stripe.customers.list({ limit: 10, starting_after: after.data[9].id });
		expect(last.data).toHaveLength(5);
		expect(last.has_more).toBe(false);

		const walked: string[] = [];
		await t.stripe.customers.list({ limit: 7 }).autoPagingEach((c) => {
			walked.push(c.id);
		});
		expect(walked).toEqual(newestFirst);

		const before = await t.stripe.customers.list({ limit: 3, ending_before: newestFirst[10] });
		expect(before.data.map((c) => c.id)).toEqual(newestFirst.slice(7, 10));
		expect(before.has_more).toBe(true);
		const backwards = await t.stripe.customers
			.list({ limit: 4, ending_before: newestFirst[10] })
			.autoPagingToArray({ limit: 100 });
		expect(backwards.map((c) => c.id)).toEqual(newestFirst.slice(0, 10).reverse());
	});

	it('refuses a bad limit and an unknown cursor', async () => {
		expect(await refusal(t.stripe.customers.list({ limit: 101 }))).toMatchObject({
			statusCode: 400,
			param: 'limit'
		});
		expect(await refusal(t.stripe.customers.list({ starting_after: 'cus_gone' }))).toMatchObject({
			statusCode: 400,
			code: 'resource_missing',
			param: 'starting_after'
		});
	});

	it('filters charges by created range and by PaymentIntent', async () => {
		const { charge, intent } = await paidDeposit();
		await paidDeposit(5_000);
		const inRange = await t.stripe.charges.list({
			created: { gte: charge.created, lte: charge.created + 60 }
		});
		expect(inRange.data).toHaveLength(2);
		expect((await t.stripe.charges.list({ created: { lt: charge.created } })).data).toHaveLength(0);
		const forIntent = await t.stripe.charges.list({ payment_intent: intent.id });
		expect(forIntent.data.map((c) => c.id)).toEqual([charge.id]);
	});
});

describe('Checkout Sessions', () => {
	it('creates an open session whose url is the app’s own checkout page', async () => {
		const session = await deposit();
		expect(session).toMatchObject({
			object: 'checkout.session',
			mode: 'payment',
			status: 'open',
			payment_status: 'unpaid',
			amount_total: 125_000,
			currency: 'usd',
			payment_intent: null,
			client_reference_id: 'quote_1',
			customer_email: 'ada.quill@example.example',
			livemode: false,
			url: `http://127.0.0.1:4173/dev/checkout/${session.id}`
		});
		expect(session.id).toMatch(/^cs_test_/);
		expect(session.expires_at - session.created).toBe(24 * 3600);
		expect(session.line_items).toBeUndefined();
		const expanded = await t.stripe.checkout.sessions.retrieve(session.id, {
			expand: ['line_items']
		});
		expect(expanded.line_items?.data[0]).toMatchObject({
			object: 'item',
			description: 'Deposit for job J-1042',
			quantity: 1,
			amount_total: 125_000,
			price: { unit_amount: 125_000, currency: 'usd' }
		});
		const items = await t.stripe.checkout.sessions.listLineItems(session.id);
		expect(items.data).toHaveLength(1);
	});

	it('refuses bad input with the parameter named', async () => {
		const cases: [Partial<Stripe.Checkout.SessionCreateParams>, string, string?][] = [
			[{ line_items: [] }, 'line_items', 'parameter_missing'],
			[
				{
					line_items: [
						{
							price_data: { currency: 'usd', unit_amount: 12.5, product_data: { name: 'x' } },
							quantity: 1
						}
					]
				},
				'line_items[0][price_data][unit_amount]',
				'parameter_invalid_integer'
			],
			[
				{
					line_items: [
						{
							price_data: { currency: 'zzz', unit_amount: 100, product_data: { name: 'x' } },
							quantity: 1
						}
					]
				},
				'line_items[0][price_data][currency]'
			],
			[
				{
					line_items: [
						{
							price_data: { currency: 'usd', unit_amount: 49, product_data: { name: 'x' } },
							quantity: 1
						}
					]
				},
				'line_items',
				'amount_too_small'
			],
			[
				{
					line_items: [
						{
							price_data: { currency: 'usd', unit_amount: 100, product_data: { name: 'x' } },
							quantity: 0
						}
					]
				},
				'line_items[0][quantity]'
			],
			[{ customer: 'cus_nope', customer_email: undefined }, 'customer', 'resource_missing'],
			[{ success_url: 'not a url' }, 'success_url', 'url_invalid'],
			[{ expires_at: Math.floor(Date.now() / 1000) + 60 }, 'expires_at'],
			[{ expires_at: Math.floor(Date.now() / 1000) + 25 * 3600 }, 'expires_at']
		];
		for (const [overrides, param, code] of cases) {
			const error = await refusal(deposit(overrides));
			expect(error, param).toMatchObject({
				statusCode: 400,
				type: 'StripeInvalidRequestError',
				param
			});
			if (code) expect(error.code, param).toBe(code);
		}
		const customer = await t.stripe.customers.create({ email: 'x@example.example' });
		expect(await refusal(deposit({ customer: customer.id }))).toMatchObject({
			param: 'customer_email'
		});
		expect(await t.stripe.checkout.sessions.list()).toMatchObject({ data: [] });
	});

	it('finds a session by its PaymentIntent, and expires an open one once', async () => {
		const { session, intent } = await paidDeposit();
		const found = await t.stripe.checkout.sessions.list({ payment_intent: intent.id });
		expect(found.data.map((s) => s.id)).toEqual([session.id]);
		expect(found.data[0]).toMatchObject({ status: 'complete', payment_status: 'paid' });

		const open = await deposit();
		const expired = await t.stripe.checkout.sessions.expire(open.id);
		expect(expired).toMatchObject({ status: 'expired', url: null });
		expect(await refusal(t.stripe.checkout.sessions.expire(open.id))).toMatchObject({
			statusCode: 400
		});
		expect((await t.fake.pay(open.id, 'success')).outcome).toBe('expired');
	});

	it('charges once when the same session is paid twice (two tabs)', async () => {
		const session = await deposit();
		const [one, two] = await Promise.all([
			t.fake.pay(session.id, 'success'),
			t.fake.pay(session.id, 'success')
		]);
		expect([one.outcome, two.outcome].sort()).toEqual(['already_paid', 'paid']);
		expect((await t.stripe.charges.list()).data).toHaveLength(1);
		expect((await t.fake.pay(session.id, 'success')).outcome).toBe('already_paid');
	});

	it('keeps a declined session open with the decline on its PaymentIntent', async () => {
		const session = await deposit();
		const declined = await t.fake.pay(session.id, 'decline');
		expect(declined.outcome).toBe('declined');
		const after = await t.stripe.checkout.sessions.retrieve(session.id, {
			expand: ['payment_intent.latest_charge']
		});
		expect(after).toMatchObject({ status: 'open', payment_status: 'unpaid' });
		const intent = after.payment_intent as Stripe.PaymentIntent;
		expect(intent.status).toBe('requires_payment_method');
		expect(intent.last_payment_error).toMatchObject({
			type: 'card_error',
			code: 'card_declined',
			decline_code: 'generic_decline'
		});
		expect(intent.latest_charge).toMatchObject({
			status: 'failed',
			paid: false,
			balance_transaction: null
		});
		expect((await t.fake.pay(session.id, 'success')).outcome).toBe('paid');
		const paid = await t.stripe.paymentIntents.retrieve(intent.id);
		expect(paid).toMatchObject({
			status: 'succeeded',
			last_payment_error: null,
			amount_received: 125_000
		});
		expect(paid.metadata).toEqual({ store_id: 'org_1', job_id: 'job_1' });
	});
});

describe('expand', () => {
	it('expands a session’s PaymentIntent down to the charge’s balance transaction', async () => {
		const { session } = await paidDeposit(10_000);
		const full = await t.stripe.checkout.sessions.retrieve(session.id, {
			expand: ['payment_intent.latest_charge.balance_transaction']
		});
		const intent = full.payment_intent as Stripe.PaymentIntent;
		const charge = intent.latest_charge as Stripe.Charge;
		const txn = charge.balance_transaction as Stripe.BalanceTransaction;
		expect(intent.object).toBe('payment_intent');
		expect(charge).toMatchObject({ object: 'charge', status: 'succeeded', amount: 10_000 });
		expect(txn).toMatchObject({
			object: 'balance_transaction',
			type: 'charge',
			amount: 10_000,
			fee: 320,
			net: 9_680
		});

		const charges = await t.stripe.charges.list({ expand: ['data.balance_transaction'] });
		expect((charges.data[0].balance_transaction as Stripe.BalanceTransaction).fee).toBe(320);
		const viaIntent = await t.stripe.paymentIntents.retrieve(intent.id, {
			expand: ['latest_charge.balance_transaction']
		});
		expect(
			((viaIntent.latest_charge as Stripe.Charge).balance_transaction as Stripe.BalanceTransaction)
				.id
		).toBe(txn.id);
	});

	it('refuses what cannot be expanded', async () => {
		const customer = await t.stripe.customers.create({});
		expect(
			await refusal(t.stripe.customers.retrieve(customer.id, { expand: ['email'] }))
		).toMatchObject({
			statusCode: 400,
			param: 'expand'
		});
	});
});

describe('idempotency', () => {
	it('replays the first response for the same key and parameters', async () => {
		const one = await t.stripe.customers.create(
			{ email: 'a@example.example' },
			{ idempotencyKey: 'k-1' }
		);
		const two = await t.stripe.customers.create(
			{ email: 'a@example.example' },
			{ idempotencyKey: 'k-1' }
		);
		expect(two.id).toBe(one.id);
		expect(two.lastResponse.headers['idempotent-replayed']).toBe('true');
		expect((await t.stripe.customers.list()).data).toHaveLength(1);
	});

	it('refuses a key reused with other parameters or on another endpoint', async () => {
		await t.stripe.customers.create({ email: 'a@example.example' }, { idempotencyKey: 'k-2' });
		const other = await refusal(
			t.stripe.customers.create({ email: 'b@example.example' }, { idempotencyKey: 'k-2' })
		);
		expect(other).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
		expect(other.statusCode).toBe(400);
		const elsewhere = await refusal(
			t.stripe.refunds.create({ charge: 'ch_x' }, { idempotencyKey: 'k-2' })
		);
		expect(elsewhere).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
		expect((await t.stripe.customers.list()).data).toHaveLength(1);
	});

	it('does not keep refused parameters: the same key works once the request is fixed', async () => {
		const bad = await refusal(
			t.stripe.customers.create({ email: 'bad' }, { idempotencyKey: 'k-3' })
		);
		expect(bad.code).toBe('email_invalid');
		const good = await t.stripe.customers.create(
			{ email: 'good@example.example' },
			{ idempotencyKey: 'k-3' }
		);
		expect(good.email).toBe('good@example.example');
	});

	it('creates one refund when the same refund is sent twice', async () => {
		const { charge } = await paidDeposit(10_000);
		const a = await t.stripe.refunds.create(
			{ charge: charge.id, amount: 2_500 },
			{ idempotencyKey: 'refund-1' }
		);
		const b = await t.stripe.refunds.create(
			{ charge: charge.id, amount: 2_500 },
			{ idempotencyKey: 'refund-1' }
		);
		expect(b.id).toBe(a.id);
		expect((await t.stripe.charges.retrieve(charge.id)).amount_refunded).toBe(2_500);
	});

	it('replays a 402 decline for the same key (Stripe keeps results once execution began)', async () => {
		const params = {
			amount: 5_000,
			currency: 'usd',
			payment_method: 'pm_card_chargeDeclined',
			confirm: true
		};
		const one = await refusal(t.stripe.paymentIntents.create(params, { idempotencyKey: 'pi-1' }));
		const two = await refusal(t.stripe.paymentIntents.create(params, { idempotencyKey: 'pi-1' }));
		expect(two.statusCode).toBe(402);
		expect(two.charge).toBe(one.charge);
		expect(one.charge).toMatch(/^ch_/);
		expect((await t.stripe.paymentIntents.list()).data).toHaveLength(1);
	});
});

describe('PaymentIntents through the API', () => {
	it('confirms with the test PaymentMethods: a decline is a 402 card_error with decline_code', async () => {
		const ok = await t.stripe.paymentIntents.create({
			amount: 7_500,
			currency: 'usd',
			payment_method: 'pm_card_visa',
			confirm: true,
			metadata: { job_id: 'job_9' }
		});
		expect(ok).toMatchObject({ status: 'succeeded', amount_received: 7_500 });
		const declined = await refusal(
			t.stripe.paymentIntents.create({
				amount: 7_500,
				currency: 'usd',
				payment_method: 'pm_card_chargeDeclined',
				confirm: true
			})
		);
		expect(declined).toBeInstanceOf(Stripe.errors.StripeCardError);
		expect(declined).toMatchObject({
			statusCode: 402,
			code: 'card_declined',
			decline_code: 'generic_decline'
		});
		const intent = declined.payment_intent as Stripe.PaymentIntent;
		expect(intent.status).toBe('requires_payment_method');
		const retried = await t.stripe.paymentIntents.confirm(intent.id, {
			payment_method: 'pm_card_visa'
		});
		expect(retried.status).toBe('succeeded');
		expect(await refusal(t.stripe.paymentIntents.confirm(intent.id))).toMatchObject({
			code: 'payment_intent_unexpected_state'
		});
	});
});

describe('refunds', () => {
	it('takes partial refunds up to the charge and refuses more', async () => {
		const { charge, intent } = await paidDeposit(10_000);
		const first = await t.stripe.refunds.create({
			charge: charge.id,
			amount: 3_000,
			reason: 'requested_by_customer',
			metadata: { note: 'tile returned' }
		});
		expect(first).toMatchObject({
			object: 'refund',
			amount: 3_000,
			status: 'succeeded',
			charge: charge.id,
			payment_intent: intent.id,
			reason: 'requested_by_customer'
		});
		const tooMuch = await refusal(t.stripe.refunds.create({ charge: charge.id, amount: 7_001 }));
		expect(tooMuch).toMatchObject({ statusCode: 400, param: 'amount', code: 'amount_too_large' });
		expect(tooMuch.message).toBe(
			'Refund amount ($70.01) is greater than unrefunded amount on charge ($70.00)'
		);
		expect((await t.stripe.charges.retrieve(charge.id)).amount_refunded).toBe(3_000);

		const rest = await t.stripe.refunds.create({ payment_intent: intent.id });
		expect(rest.amount).toBe(7_000);
		const after = await t.stripe.charges.retrieve(charge.id, { expand: ['refunds'] });
		expect(after).toMatchObject({ amount_refunded: 10_000, refunded: true });
		expect(after.refunds?.data.map((r) => r.amount).sort()).toEqual([3_000, 7_000]);
		expect(await refusal(t.stripe.refunds.create({ charge: charge.id, amount: 1 }))).toMatchObject({
			code: 'charge_already_refunded'
		});

		const listed = await t.stripe.refunds.list({
			charge: charge.id,
			expand: ['data.balance_transaction']
		});
		expect(
			listed.data
				.map((r) => (r.balance_transaction as Stripe.BalanceTransaction).amount)
				.sort((x, y) => x - y)
		).toEqual([-7_000, -3_000]);
		expect(
			listed.data.every(
				(r) => (r.balance_transaction as Stripe.BalanceTransaction).type === 'refund'
			)
		).toBe(true);
		expect((await t.stripe.refunds.retrieve(first.id)).metadata).toEqual({ note: 'tile returned' });
	});

	it('refuses a refund of a failed charge or of nothing', async () => {
		const session = await deposit();
		const declined = await t.fake.pay(session.id, 'decline');
		const intent = await t.stripe.paymentIntents.retrieve(String(declined.session.payment_intent));
		expect(
			await refusal(t.stripe.refunds.create({ charge: String(intent.latest_charge) }))
		).toMatchObject({
			code: 'charge_not_refundable'
		});
		expect(await refusal(t.stripe.refunds.create({ payment_intent: intent.id }))).toMatchObject({
			param: 'payment_intent'
		});
		expect(await refusal(t.stripe.refunds.create({}))).toMatchObject({ code: 'parameter_missing' });
		expect(await refusal(t.stripe.refunds.create({ charge: 'ch_nope' }))).toMatchObject({
			code: 'resource_missing',
			param: 'charge'
		});
	});
});

describe('fees, currencies and payouts', () => {
	it('charges the fake’s fee rule on charges, none on refunds', async () => {
		await paidDeposit(1_500);
		const txns = await t.stripe.balanceTransactions.list({ type: 'charge' });
		expect(txns.data[0]).toMatchObject({
			amount: 1_500,
			fee: 74, // 2.9% of 1 500 = 43.5 → 44, plus 30
			net: 1_426,
			fee_details: [{ amount: 74, currency: 'usd', type: 'stripe_fee' }],
			status: 'available',
			reporting_category: 'charge'
		});
	});

	it('keeps zero-decimal amounts whole (JPY)', async () => {
		const session = await deposit({
			line_items: [
				{
					price_data: { currency: 'jpy', unit_amount: 5_000, product_data: { name: 'Deposit' } },
					quantity: 2
				}
			]
		});
		expect(session).toMatchObject({ amount_total: 10_000, currency: 'jpy' });
		expect(t.fake.checkout(session.id)?.total).toBe('¥10,000');
		await t.fake.pay(session.id, 'success');
		const [txn] = (await t.stripe.balanceTransactions.list({ currency: 'jpy' })).data;
		expect(txn).toMatchObject({ amount: 10_000, fee: 320, net: 9_680, currency: 'jpy' });
		const small = await refusal(
			deposit({
				line_items: [
					{
						price_data: { currency: 'jpy', unit_amount: 49, product_data: { name: 'x' } },
						quantity: 1
					}
				]
			})
		);
		expect(small.message).toBe('Amount must be at least ¥50 jpy');
	});

	it('pays out the available balance, grouping its balance transactions', async () => {
		const a = await paidDeposit(10_000);
		const b = await paidDeposit(20_000);
		const refund = await t.stripe.refunds.create({ charge: a.charge.id, amount: 1_000 });
		const jpy = await paidDeposit(3_000, 'jpy');

		const balance = await t.stripe.balance.retrieve();
		expect(balance.available.find((x) => x.currency === 'usd')?.amount).toBe(
			9_680 + 19_390 - 1_000
		);

		const payouts = await t.fake.payout('usd');
		expect(payouts).toHaveLength(1);
		const [payout] = payouts;
		expect(payout).toMatchObject({
			object: 'payout',
			status: 'paid',
			currency: 'usd',
			amount: 28_070,
			automatic: true
		});
		const grouped = await t.stripe.balanceTransactions.list({ payout: payout.id, limit: 100 });
		const sources = grouped.data.map((x) => x.source);
		expect(sources).toEqual(
			expect.arrayContaining([a.charge.id, b.charge.id, refund.id, payout.id])
		);
		expect(grouped.data).toHaveLength(4);
		expect(grouped.data.reduce((sum, x) => sum + x.net, 0)).toBe(0);
		expect(sources).not.toContain(jpy.charge.id);

		expect(await t.fake.payout('usd')).toEqual([]);
		expect((await t.stripe.payouts.list()).data.map((p) => p.id)).toEqual([payout.id]);
		expect((await t.stripe.payouts.retrieve(payout.id)).balance_transaction).toMatch(/^txn_/);
		const [yen] = await t.fake.payout();
		expect(yen).toMatchObject({ currency: 'jpy', amount: 3_000 - 117 });
	});
});

describe('persistence', () => {
	it('keeps objects and idempotency keys in <dataDir>/stripe.json across a restart', async () => {
		const dataDir = mkdtempSync(path.join(tmpdir(), 'stripe-fake-restart-'));
		await t.close();
		t = stripeFakeForTests({ dataDir });
		const { session, charge } = await paidDeposit(10_000);
		const customer = await t.stripe.customers.create(
			{ name: 'Kept' },
			{ idempotencyKey: 'keep-1' }
		);
		await t.close();
		expect(existsSync(path.join(dataDir, 'stripe.json'))).toBe(true);
		expect(readdirSync(dataDir).filter((f) => f.endsWith('.tmp'))).toEqual([]);

		const reloaded = createStripeFake({
			dataDir,
			origin: 'http://x',
			webhookUrl: null,
			webhookSecret: 'whsec_x'
		});
		expect(reloaded.store.state.charges[charge.id]?.amount).toBe(10_000);
		t = stripeFakeForTests({ dataDir });
		expect((await t.stripe.checkout.sessions.retrieve(session.id)).status).toBe('complete');
		const again = await t.stripe.customers.create({ name: 'Kept' }, { idempotencyKey: 'keep-1' });
		expect(again.id).toBe(customer.id);
	});

	it('sets an unreadable file aside instead of losing it, and starts empty', () => {
		const dataDir = mkdtempSync(path.join(tmpdir(), 'stripe-fake-broken-'));
		writeFileSync(path.join(dataDir, 'stripe.json'), '{"version":1,"customers":');
		const fake = createStripeFake({
			dataDir,
			origin: 'http://x',
			webhookUrl: null,
			webhookSecret: 'whsec_x'
		});
		expect(fake.store.state.customers).toEqual({});
		const aside = readdirSync(dataDir).find((f) => f.startsWith('stripe.json.unreadable-'));
		expect(aside).toBeDefined();
		expect(readFileSync(path.join(dataDir, aside!), 'utf8')).toBe('{"version":1,"customers":');
	});
});

describe('connected accounts (Stripe-Account)', () => {
	const A = { stripeAccount: 'acct_alphafloors01' };
	const B = { stripeAccount: 'acct_betafloors002' };

	it("keeps each account's objects apart from the others' and the platform's", async () => {
		const mine = await t.stripe.customers.create({ email: 'a@example.com' }, A);
		await t.stripe.customers.create({ email: 'b@example.com' }, B);
		const listed = await t.stripe.customers.list({}, A);
		expect(listed.data.map((c) => c.id)).toEqual([mine.id]);
		expect((await t.stripe.customers.list({})).data).toEqual([]);
		const other = await refusal(t.stripe.customers.retrieve(mine.id, {}, B));
		expect(other.statusCode).toBe(404);
	});

	it('pays, refunds and pays out in the account, with events that name it', async () => {
		const session = await deposit({}, A);
		expect((await t.fake.pay(session.id, 'success')).outcome).toBe('paid');
		const paid = await t.stripe.checkout.sessions.retrieve(
			session.id,
			{ expand: ['payment_intent'] },
			A
		);
		expect(paid.payment_status).toBe('paid');
		expect((await t.stripe.charges.list({}, B)).data).toEqual([]);
		const events = t.fake.events({ type: 'checkout.session.completed' });
		expect(events[0].account).toBe('acct_alphafloors01');
		const payouts = await t.fake.payout(undefined, 'acct_alphafloors01');
		expect(payouts).toHaveLength(1);
		expect((await t.stripe.payouts.list({}, A)).data.map((p) => p.id)).toEqual([payouts[0].id]);
		expect((await t.stripe.payouts.list({}, B)).data).toEqual([]);
	});

	it('refuses an account id that is not one', async () => {
		const e = await refusal(t.stripe.customers.list({}, { stripeAccount: 'not-an-account' }));
		expect(e.statusCode).toBe(403);
	});
});

describe('keys a caller chooses (ids, parameter names, idempotency keys)', () => {
	const prototypeKeys = () => Object.getOwnPropertyNames(Object.prototype).sort();
	let before: string[];
	beforeEach(() => {
		before = prototypeKeys();
	});
	afterEach(() => {
		const added = prototypeKeys().filter((k) => !before.includes(k));
		for (const k of added) delete (Object.prototype as Record<string, unknown>)[k];
		expect(added).toEqual([]);
	});

	/** A raw form POST, as a client other than the SDK could send it. */
	const post = (path: string, body: string) =>
		fetch(`https://api.stripe.com${path}`, {
			method: 'POST',
			headers: {
				authorization: 'Bearer sk_test_local_fake',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body
		});

	it('refuses parameter names that reach a prototype, writing nothing onto it', async () => {
		for (const body of [
			'email=a%40example.example&metadata[__proto__][polluted]=yes',
			'email=a%40example.example&metadata[constructor][prototype][polluted]=yes',
			'constructor[prototype][polluted]=yes'
		]) {
			const answer = await post('/v1/customers', body);
			expect(answer.status, body).toBe(400);
			expect(((await answer.json()) as { error: { message: string } }).error.message).toMatch(
				/^Invalid parameter name/
			);
		}
		expect((await t.stripe.customers.list()).data).toEqual([]);
	});

	it('answers 404 for an id that names a prototype property', async () => {
		for (const id of ['__proto__', 'constructor', 'toString', 'hasOwnProperty']) {
			const missing = await refusal(t.stripe.checkout.sessions.retrieve(id));
			expect(missing, id).toMatchObject({ statusCode: 404, code: 'resource_missing' });
			expect(await refusal(t.stripe.customers.retrieve(id))).toMatchObject({ statusCode: 404 });
		}
		expect(t.fake.checkout('__proto__')).toBeNull();
		expect(t.fake.checkout('constructor')).toBeNull();
	});

	it('keeps any idempotency key as a key, __proto__ and constructor too', async () => {
		for (const key of ['__proto__', 'constructor']) {
			const one = await t.stripe.customers.create(
				{ email: `${key}@example.example` },
				{ idempotencyKey: key }
			);
			const two = await t.stripe.customers.create(
				{ email: `${key}@example.example` },
				{ idempotencyKey: key }
			);
			expect(two.id, key).toBe(one.id);
			expect(two.lastResponse.headers['idempotent-replayed']).toBe('true');
		}
		expect((await t.stripe.customers.list()).data).toHaveLength(2);
	});
});
