import type { RequestHandler } from 'msw';
import Stripe from 'stripe';
import { CHECKOUT_CARDS, checkoutView, type CheckoutView } from './checkout';
import { Payments, TEST_CARDS, type PayResult, type TestCardName } from './payments';
import { stripeHandlers } from './routes';
import { Store, type Delivery } from './store';
import { signatureHeader, Webhooks, type DeliverOptions } from './webhooks';

export { CHECKOUT_CARDS, TEST_CARDS, signatureHeader };
export type { CheckoutView, Delivery, DeliverOptions, PayResult, TestCardName };
export { formatAmount, isZeroDecimal, processingFee } from './money';

export interface StripeFakeOptions {
	/** Where `stripe.json` is kept; null keeps everything in memory (tests). */
	dataDir: string | null;
	/** The app's origin: Checkout Session `url`s point to `<origin>/dev/checkout/<id>`. */
	origin: string;
	/** The app's webhook endpoint; null records events without delivering them. */
	webhookUrl: string | null;
	/** The endpoint's signing secret. */
	webhookSecret: string;
	/** Per delivery; 10 s by default. */
	deliveryTimeoutMs?: number;
}

/**
 * A local Stripe: msw handlers for the SDK, the hosted checkout page's actions, and the controls
 * tests and testers use (deliver events again, late, out of order; pay out the balance).
 */
export interface StripeFake {
	handlers: RequestHandler[];
	store: Store;
	options: StripeFakeOptions;
	/** The hosted page's view of a session (expiring it first when its time has passed), or null. */
	checkout(sessionId: string): CheckoutView | null;
	/** Pays a session with a test card and waits until its events are delivered. */
	pay(
		sessionId: string,
		card: TestCardName,
		billing?: { email?: string | null; name?: string | null }
	): Promise<PayResult>;
	/** Events, newest first. */
	events(filter?: { type?: string }): Stripe.Event[];
	/** Delivery attempts, newest first. */
	deliveries(filter?: { event?: string; type?: string }): Delivery[];
	/** Delivers these events now, in this order, signed normally, late (`lateBy` seconds) or wrongly. */
	deliver(eventIds: string[], options?: DeliverOptions): Promise<Delivery[]>;
	/** Delivers one event again, `times` times (Stripe may deliver an event more than once). */
	redeliver(eventId: string, times?: number): Promise<Delivery[]>;
	/** `hold` keeps new events undelivered (to deliver them later in a chosen order); `auto` is Stripe's way. */
	setDeliveryMode(mode: 'auto' | 'hold'): void;
	deliveryMode(): 'auto' | 'hold';
	/** Pays out the available balance (every currency, or one) and waits for its events' delivery. */
	payout(currency?: string): Promise<Stripe.Payout[]>;
	/** Waits for every delivery in flight. */
	settled(): Promise<void>;
	/** Forgets every object, event and delivery. */
	reset(): void;
}

export function createStripeFake(options: StripeFakeOptions): StripeFake {
	const store = new Store(options.dataDir);
	const webhooks = new Webhooks(store, {
		url: options.webhookUrl,
		secret: options.webhookSecret,
		apiVersion: Stripe.API_VERSION,
		timeoutMs: options.deliveryTimeoutMs
	});
	const payments = new Payments(store, webhooks, options.origin.replace(/\/$/, ''));
	const sweep = () => {
		if (payments.sweepExpired()) store.save();
	};

	return {
		handlers: stripeHandlers(store, payments, Stripe.API_VERSION),
		store,
		options,
		checkout(sessionId) {
			sweep();
			return checkoutView(store, sessionId);
		},
		async pay(sessionId, card, billing = {}) {
			const result = payments.pay(sessionId, card, {
				email: billing.email || null,
				name: billing.name || null
			});
			store.save();
			await webhooks.settled();
			return result;
		},
		events(filter = {}) {
			return store.newestFirst('events').filter((e) => !filter.type || e.type === filter.type);
		},
		deliveries: (filter) => webhooks.deliveries(filter),
		deliver: (ids, deliverOptions) => webhooks.deliver(ids, deliverOptions),
		async redeliver(eventId, times = 1) {
			return webhooks.deliver(Array.from({ length: times }, () => eventId));
		},
		setDeliveryMode(mode) {
			webhooks.mode = mode;
		},
		deliveryMode: () => webhooks.mode,
		async payout(currency) {
			const payouts = payments.makePayout(currency);
			store.save();
			await webhooks.settled();
			return payouts;
		},
		settled: () => webhooks.settled(),
		reset() {
			store.reset();
		}
	};
}

const key = Symbol.for('flushline.stripe-fake');
type WithFake = typeof globalThis & { [key]?: StripeFake };

/** The fake the server started (see mocks/node.ts), or null while a real Stripe key is set. */
export function currentStripeFake(): StripeFake | null {
	return (globalThis as WithFake)[key] ?? null;
}

export function setCurrentStripeFake(fake: StripeFake | null) {
	(globalThis as WithFake)[key] = fake ?? undefined;
}
