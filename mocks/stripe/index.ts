import { existsSync, readdirSync } from 'node:fs';
import type { RequestHandler } from 'msw';
import Stripe from 'stripe';
import { CHECKOUT_CARDS, checkoutView, type CheckoutView } from './checkout';
import { Payments, TEST_CARDS, type PayResult, type TestCardName } from './payments';
import { stripeHandlers } from './routes';
import { newId } from './ids';
import { Store, type Delivery } from './store';
import { signatureHeader, Webhooks, type DeliverOptions } from './webhooks';

export { CHECKOUT_CARDS, TEST_CARDS, signatureHeader };
export type { CheckoutView, Delivery, DeliverOptions, PayResult, TestCardName };
export { formatAmount, isZeroDecimal, MAXIMUM_AMOUNT, processingFee } from './money';

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
	/** The platform account's objects. */
	store: Store;
	/** A connected account's objects (`acct_…`), or the platform's for null. */
	account(id: string | null): Store;
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
	/**
	 * Pays out the available balance (every currency, or one) of every account, or of one
	 * (`null` for the platform's), and waits for its events' delivery.
	 */
	payout(currency?: string, account?: string | null): Promise<Stripe.Payout[]>;
	/** Waits for every delivery in flight. */
	settled(): Promise<void>;
	/** Forgets every object, event and delivery. */
	reset(): void;
}

/** One Stripe account's objects, payments engine and webhook queue. */
interface Account {
	store: Store;
	webhooks: Webhooks;
	payments: Payments;
}

export function createStripeFake(options: StripeFakeOptions): StripeFake {
	const origin = options.origin.replace(/\/$/, '');
	const accounts = new Map<string, Account>();
	let mode: 'auto' | 'hold' = 'auto';

	/**
	 * The platform's own objects (no `Stripe-Account` header) or a connected account's; each is
	 * kept apart, as in Stripe, in its own file, and its events carry its `account`.
	 */
	function account(id: string | null): Account {
		const name = id ?? '';
		let found = accounts.get(name);
		if (!found) {
			const store = new Store(options.dataDir, id);
			const webhooks = new Webhooks(store, {
				url: options.webhookUrl,
				secret: options.webhookSecret,
				apiVersion: Stripe.API_VERSION,
				timeoutMs: options.deliveryTimeoutMs,
				account: id
			});
			webhooks.mode = mode;
			found = { store, webhooks, payments: new Payments(store, webhooks, origin) };
			accounts.set(name, found);
		}
		return found;
	}
	// Accounts saved by an earlier run, so their sessions and events are found again.
	if (options.dataDir && existsSync(options.dataDir)) {
		for (const file of readdirSync(options.dataDir)) {
			const m = /^stripe-(acct_[A-Za-z0-9]+)\.json$/.exec(file);
			if (m) account(m[1]);
		}
	}
	const platform = account(null);
	const all = () => [...accounts.values()];
	/** The account holding an object (ids are unique across accounts). */
	const holding = (id: string) => all().find((a) => a.store.find(id)) ?? platform;
	const settled = async () => {
		await Promise.all(all().map((a) => a.webhooks.settled()));
	};
	const newestFirst = <T extends { created: number }>(lists: T[][]) =>
		lists.flat().sort((a, b) => b.created - a.created);

	return {
		handlers: stripeHandlers(account, Stripe.API_VERSION, {
			// An account the fake has (used, saved by an earlier run, or made through the API).
			has: (id) => accounts.has(id),
			create: () => {
				const id = newId('acct_');
				account(id).store.save();
				return id;
			}
		}),
		store: platform.store,
		account: (id) => account(id).store,
		options,
		checkout(sessionId) {
			const a = holding(sessionId);
			if (a.payments.sweepExpired()) a.store.save();
			return checkoutView(a.store, sessionId);
		},
		async pay(sessionId, card, billing = {}) {
			const a = holding(sessionId);
			const result = a.payments.pay(sessionId, card, {
				email: billing.email || null,
				name: billing.name || null
			});
			a.store.save();
			await settled();
			return result;
		},
		events(filter = {}) {
			return newestFirst(all().map((a) => a.store.newestFirst('events'))).filter(
				(e) => !filter.type || e.type === filter.type
			);
		},
		deliveries: (filter) =>
			all()
				.flatMap((a) => a.webhooks.deliveries(filter))
				.sort((a, b) => b.at - a.at),
		async deliver(ids, deliverOptions) {
			// In the order asked, whichever accounts the events belong to.
			const done: Delivery[] = [];
			for (const id of ids)
				done.push(...(await holding(id).webhooks.deliver([id], deliverOptions)));
			return done;
		},
		async redeliver(eventId, times = 1) {
			return holding(eventId).webhooks.deliver(Array.from({ length: times }, () => eventId));
		},
		setDeliveryMode(next) {
			mode = next;
			for (const a of all()) a.webhooks.mode = next;
		},
		deliveryMode: () => mode,
		async payout(currency, accountId) {
			const targets = accountId === undefined ? all() : [account(accountId)];
			const payouts = targets.flatMap((a) => {
				const made = a.payments.makePayout(currency);
				a.store.save();
				return made;
			});
			await settled();
			return payouts;
		},
		settled,
		reset() {
			for (const a of all()) a.store.reset();
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
