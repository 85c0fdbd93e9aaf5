/**
 * How Flushline reads a number that a person typed. One rule for every form, calculator and
 * route (money, percentages and lengths build on it):
 *
 * - A point is the decimal mark: `0.5`, `.25`, `12.`.
 * - A comma only groups thousands, in groups of exactly three digits before any point:
 *   `1,500` is fifteen hundred, `12,345.5` is twelve thousand and a half.
 * - Anything else with a comma (`0,5`, `1,5`, `12,34`, `1,50,000`) is refused with a message
 *   that says so, never guessed: in some countries `1,5` is one and a half, in others it is not
 *   a number, and a wrong guess on a price or a span is worse than a question.
 * - No spaces inside a number, no exponent (`1e3`), no hexadecimal, no `Infinity`, at most 15
 *   digits (so every number read is exact in a double).
 * - A minus sign (`-` or `−`) only where the field allows values below zero.
 *
 * Browser-safe: no server-only imports.
 */

export type Read<T> = { ok: true; value: T } | { ok: false; message: string };

/** The most digits a typed number may have; 15 digits are exact in an IEEE double. */
export const MAX_DIGITS = 15;

/**
 * The longest text a number, amount, length or area may be. Nothing typed in one field is longer,
 * and it keeps every reader's patterns linear in practice: refused before any pattern runs.
 */
export const MAX_TEXT = 100;

/** A refusal for text longer than `MAX_TEXT`, or undefined. */
export function tooLong(text: string): { ok: false; message: string } | undefined {
	return text.length > MAX_TEXT
		? { ok: false, message: `Cannot read this: keep it under ${MAX_TEXT} characters` }
		: undefined;
}

/** The message for a comma that does not group thousands. */
export function commaMessage(text: string) {
	return `Cannot read "${text}": use a point for decimals (0.5); a comma only separates thousands (1,500)`;
}

// Digits grouped by commas in threes, not touching another digit, comma or point on the left
// (so the `1,500` in `0.1,500` is not a group) nor a digit or comma on the right.
const GROUPED = /(^|[^\d,.])(\d{1,3}(?:,\d{3})+)(?![\d,])/g;

/**
 * The text with its thousands groups written without commas (`1,500 mm` → `1500 mm`), or a
 * refusal when a comma is left that does not group thousands (`0,5 m`). Lengths and areas run
 * their text through this before reading their numbers.
 */
export function ungroupThousands(text: string): Read<string> {
	const out = text.replace(GROUPED, (_, before: string, digits: string) =>
		before.concat(digits.replace(/,/g, ''))
	);
	if (out.includes(',')) return { ok: false, message: commaMessage(text.trim()) };
	return { ok: true, value: out };
}

/** A typed decimal split into its parts, exactly as typed (for money and basis points). */
export interface Decimal {
	negative: boolean;
	/** The digits before the point, without leading zeros (`'0'` when none). */
	whole: string;
	/** The digits after the point, as typed (may be empty). */
	fraction: string;
	value: number;
}

const DECIMAL = /^([-−]?)(?:(\d+)(?:\.(\d*))?|\.(\d+))$/;

/**
 * Reads the number alone (no unit, no label): the grammar above. Whitespace around it is
 * ignored. The refusal names what was typed.
 */
export function readDecimal(typed: string): Read<Decimal> {
	const long = tooLong(typed);
	if (long) return long;
	const text = typed.trim();
	const grouped = ungroupThousands(text);
	if (!grouped.ok) return grouped;
	const m = DECIMAL.exec(grouped.value);
	if (!m) {
		if (/^[-−]?[\d.,]+(\s+[\d.,]+)+$/.test(text))
			return {
				ok: false,
				message: `Cannot read "${text}": write the number without spaces (1500 or 1,500)`
			};
		return { ok: false, message: `Cannot read "${text}": type a number` };
	}
	const whole = (m[2] ?? '').replace(/^0+(?=\d)/, '') || '0';
	const fraction = m[3] ?? m[4] ?? '';
	if ((whole === '0' ? 0 : whole.length) + fraction.length > MAX_DIGITS)
		return { ok: false, message: `Cannot read "${text}": use at most ${MAX_DIGITS} digits` };
	const negative = m[1] !== '';
	const magnitude = Number(`${whole}.${fraction || '0'}`);
	return {
		ok: true,
		value: {
			negative,
			whole,
			fraction,
			value: negative && magnitude !== 0 ? -magnitude : magnitude
		}
	};
}

export interface NumberOptions {
	/** The field in messages, with its article: "the waste", "a span". */
	label: string;
	/** Units that may follow the number and are dropped (`%`, `psf`, `ft³`). */
	units?: readonly string[];
	/** Smallest allowed (inclusive); below 0 lets a minus sign in. Default 0. */
	min?: number;
	/** The value must be more than this (exclusive), instead of `min`. */
	above?: number;
	/** Largest allowed (inclusive). Default 1,000,000. */
	max?: number;
	integer?: boolean;
}

/** The default upper bound of a plain number: every field states its own where it knows one. */
export const DEFAULT_MAX = 1_000_000;

/** `the waste` → `The waste`. */
export function capital(s: string) {
	return s.charAt(0).toUpperCase() + s.slice(1);
}

/** A number as messages show it: `1000000` → `1,000,000`. */
export function shown(n: number) {
	return n.toLocaleString('en-US', { maximumFractionDigits: 6 });
}

/** The text without one trailing unit of `units` (longest first), case-insensitively. */
export function withoutUnit(text: string, units: readonly string[]): string {
	const lower = text.toLowerCase();
	for (const unit of [...units].sort((a, b) => b.length - a.length)) {
		if (lower.endsWith(unit.toLowerCase()))
			return text.slice(0, text.length - unit.length).trimEnd();
	}
	return text;
}

/**
 * A number as typed, optionally followed by one of `units`, within the field's bounds. Never
 * throws; every refusal is a sentence for the field.
 */
export function readNumber(typed: string, options: NumberOptions): Read<number> {
	const { label, units = [], max = DEFAULT_MAX, above } = options;
	const min = above ?? options.min ?? 0;
	const long = tooLong(typed);
	if (long) return long;
	const text = typed.trim();
	if (!text) return { ok: false, message: `Enter ${label}` };
	const bare = withoutUnit(text, units);
	const d = readDecimal(bare);
	if (!d.ok) {
		const also = units.length ? ` (and ${units.join(', ')})` : '';
		return {
			ok: false,
			message: d.message
				.replace(`"${bare.trim()}"`, `"${text}"`)
				.replace(/type a number$/, `type a number${also}`)
		};
	}
	const n = d.value.value;
	if (d.value.negative && min >= 0)
		return { ok: false, message: `${capital(label)} cannot be negative` };
	if (options.integer && d.value.fraction.replace(/0+$/, '') !== '')
		return { ok: false, message: `${capital(label)} must be a whole number` };
	if (above !== undefined && !(n > above))
		return {
			ok: false,
			message: `${capital(label)} must be more than ${shown(above)} and at most ${shown(max)}`
		};
	if (n < min || n > max)
		return {
			ok: false,
			message: `${capital(label)} must be between ${shown(min)} and ${shown(max)}`
		};
	return { ok: true, value: n };
}

/** A quote's version number as an address carries it (`?v=2`, `/quote/2/pdf`). */
export const QUOTE_VERSION: NumberOptions = {
	label: 'the version',
	min: 1,
	max: 100_000,
	integer: true
};
