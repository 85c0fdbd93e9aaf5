import { log } from '$lib/server/log';
import { handleEvent } from '$lib/server/payments/webhook';
import { UnreadableEvent, verifiedEvent } from '$lib/server/stripe';
import { json } from '@sveltejs/kit';
import Stripe from 'stripe';
import type { RequestHandler } from './$types';

/**
 * Stripe's webhook endpoint. No session guard: Stripe is the caller, and the signature (checked
 * with the endpoint secret, 300 s tolerance either way) is what admits a request. A bad, stale or
 * future-dated signature is 400 and changes nothing. A signed body that is not an event, or an
 * event naming an object no store has, is acknowledged (2xx) and logged: Stripe would only send
 * it again for days.
 */
export const POST: RequestHandler = async ({ request }) => {
	let event: Stripe.Event;
	try {
		event = await verifiedEvent(request);
	} catch (e) {
		if (e instanceof Stripe.errors.StripeSignatureVerificationError) {
			return json({ message: `Webhook signature refused: ${e.message}` }, { status: 400 });
		}
		if (e instanceof UnreadableEvent) {
			log.warn({ reason: e.message }, 'Signed webhook body acknowledged but not read');
			return json({ received: true, outcome: 'unreadable' });
		}
		throw e;
	}
	// Once per event id, in the store its object names. An error of ours (the database down) is a
	// 500, so Stripe delivers the event again and nothing is lost.
	const outcome = await handleEvent(event);
	return json({ received: true, id: event.id, type: event.type, outcome });
};
