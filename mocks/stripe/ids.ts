import { randomBytes } from 'node:crypto';

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

function random(length: number) {
	const bytes = randomBytes(length);
	let out = '';
	for (const b of bytes) out += ALPHABET[b % ALPHABET.length];
	return out;
}

/** The prefixes the fake gives its objects, as Stripe's ids look. */
export const PREFIX = {
	customer: 'cus_',
	session: 'cs_test_',
	paymentIntent: 'pi_',
	paymentMethod: 'pm_',
	charge: 'ch_',
	refund: 're_',
	balanceTransaction: 'txn_',
	payout: 'po_',
	event: 'evt_',
	request: 'req_',
	delivery: 'whdel_',
	lineItem: 'li_',
	price: 'price_',
	product: 'prod_',
	bankAccount: 'ba_'
} as const;

/** A new id such as `cus_Q3x…`; Checkout Session ids are long, as Stripe's are. */
export function newId(prefix: string) {
	return prefix + random(prefix === PREFIX.session ? 58 : 24);
}

/** A secret suffix for client secrets. */
export function secret() {
	return random(24);
}

/** Seconds since the epoch, as Stripe's `created`. */
export function now() {
	return Math.floor(Date.now() / 1000);
}
