/**
 * Money and percentages as people type them, by the number rule of `./number`. Amounts are
 * integers in the currency's smallest unit (cents, or whole yen: Stripe's zero-decimal
 * currencies have none), so a typed amount may carry as many decimals as its currency has and
 * no more. Browser-safe.
 */
import { formatMoney, minorDigits } from '$lib/format';
import { capital, readDecimal, shown, tooLong, withoutUnit, type Read } from './number';

/** The most one typed amount may be by default: 100,000,000 in the smallest unit ($1,000,000.00). */
export const MAX_MINOR = 100_000_000;

const DIGIT_WORDS = ['no', 'one', 'two', 'three', 'four'];

/** How many decimals a currency's amounts have (USD 2, JPY 0). */
export const currencyDigits = minorDigits;

const symbols = new Map<string, string[]>();

/** The symbols an amount in this currency may start with: `$` for USD, `¥` for JPY, `CA$` or `$` for CAD. */
export function currencySymbols(currency: string): string[] {
	let found = symbols.get(currency);
	if (!found) {
		const of = (display: 'symbol' | 'narrowSymbol') =>
			new Intl.NumberFormat('en-US', { style: 'currency', currency, currencyDisplay: display })
				.formatToParts(0)
				.find((p) => p.type === 'currency')?.value ?? currency;
		found = [...new Set([of('symbol'), of('narrowSymbol'), currency.toUpperCase()])];
		symbols.set(currency, found);
	}
	return found;
}

/** The symbol a money field's label shows: `$`, `¥`, `€`. */
export function currencySymbol(currency: string): string {
	return currencySymbols(currency)[0];
}

/** A typical amount written as the field takes it: `12.50` for USD, `1250` for JPY. */
export function moneyExample(currency: string): string {
	const digits = currencyDigits(currency);
	return digits === 0 ? '1250' : `12.${'50'.padEnd(digits, '0')}`;
}

export interface MoneyOptions {
	/** The field in messages, with its article: "the material price". */
	label: string;
	/** Smallest allowed, in the smallest unit (default 0). */
	min?: number;
	/** Largest allowed, in the smallest unit (default `MAX_MINOR`). */
	max?: number;
}

/**
 * An amount typed in the currency's main unit (`12.50`, `$1,250`, `.5`; `¥1,500` or `1500` for
 * JPY) into an integer in its smallest unit. Never negative unless `min` is; at most as many
 * decimals as the currency has (trailing zeros beyond them are fine: `1500.00` yen).
 */
export function readMoney(typed: string, currency: string, options: MoneyOptions): Read<number> {
	const { label, min = 0, max = MAX_MINOR } = options;
	const example = moneyExample(currency);
	const long = tooLong(typed);
	if (long) return long;
	let text = typed.trim();
	if (!text) return { ok: false, message: `Enter ${label}, e.g. ${example}` };
	const sign = /^[-−]/.test(text) ? '-' : '';
	text = text.replace(/^[-−]\s*/, '');
	for (const symbol of [...currencySymbols(currency)].sort((a, b) => b.length - a.length)) {
		if (text.toUpperCase().startsWith(symbol.toUpperCase())) {
			text = text.slice(symbol.length).trim();
			break;
		}
	}
	text = withoutUnit(text, [currency]);
	const d = readDecimal(sign + text);
	if (!d.ok) {
		const why = d.message.replace(/^Cannot read "[^"]*": /, '');
		return {
			ok: false,
			message: /type a number$/.test(why)
				? `Cannot read "${typed.trim()}": type an amount, e.g. ${example}`
				: `Cannot read "${typed.trim()}": ${why}`
		};
	}
	if (d.value.negative && min >= 0)
		return { ok: false, message: `${capital(label)} cannot be negative` };
	const digits = currencyDigits(currency);
	const fraction = d.value.fraction.replace(/0+$/, '');
	if (fraction.length > digits) {
		return {
			ok: false,
			message:
				digits === 0
					? `${currency.toUpperCase()} has no decimals: type a whole amount, e.g. ${example}`
					: `Use at most ${DIGIT_WORDS[digits] ?? digits} decimals, e.g. ${example}`
		};
	}
	const magnitude =
		Number(d.value.whole) * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
	const minor = d.value.negative && magnitude !== 0 ? -magnitude : magnitude;
	if (!Number.isSafeInteger(minor) || minor > max)
		return { ok: false, message: `Keep ${label} at most ${formatMoney(max, currency)}` };
	if (minor < min)
		return {
			ok: false,
			message: `${capital(label)} must be at least ${formatMoney(min, currency)}`
		};
	return { ok: true, value: minor };
}

/** An amount in the smallest unit as a money field shows it: 1250 USD → `12.50`, 1250 JPY → `1250`. */
export function moneyToInput(minor: number | null | undefined, currency: string): string {
	if (minor === null || minor === undefined) return '';
	const digits = currencyDigits(currency);
	const sign = minor < 0 ? '-' : '';
	const text = String(Math.abs(minor)).padStart(digits + 1, '0');
	if (digits === 0) return `${sign}${text}`;
	return `${sign}${text.slice(0, -digits)}.${text.slice(-digits)}`;
}

/**
 * A percentage typed as `6.5` or `6.5 %` into basis points (650): at most two decimals (one
 * basis point), from 0 to 100.
 */
export function readPercentBps(typed: string, label = 'a percentage'): Read<number> {
	const long = tooLong(typed);
	if (long) return long;
	const text = typed.trim();
	if (!text) return { ok: false, message: `Enter ${label}, e.g. 6.5` };
	const d = readDecimal(withoutUnit(text, ['%']));
	if (!d.ok) {
		const why = d.message.replace(/^Cannot read "[^"]*": /, '');
		return {
			ok: false,
			message: /type a number$/.test(why)
				? `Cannot read "${text}": type a percentage, e.g. 6.5`
				: `Cannot read "${text}": ${why}`
		};
	}
	if (d.value.negative) return { ok: false, message: `${capital(label)} cannot be negative` };
	const fraction = d.value.fraction.replace(/0+$/, '');
	if (fraction.length > 2) return { ok: false, message: 'Use at most two decimals, e.g. 8.25' };
	const bps = Number(d.value.whole) * 100 + Number(fraction.padEnd(2, '0'));
	if (bps > 10_000) return { ok: false, message: `A percentage is at most ${shown(100)}` };
	return { ok: true, value: bps };
}

/** Basis points as a percentage field shows them: `650` → `6.5`. */
export function bpsToInput(bps: number): string {
	return String(bps / 100);
}
