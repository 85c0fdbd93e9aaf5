import Stripe from 'stripe';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { signatureHeader } from './index';
import { stripeFakeForTests, TEST_WEBHOOK_SECRET, webhookEndpoint } from './testing';

let endpoint: Awaited<ReturnType<typeof webhookEndpoint>>;
let t: ReturnType<typeof stripeFakeForTests>;

beforeEach(async () => {
	endpoint = await webhookEndpoint();
	t = stripeFakeForTests({ webhookUrl: endpoint.url });
});
afterEach(async () => {
	await t.close();
	await endpoint.close();
});

const sdk = new Stripe('sk_test_local_fake', { maxNetworkRetries: 0 });

function session(currency = 'usd', amount = 40_000) {
	return t.stripe.checkout.sessions.create({
		mode: 'payment',
		line_items: [
			{
				price_data: { currency, unit_amount: amount, product_data: { name: 'Deposit' } },
				quantity: 1
			}
		],
		success_url: 'http://127.0.0.1:4173/paid',
		metadata: { store_id: 'org_1', purpose: 'deposit' }
	});
}

describe('signatures', () => {
	it('signs exactly as the SDK’s own test header does', () => {
		const payload = JSON.stringify({ id: 'evt_1', object: 'event' }, null, 2);
		const timestamp = 1_760_000_000;
		expect(signatureHeader(payload, TEST_WEBHOOK_SECRET, timestamp)).toBe(
			sdk.webhooks.generateTestHeaderString({ payload, secret: TEST_WEBHOOK_SECRET, timestamp })
		);
		const header = signatureHeader(payload, TEST_WEBHOOK_SECRET);
		expect(sdk.webhooks.constructEvent(payload, header, TEST_WEBHOOK_SECRET).id).toBe('evt_1');
		expect(() =>
			sdk.webhooks.constructEvent(
				payload,
				signatureHeader(payload, TEST_WEBHOOK_SECRET, timestamp),
				TEST_WEBHOOK_SECRET,
				300
			)
		).toThrow(/tolerance/);
		expect(() => sdk.webhooks.constructEvent(`${payload} `, header, TEST_WEBHOOK_SECRET)).toThrow(
			Stripe.errors.StripeSignatureVerificationError
		);
	});
});

describe('delivery', () => {
	it('delivers a paid session’s events, signed, that the SDK verifies', async () => {
		const s = await session();
		await t.fake.pay(s.id, 'success', { email: 'ada.quill@example.example', name: 'Ada Quill' });
		expect(endpoint.received.map((r) => [r.event?.type, r.status])).toEqual([
			['payment_intent.created', 200],
			['charge.succeeded', 200],
			['payment_intent.succeeded', 200],
			['checkout.session.completed', 200]
		]);
		const completed = endpoint.received[3].event as Stripe.CheckoutSessionCompletedEvent;
		expect(completed).toMatchObject({
			object: 'event',
			livemode: false,
			api_version: Stripe.API_VERSION,
			pending_webhooks: 1,
			request: { id: null, idempotency_key: null }
		});
		expect(completed.id).toMatch(/^evt_/);
		expect(completed.data.object).toMatchObject({
			id: s.id,
			status: 'complete',
			payment_status: 'paid',
			metadata: { store_id: 'org_1', purpose: 'deposit' },
			customer_details: { email: 'ada.quill@example.example', name: 'Ada Quill' }
		});
		expect(
			t.fake.deliveries().every((d) => d.ok && d.status === 200 && d.kind === 'automatic')
		).toBe(true);
		expect(t.fake.events({ type: 'checkout.session.completed' })[0].pending_webhooks).toBe(0);
		const listed = await t.stripe.events.list({ type: 'checkout.session.completed' });
		expect(listed.data.map((e) => e.id)).toEqual([completed.id]);
	});

	it('delivers a decline as charge.failed and payment_intent.payment_failed', async () => {
		const s = await session();
		await t.fake.pay(s.id, 'decline');
		expect(endpoint.received.map((r) => r.event?.type)).toEqual([
			'payment_intent.created',
			'charge.failed',
			'payment_intent.payment_failed'
		]);
		const failed = endpoint.received[2].event as Stripe.PaymentIntentPaymentFailedEvent;
		expect(failed.data.object.last_payment_error?.decline_code).toBe('generic_decline');
	});

	it('delivers refund.created and charge.refunded with the previous amounts, tied to the API request', async () => {
		const s = await session('usd', 10_000);
		const paid = await t.fake.pay(s.id, 'success');
		const intent = await t.stripe.paymentIntents.retrieve(String(paid.session.payment_intent));
		const refund = await t.stripe.refunds.create(
			{ charge: String(intent.latest_charge), amount: 4_000 },
			{ idempotencyKey: 'refund-for-test' }
		);
		await t.fake.settled();
		const refunded = endpoint.received.find((r) => r.event?.type === 'charge.refunded')!
			.event as Stripe.ChargeRefundedEvent;
		expect(refunded.data.object).toMatchObject({ amount_refunded: 4_000, refunded: false });
		expect(refunded.data.previous_attributes).toEqual({ amount_refunded: 0, refunded: false });
		expect(refunded.request).toMatchObject({ idempotency_key: 'refund-for-test' });
		expect(refunded.request?.id).toMatch(/^req_/);
		const created = endpoint.received.find((r) => r.event?.type === 'refund.created')!
			.event as Stripe.RefundCreatedEvent;
		expect(created.data.object.id).toBe(refund.id);
		await t.stripe.refunds.update(refund.id, { metadata: { reason_note: 'one box returned' } });
		await t.fake.settled();
		expect(endpoint.received.at(-1)?.event?.type).toBe('refund.updated');
	});

	it('delivers payout.created and payout.paid', async () => {
		const s = await session();
		await t.fake.pay(s.id, 'success');
		const [payout] = await t.fake.payout();
		const types = endpoint.received
			.slice(-2)
			.map((r) => [r.event?.type, (r.event?.data.object as { id: string }).id]);
		expect(types).toEqual([
			['payout.created', payout.id],
			['payout.paid', payout.id]
		]);
	});
});

