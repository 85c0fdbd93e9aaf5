import { handleEvent } from '$lib/server/payments/webhook';
import { verifiedEvent } from '$lib/server/stripe';
import { json } from '@sveltejs/kit';
import Stripe from 'stripe';
import type { RequestHandler } from './$types';

/**
 * Stripe's webhook endpoint. No session guard: Stripe is the caller, and the signature (checked
 * with the endpoint secret, 300 s tolerance) is what admits a request. A bad or stale signature
 * is 400 and changes nothing.
 */
export const POST: RequestHandler = async ({ request }) => {
	let event: Stripe.Event;
	try {
		event = await verifiedEvent(request);
	} catch (e) {
		if (e instanceof Stripe.errors.StripeSignatureVerificationError) {
			return json({ message: `Webhook signature refused: ${e.message}` }, { status: 400 });
		}
		throw e;
	}
	// Once per event id, in the store its object names; an error here is a 500, so Stripe
	// delivers the event again and nothing is lost.
	const outcome = await handleEvent(event);
	return json({ received: true, id: event.id, type: event.type, outcome });
};
