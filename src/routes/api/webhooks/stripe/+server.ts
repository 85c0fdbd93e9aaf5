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
	// Here the webhook ledger (issue 5) will record the event: once per event.id (Stripe delivers
	// at least once and in no set order), in the store found from the object's metadata.store_id,
	// before answering 200. Until it exists, a verified event is acknowledged and nothing is stored.
	return json({ received: true, id: event.id, type: event.type });
};
