import { signatureHeader } from '$mocks/stripe';
import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { config } from './config';
import { verifiedEvent } from './stripe';

const payload = JSON.stringify(
	{
		id: 'evt_test_1',
		object: 'event',
		type: 'payout.paid',
		created: 1_700_000_000,
		data: { object: { id: 'po_test_1', object: 'payout' } }
	},
	null,
	2
);
const post = (signature: string | null, body = payload) =>
	new Request('http://127.0.0.1/api/webhooks/stripe', {
		method: 'POST',
		body,
		headers: signature ? { 'stripe-signature': signature } : {}
	});

describe('verifiedEvent', () => {
	it('admits an event signed with the endpoint secret', async () => {
		const event = await verifiedEvent(post(signatureHeader(payload, config.stripeWebhookSecret)));
		expect(event).toMatchObject({ id: 'evt_test_1', type: 'payout.paid' });
	});

	it('refuses a wrong secret, a changed body, a stale timestamp and no signature', async () => {
		const stale = Math.floor(Date.now() / 1000) - 301;
		const refused = [
			post(signatureHeader(payload, 'whsec_someone_else')),
			post(
				signatureHeader(payload, config.stripeWebhookSecret),
				payload.replace('payout', 'charge')
			),
			post(signatureHeader(payload, config.stripeWebhookSecret, stale)),
			post(null)
		];
		for (const request of refused) {
			await expect(verifiedEvent(request)).rejects.toBeInstanceOf(
				Stripe.errors.StripeSignatureVerificationError
			);
		}
	});
});
