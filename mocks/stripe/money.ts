import { invalid } from './errors';

/**
 * Currencies whose amounts are whole units (no minor unit): Stripe's published list of
 * zero-decimal currencies (https://docs.stripe.com/currencies#zero-decimal).
 */
export const ZERO_DECIMAL = new Set([
	'bif',
	'clp',
	'djf',
	'gnf',
	'jpy',
	'kmf',
	'krw',
	'mga',
	'pyg',
	'rwf',
	'ugx',
	'vnd',
	'vuv',
	'xaf',
	'xof',
	'xpf'
]);

/** Two-decimal currencies the fake accepts (a subset of Stripe's presentment currencies). */
const TWO_DECIMAL = [
	'usd',
	'cad',
	'eur',
	'gbp',
	'aud',
	'nzd',
	'chf',
	'sek',
	'nok',
	'dkk',
	'pln',
	'czk',
	'mxn',
	'sgd',
	'hkd'
];

export const CURRENCIES = new Set([...TWO_DECIMAL, ...ZERO_DECIMAL]);

/**
 * Smallest charge, in the smallest unit, for the currencies Stripe documents it for
 * (https://docs.stripe.com/currencies#minimum-and-maximum-charge-amounts: $0.50, £0.30, ¥50…).
 * Currencies not listed here accept any positive amount in the fake.
 */
const MINIMUM: Record<string, number> = {
	usd: 50,
	cad: 50,
	aud: 50,
	nzd: 50,
	eur: 50,
	chf: 50,
	sgd: 50,
	gbp: 30,
	jpy: 50
};

/** Stripe's amounts have at most eight digits (99,999,999 in the smallest unit). */
export const MAXIMUM_AMOUNT = 99_999_999;

export function isZeroDecimal(currency: string) {
	return ZERO_DECIMAL.has(currency.toLowerCase());
}

/** A currency parameter, lower case as Stripe wants it, or a 400 naming the parameter. */
export function readCurrency(value: unknown, param: string): string {
	if (typeof value !== 'string' || !value)
		throw invalid(`Missing required param: ${param}.`, param, 'parameter_missing');
	const currency = value.toLowerCase();
	if (!CURRENCIES.has(currency)) {
		throw invalid(
			`Invalid currency: ${value}. The local fake supports: ${[...CURRENCIES].join(', ')}.`,
			param,
			'invalid_currency'
		);
	}
	return currency;
}

/** Refuses a total below the currency's minimum charge or above the eight-digit maximum. */
export function checkChargeAmount(amount: number, currency: string, param: string) {
	const minimum = MINIMUM[currency] ?? 1;
	if (amount < minimum) {
		throw invalid(
			`Amount must be at least ${formatAmount(minimum, currency)} ${currency}`,
			param,
			'amount_too_small'
		);
	}
	if (amount > MAXIMUM_AMOUNT) {
		throw invalid(
			`Amount must be no more than ${formatAmount(MAXIMUM_AMOUNT, currency)} ${currency}`,
			param,
			'amount_too_large'
		);
	}
}

/** An amount in the smallest unit, written for people: `$1,234.50`, `¥1,000`. */
export function formatAmount(amount: number, currency: string) {
	const digits = isZeroDecimal(currency) ? 0 : 2;
	return new Intl.NumberFormat('en-US', {
		style: 'currency',
		currency: currency.toUpperCase(),
		minimumFractionDigits: digits,
		maximumFractionDigits: digits
	}).format(amount / 10 ** digits);
}

/**
 * The fake's own processing fee: 2.9% of the amount, rounded half up to a whole smallest unit,
 * plus a fixed 30 of the smallest unit (30¢, 30p, ¥30). This is the fake's own rule so that
 * fees are never zero and never fractional; it is not a statement of any real pricing.
 */
export function processingFee(amount: number) {
	// Integer maths: (amount × 29 + 500) ÷ 1000, floored, is 2.9% rounded half up.
	return Math.floor((amount * 29 + 500) / 1000) + 30;
}
