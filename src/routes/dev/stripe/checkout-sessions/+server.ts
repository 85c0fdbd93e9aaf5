import { endpoint, readJson } from '$lib/server/api';
import { config } from '$lib/server/config';
import { safeRedirect } from '$lib/redirect';
import { stripe } from '$lib/server/stripe';
import { testSessionSchema } from '$lib/schemas/test-payments';
import { json } from '@sveltejs/kit';
import Stripe from 'stripe';
import { requireStripeFake } from '../fake.server';
import type { RequestHandler } from './$types';

/**
 * Starts a test Checkout Session through the SDK (so the request goes the way the payment pages'
 * will), for browser tests and testers. Answers `{ id, url }`, or Stripe's refusal as 400.
 */
export const POST: RequestHandler = endpoint(async ({ request }) => {
	requireStripeFake();
	const body = await readJson(request, testSessionSchema);
	// The fake's checkout page sends the payer back only to this site.
	for (const key of ['success_url', 'cancel_url'] as const) {
		const url = body[key];
		if (url && !safeRedirect(url.replace('{CHECKOUT_SESSION_ID}', 'x'), '', config.origin)) {
			return json(
				{
					message: 'Return addresses must be on this site',
					issues: [{ path: key, message: `Use an address on ${config.origin}` }]
				},
				{ status: 400 }
			);
		}
	}
	try {
		const session = await stripe.checkout.sessions.create(
			{
				mode: 'payment',
				line_items: [
					{
						price_data: {
							currency: body.currency,
							unit_amount: body.amount,
							product_data: { name: body.name }
						},
						quantity: 1
					}
				],
				customer_email: body.customer_email,
				success_url: body.success_url ?? `${config.origin}/dev/stripe?paid={CHECKOUT_SESSION_ID}`,
				cancel_url: body.cancel_url ?? `${config.origin}/dev/stripe`,
				metadata: body.metadata
			},
			body.account ? { stripeAccount: body.account } : undefined
		);
		return json({ id: session.id, url: session.url });
	} catch (e) {
		if (e instanceof Stripe.errors.StripeInvalidRequestError) {
			return json(
				{ message: e.message, issues: [{ path: e.param ?? '(body)', message: e.message }] },
				{ status: 400 }
			);
		}
		throw e;
	}
});
