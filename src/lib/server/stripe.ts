import Stripe from 'stripe';
import { config } from './config';

/** The key the SDK sends while the local fake answers (it takes any `sk_test_` key). */
const FAKE_KEY = 'sk_test_local_fake';

/**
 * A Stripe SDK client. The SDK talks to api.stripe.com as always; while no real key is set the
 * local fake (mocks/stripe) answers it. Tests pass `maxNetworkRetries: 0` so a refusal shows at once.
 */
export function createStripe(options: { maxNetworkRetries?: number } = {}) {
	return new Stripe(config.stripeSecretKey || FAKE_KEY, {
		maxNetworkRetries: options.maxNetworkRetries ?? 2,
		timeout: 20_000,
		appInfo: { name: 'Flushline' }
	});
}

/** The app's Stripe client. */
export const stripe = createStripe();

/** Stripe's default: a signature more than five minutes old is refused (replay protection). */
export const WEBHOOK_TOLERANCE_SECONDS = 300;

/**
 * The event a webhook request carries, after checking its `Stripe-Signature` against the raw
 * body with the endpoint secret; throws `Stripe.errors.StripeSignatureVerificationError` for a
 * bad, missing or stale signature.
 */
export async function verifiedEvent(request: Request): Promise<Stripe.Event> {
	// The raw bytes: parsing and re-serializing the JSON would change what was signed.
	const payload = Buffer.from(await request.arrayBuffer());
	return stripe.webhooks.constructEvent(
		payload,
		request.headers.get('stripe-signature') ?? '',
		config.stripeWebhookSecret,
		WEBHOOK_TOLERANCE_SECONDS
	);
}

/** The id of a Stripe field that is an id or, when expanded, the object itself. */
export function idOf(value: string | { id: string } | null | undefined): string | null {
	return typeof value === 'string' ? value : (value?.id ?? null);
}
