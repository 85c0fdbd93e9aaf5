import { config } from '$lib/server/config';
import { currentStripeFake, type StripeFake } from '$mocks/stripe';
import { error } from '@sveltejs/kit';

/**
 * The running Stripe fake. The fake's pages and controls exist only while it is on: with a real
 * STRIPE_SECRET_KEY every /dev/stripe and /dev/checkout address is 404.
 */
export function requireStripeFake(): StripeFake {
	const fake = config.fakeStripe ? currentStripeFake() : null;
	if (!fake) error(404, 'Not found');
	return fake;
}