describe('controls for tests', () => {
	it('redelivers an event twice with the same id', async () => {
		const s = await session();
		await t.fake.pay(s.id, 'success');
		const [completed] = t.fake.events({ type: 'checkout.session.completed' });
		const again = await t.fake.redeliver(completed.id, 2);
		expect(again.map((d) => [d.kind, d.status])).toEqual([
			['redelivery', 200],
			['redelivery', 200]
		]);
		const ids = endpoint.received
			.filter((r) => r.event?.type === 'checkout.session.completed')
			.map((r) => r.event?.id);
		expect(ids).toEqual([completed.id, completed.id, completed.id]);
	});

	it('delivers late: a signature older than 300 s is refused with 400', async () => {
		const s = await session();
		await t.fake.pay(s.id, 'success');
		const [completed] = t.fake.events({ type: 'checkout.session.completed' });
		const [late] = await t.fake.deliver([completed.id], { lateBy: 301 });
		expect(late).toMatchObject({ kind: 'late', status: 400, ok: false });
		expect(late.at - late.signedAt).toBe(301);
		expect(endpoint.received.at(-1)?.error).toMatch(/tolerance/);
		const [inTime] = await t.fake.deliver([completed.id], { lateBy: 200 });
		expect(inTime.status).toBe(200);
	});

	it('delivers with a wrong signature: refused with 400', async () => {
		const s = await session();
		await t.fake.pay(s.id, 'success');
		const [completed] = t.fake.events({ type: 'checkout.session.completed' });
		const [bad] = await t.fake.deliver([completed.id], { badSignature: true });
		expect(bad).toMatchObject({ kind: 'bad_signature', status: 400, ok: false });
		expect(endpoint.received.at(-1)?.error).toMatch(/No signatures found matching/);
	});

	it('holds events, then delivers them in the order a test chooses (out of order)', async () => {
		t.fake.setDeliveryMode('hold');
		const s = await session();
		await t.fake.pay(s.id, 'success');
		expect(endpoint.received).toHaveLength(0);
		const held = t.fake.events().map((e) => e.id); // newest first
		await t.fake.deliver(held);
		expect(endpoint.received.map((r) => r.event?.type)).toEqual([
			'checkout.session.completed',
			'payment_intent.succeeded',
			'charge.succeeded',
			'payment_intent.created'
		]);
		t.fake.setDeliveryMode('auto');
	});

	it('keeps failed deliveries with their status, for delivering again', async () => {
		endpoint.failWith(500);
		const s = await session();
		await t.fake.pay(s.id, 'success');
		const failed = t.fake.deliveries({ type: 'checkout.session.completed' });
		expect(failed).toHaveLength(1);
		expect(failed[0]).toMatchObject({ status: 500, ok: false });
		const event = t.fake.events({ type: 'checkout.session.completed' })[0];
		expect(event.pending_webhooks).toBe(1);
		endpoint.failWith(null);
		const [retry] = await t.fake.redeliver(event.id);
		expect(retry.ok).toBe(true);
		expect(t.fake.events({ type: 'checkout.session.completed' })[0].pending_webhooks).toBe(0);
	});

	it('records an unreachable endpoint as a failed delivery without a status', async () => {
		await t.close();
		await endpoint.close();
		endpoint = await webhookEndpoint();
		t = stripeFakeForTests({
			webhookUrl: 'http://127.0.0.1:9/api/webhooks/stripe',
			deliveryTimeoutMs: 2_000
		});
		const s = await session();
		await t.fake.pay(s.id, 'success');
		const [last] = t.fake.deliveries();
		expect(last).toMatchObject({ status: null, ok: false });
		expect(last.error).toBeTruthy();
	});
});
