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

/** The `t=` of a `Stripe-Signature` header (seconds), or null when it has none. */
function signedAt(header: string): number | null {
	const t = /(?:^|,)\s*t=(\d{1,12})(?:,|$)/.exec(header);
	return t ? Number(t[1]) : null;
}

/** A body with a valid signature that is not an event: acknowledged (Stripe made it), never acted on. */
export class UnreadableEvent extends Error {}

/**
 * The event a webhook request carries, after checking its `Stripe-Signature` against the raw body
 * with the endpoint secret. Throws `Stripe.errors.StripeSignatureVerificationError` for a bad,
 * missing or stale signature, and for one dated more than the tolerance in the future (the SDK
 * checks only the past); throws `UnreadableEvent` for a correctly signed body that is not an event.
 */
export async function verifiedEvent(request: Request, now = Date.now()): Promise<Stripe.Event> {
	// The raw bytes: parsing and re-serializing the JSON would change what was signed.
	const payload = Buffer.from(await request.arrayBuffer());
	const header = request.headers.get('stripe-signature') ?? '';
	const at = signedAt(header);
	if (at !== null && at - Math.floor(now / 1000) > WEBHOOK_TOLERANCE_SECONDS) {
		throw new Stripe.errors.StripeSignatureVerificationError(header, payload.toString('utf8'), {
			message: 'Timestamp is dated beyond the tolerance in the future'
		});
	}
	// The signature first (throws when it does not match), then the body.
	stripe.webhooks.signature!.verifyHeader(
		payload,
		header,
		config.stripeWebhookSecret,
		WEBHOOK_TOLERANCE_SECONDS,
		undefined,
		now
	);
	let event: unknown;
	try {
		event = JSON.parse(payload.toString('utf8'));
	} catch {
		throw new UnreadableEvent('The signed body is not JSON');
	}
	const e = event as Partial<Stripe.Event> | null;
	if (
		!e ||
		typeof e !== 'object' ||
		typeof e.id !== 'string' ||
		typeof e.type !== 'string' ||
		typeof e.created !== 'number' ||
		(e.account !== undefined && e.account !== null && typeof e.account !== 'string') ||
		!e.data ||
		typeof e.data.object !== 'object' ||
		e.data.object === null ||
		typeof (e.data.object as { id?: unknown }).id !== 'string' ||
		typeof (e.data.object as { object?: unknown }).object !== 'string'
	) {
		throw new UnreadableEvent('The signed body is not a Stripe event');
	}
	return e as Stripe.Event;
}

/** The id of a Stripe field that is an id or, when expanded, the object itself. */
export function idOf(value: string | { id: string } | null | undefined): string | null {
	return typeof value === 'string' ? value : (value?.id ?? null);
}
