import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type Stripe from 'stripe';
import { missing } from './errors';

/** One attempt to POST an event to the webhook endpoint. */
export interface Delivery {
	id: string;
	event: string;
	type: string;
	url: string;
	/** Unix seconds of the attempt. */
	at: number;
	/** The `t=` the signature carried (older than `at` for a late delivery). */
	signedAt: number;
	/** How the delivery was made: as Stripe would, again on request, late, or with a wrong signature. */
	kind: 'automatic' | 'redelivery' | 'late' | 'bad_signature';
	/** The endpoint's HTTP status, or null when it could not be reached. */
	status: number | null;
	ok: boolean;
	error: string | null;
	/** The first part of the endpoint's answer, for the record. */
	response: string;
}

export interface IdempotencyEntry {
	method: string;
	path: string;
	params: string;
	status: number;
	body: string;
	created: number;
}

/** Everything the fake keeps, as it is written to `<dataDir>/stripe.json`. */
export interface FakeState {
	version: 1;
	customers: Record<string, Stripe.Customer>;
	checkoutSessions: Record<string, Stripe.Checkout.Session>;
	/** A session's line items (Stripe returns them only when expanded or listed). */
	lineItems: Record<string, Stripe.LineItem[]>;
	/** A session's `payment_intent_data`, used when its PaymentIntent is made (Stripe does not show it). */
	intentData: Record<
		string,
		{ metadata: Record<string, string>; description: string | null; receiptEmail: string | null }
	>;
	paymentIntents: Record<string, Stripe.PaymentIntent>;
	charges: Record<string, Stripe.Charge>;
	refunds: Record<string, Stripe.Refund>;
	balanceTransactions: Record<string, Stripe.BalanceTransaction>;
	/** Which payout took each balance transaction (Stripe's `payout` list filter). */
	paidOutBy: Record<string, string>;
	payouts: Record<string, Stripe.Payout>;
	events: Record<string, Stripe.Event>;
	deliveries: Delivery[];
	idempotency: Record<string, IdempotencyEntry>;
}

export type Collection =
	| 'customers'
	| 'checkoutSessions'
	| 'paymentIntents'
	| 'charges'
	| 'refunds'
	| 'balanceTransactions'
	| 'payouts'
	| 'events';

/** Which collection an id's prefix belongs to, and the word Stripe uses in "No such …". */
const BY_PREFIX: [string, Collection, string][] = [
	['cus_', 'customers', 'customer'],
	['cs_', 'checkoutSessions', 'checkout.session'],
	['pi_', 'paymentIntents', 'payment_intent'],
	['ch_', 'charges', 'charge'],
	['re_', 'refunds', 'refund'],
	['txn_', 'balanceTransactions', 'balance transaction'],
	['po_', 'payouts', 'payout'],
	['evt_', 'events', 'event']
];

/**
 * A map keyed by ids, some of them chosen by callers (an id in an address, an idempotency key):
 * with no prototype, `__proto__` or `constructor` is an ordinary missing key, never a way into
 * `Object.prototype`.
 */
function dict<T>(entries: Record<string, T> = {}): Record<string, T> {
	return Object.assign(Object.create(null) as Record<string, T>, entries);
}

const MAPS = [
	'customers',
	'checkoutSessions',
	'lineItems',
	'intentData',
	'paymentIntents',
	'charges',
	'refunds',
	'balanceTransactions',
	'paidOutBy',
	'payouts',
	'events',
	'idempotency'
] as const;

export function emptyState(): FakeState {
	return {
		version: 1,
		customers: dict(),
		checkoutSessions: dict(),
		lineItems: dict(),
		intentData: dict(),
		paymentIntents: dict(),
		charges: dict(),
		refunds: dict(),
		balanceTransactions: dict(),
		paidOutBy: dict(),
		payouts: dict(),
		events: dict(),
		deliveries: [],
		idempotency: dict()
	};
}

/**
 * The fake's objects in memory, written to one JSON file after each change (to a temporary file,
 * then renamed over the old one, so a crash never leaves half a file). Without a data folder it
 * keeps them in memory only.
 */
export class Store {
	state: FakeState;
	readonly file: string | null;

	/** `account`: a connected account's objects are kept apart, in their own file. */
	constructor(
		dataDir?: string | null,
		readonly account: string | null = null
	) {
		this.file = dataDir
			? path.join(dataDir, account ? `stripe-${account}.json` : 'stripe.json')
			: null;
		this.state = this.load();
	}

	private load(): FakeState {
		if (!this.file || !existsSync(this.file)) return emptyState();
		try {
			const read = JSON.parse(readFileSync(this.file, 'utf8')) as FakeState;
			if (read.version !== 1) throw new Error(`unknown version ${String(read.version)}`);
			const state = { ...emptyState(), ...read };
			const maps = state as unknown as Record<string, Record<string, unknown>>;
			for (const map of MAPS) maps[map] = dict(maps[map] ?? {});
			return state;
		} catch (e) {
			// Keep the unreadable file for a person to look at, and start afresh.
			const aside = `${this.file}.unreadable-${Date.now()}`;
			renameSync(this.file, aside);
			console.warn(
				`The Stripe fake could not read ${this.file} (${(e as Error).message}); moved it to ${aside}`
			);
			return emptyState();
		}
	}

	/** Writes the state out; call after every change. */
	save() {
		if (!this.file) return;
		mkdirSync(path.dirname(this.file), { recursive: true });
		const temporary = `${this.file}.${process.pid}.tmp`;
		writeFileSync(temporary, JSON.stringify(this.state));
		renameSync(temporary, this.file);
	}

	/** Forgets everything (tests), and writes the empty state. */
	reset() {
		this.state = emptyState();
		this.save();
	}

	/** The object with an id of any kind the fake keeps, or undefined. */
	find(id: string): { id: string; object: string } | undefined {
		const entry = BY_PREFIX.find(([prefix]) => id.startsWith(prefix));
		if (!entry) return undefined;
		return (this.state[entry[1]] as Record<string, { id: string; object: string }>)[id];
	}

	/** The object with this id in a collection, or Stripe's 404. */
	get<C extends Collection>(collection: C, id: string): FakeState[C][string] {
		const found = (this.state[collection] as Record<string, FakeState[C][string]>)[id];
		if (!found) {
			const word = BY_PREFIX.find(([, c]) => c === collection)![2];
			throw missing(word, id);
		}
		return found;
	}

	/** A collection's objects, newest first (Stripe's list order). */
	newestFirst<C extends Collection>(collection: C): FakeState[C][string][] {
		return (Object.values(this.state[collection]) as FakeState[C][string][]).reverse();
	}
}
