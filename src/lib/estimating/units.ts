/**
 * Lengths and areas as people type them. The engine keeps every length in inches.
 * Conversion factors are exact by definition (international yard and pound, 1959).
 */
import { ungroupThousands } from '../input/number';
import { figure, LIMITS, LimitError } from './limits';

/** 1 in = 25.4 mm exactly. */
export const MM_PER_IN = 25.4;
export const IN_PER_FT = 12;
/** 1 ft = 0.3048 m exactly. */
export const M_PER_FT = 0.3048;
/** 1 yd = 0.9144 m exactly. */
export const M_PER_YD = 0.9144;
/** 1 ft² = 0.09290304 m² exactly. */
export const SQM_PER_SQFT = 0.09290304;
export const SQIN_PER_SQFT = 144;
export const SQFT_PER_SQYD = 9;
export const SQIN_PER_SQYD = 1296;
export const CUIN_PER_CUFT = 1728;
/** US liquid gallon = 231 in³ exactly. */
export const CUIN_PER_US_GAL = 231;
/** 1 lb = 453.59237 g exactly. */
export const GRAMS_PER_LB = 453.59237;

export type LengthUnit = 'in' | 'ft' | 'mm' | 'cm' | 'm';
export type LengthFormat = 'ft-in' | 'in' | 'mm' | 'cm' | 'm';
export type AreaUnit = 'sqft' | 'sqyd' | 'sqm';

export type ParseLengthResult = { ok: true; inches: number } | { ok: false; message: string };

const IN_PER_UNIT: Record<LengthUnit, number> = {
	in: 1,
	ft: IN_PER_FT,
	mm: 1 / MM_PER_IN,
	cm: 10 / MM_PER_IN,
	m: 1000 / MM_PER_IN
};

const UNIT_WORDS: Record<string, LengthUnit> = {
	"'": 'ft',
	ft: 'ft',
	foot: 'ft',
	feet: 'ft',
	'"': 'in',
	in: 'in',
	inch: 'in',
	inches: 'in',
	mm: 'mm',
	cm: 'cm',
	m: 'm'
};

const VULGAR: Record<string, string> = {
	'½': ' 1/2',
	'¼': ' 1/4',
	'¾': ' 3/4',
	'⅛': ' 1/8',
	'⅜': ' 3/8',
	'⅝': ' 5/8',
	'⅞': ' 7/8'
};

interface Part {
	text: string;
	value: number;
	unit?: LengthUnit;
	/** Followed by a dash with no unit, as in `12-6`. */
	dash?: boolean;
}

// A magnitude: a whole or decimal number, optionally followed by a fraction (`6 1/2`, `6-1/2`),
// or a bare fraction; then an optional unit.
const PART =
	/^\s*(\d+\s*\/\s*\d+|(?:\d+(?:\.\d*)?|\.\d+)(?:(?:\s+|\s*-\s*)\d+\s*\/\s*\d+)?)\s*(feet|foot|ft|inches|inch|in|mm|cm|m|'|")?\s*(-)?/i;
const FRACTION = /^(?:(\d+(?:\.\d*)?|\.\d+)(?:\s+|\s*-\s*))?(\d+)\s*\/\s*(\d+)$/;

function cannot(part: string, whole: string, why: string): ParseLengthResult {
	return { ok: false, message: `Cannot read "${part}" in "${whole}": ${why}` };
}

/**
 * Parses a length as typed: `12' 6 1/2"`, `12 ft 6.5 in`, `150 1/4"`, `12-6` (12 ft 6 in),
 * `3810 mm`, `3.81 m`, or a plain number in `defaultUnit`. Never throws.
 */
export function parseLength(text: string, defaultUnit: LengthUnit = 'in'): ParseLengthResult {
	const whole = text;
	if (text.length > LIMITS.lengthText)
		return {
			ok: false,
			message: `A length is at most ${LIMITS.lengthText} characters; this one is ${text.length}`
		};
	let s = text
		.replace(/[′’‘`]/g, "'")
		.replace(/[″”“]|''/g, '"')
		.replace(/[½¼¾⅛⅜⅝⅞]/g, (c) => VULGAR[c]);
	if (s.trim() === '') return { ok: false, message: 'Enter a length' };
	// Thousands groups (`1,500 mm`) read as typed; any other comma is refused, never guessed.
	const grouped = ungroupThousands(s);
	if (!grouped.ok) return grouped;
	s = grouped.value;
	if (/^\s*-/.test(s))
		return { ok: false, message: `Cannot read "${whole}": a length cannot be negative` };

	const parts: Part[] = [];
	while (s.trim() !== '') {
		const m = PART.exec(s);
		if (!m) {
			const bad = s.trim().split(/\s+/)[0];
			return cannot(bad, whole, 'expected a number, a fraction or a unit (ft, in, mm, cm, m)');
		}
		const magnitude = m[1];
		const unitText = m[2]?.toLowerCase();
		const label = magnitude.trim();
		let value: number;
		const f = FRACTION.exec(magnitude.trim());
		if (f) {
			const top = Number(f[2]);
			const bottom = Number(f[3]);
			if (bottom === 0) return cannot(label, whole, "a fraction's bottom cannot be 0");
			if (f[1] !== undefined && top >= bottom)
				return cannot(label, whole, "a fraction's top must be smaller than its bottom");
			value = (f[1] !== undefined ? Number(f[1]) : 0) + top / bottom;
		} else {
			value = Number(magnitude);
		}
		if (!Number.isFinite(value)) return cannot(label, whole, 'not a number');
		parts.push({
			text: label,
			value,
			unit: unitText ? UNIT_WORDS[unitText] : undefined,
			dash: !!m[3]
		});
		s = s.slice(m[0].length);
	}

	// `12-6`: a dash after a unitless number means feet, then inches.
	if (parts.length === 2 && parts[0].dash && !parts[0].unit && !parts[1].unit) {
		parts[0].unit = 'ft';
		parts[1].unit = 'in';
	}
	if (parts.some((p, i) => p.dash && i === parts.length - 1))
		return cannot(parts[parts.length - 1].text + '-', whole, 'nothing follows the dash');

	if (parts.length === 1) {
		const p = parts[0];
		return { ok: true, inches: p.value * IN_PER_UNIT[p.unit ?? defaultUnit] };
	}
	if (parts.length === 2 && parts[0].unit === 'ft' && parts[1].unit !== 'ft') {
		const inchUnit = parts[1].unit ?? 'in';
		if (inchUnit !== 'in')
			return cannot(parts[1].text, whole, 'feet can only be followed by inches');
		return { ok: true, inches: parts[0].value * IN_PER_FT + parts[1].value };
	}
	const first = parts.find((p, i) => i > 0 && (p.unit === 'ft' || !parts[0].unit)) ?? parts[1];
	return cannot(first.text, whole, 'write feet first, then inches (e.g. 12\' 6 1/2")');
}

/** Exact conversion of a length in `unit` to inches. */
export function toInches(value: number, unit: LengthUnit): number {
	return value * IN_PER_UNIT[unit];
}

/** Exact conversion of inches to `unit`. */
export function fromInches(inches: number, unit: LengthUnit): number {
	return inches / IN_PER_UNIT[unit];
}

/**
 * Greatest common divisor of two whole numbers up to 2^53 (Euclid, by division). Refuses
 * anything else (`1e308`, a fraction, NaN) rather than looping: whole numbers up to 2^53 take
 * at most 78 divisions (consecutive Fibonacci numbers are the worst case).
 */
export function gcd(a: number, b: number): number {
	if (!Number.isSafeInteger(a) || !Number.isSafeInteger(b))
		throw new LimitError(
			Number.isSafeInteger(a) ? 'b' : 'a',
			Number.MAX_SAFE_INTEGER,
			`gcd takes whole numbers up to ${Number.MAX_SAFE_INTEGER}; it was given ${a} and ${b}`
		);
	a = Math.abs(a);
	b = Math.abs(b);
	for (let i = 0; b !== 0 && i < 100; i++) {
		const r = a % b;
		a = b;
		b = r;
	}
	return a;
}

/** A fraction of an inch in lowest terms, e.g. 8/16 → `1/2`. */
function fraction(top: number, bottom: number): string {
	const g = gcd(top, bottom);
	return `${top / g}/${bottom / g}`;
}

/** Trims trailing zeros of a fixed-point number. */
function trimFixed(n: number, digits: number): string {
	const s = n.toFixed(digits);
	return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

/**
 * Formats inches: `ft-in` (`12' 6 1/2"`, to 1/`denominator` in), `in` (`150 1/4"`), `mm`, `cm`
 * or `m` (to `digits` decimals, trailing zeros dropped). Past `LIMITS.formatIn`, or not a
 * number, the plain figure (`1e+308 in`).
 */
export function formatLength(
	inches: number,
	format: LengthFormat = 'ft-in',
	options: { denominator?: number; digits?: number } = {}
): string {
	// Past about 158 miles (or not a number) a length is no longer one anybody measures: it is
	// written as the plain number, never worked into feet and fractions.
	if (!(Math.abs(inches) <= LIMITS.formatIn)) return `${figure(inches)} in`;
	const sign = inches < 0 ? '-' : '';
	const abs = Math.abs(inches);
	if (format === 'mm') return `${sign}${trimFixed(abs * MM_PER_IN, options.digits ?? 0)} mm`;
	if (format === 'cm') return `${sign}${trimFixed(abs * (MM_PER_IN / 10), options.digits ?? 1)} cm`;
	if (format === 'm') return `${sign}${trimFixed(abs * (MM_PER_IN / 1000), options.digits ?? 3)} m`;
	const d = options.denominator ?? 16;
	const ticks = Math.round(abs * d);
	const perFoot = IN_PER_FT * d;
	const feet = format === 'ft-in' ? Math.floor(ticks / perFoot) : 0;
	const rest = ticks - feet * perFoot;
	const whole = Math.floor(rest / d);
	const frac = rest - whole * d;
	const inch =
		frac === 0
			? `${whole}"`
			: whole === 0 && feet === 0
				? `${fraction(frac, d)}"`
				: `${whole} ${fraction(frac, d)}"`;
	return feet > 0 ? `${sign}${feet}' ${inch}` : `${sign}${inch}`;
}

/** ft² from in². */
export function sqFtFromSqIn(sqIn: number): number {
	return sqIn / SQIN_PER_SQFT;
}

/** Converts an area in ft² to `unit`. */
export function areaFromSqFt(sqFt: number, unit: AreaUnit): number {
	if (unit === 'sqyd') return sqFt / SQFT_PER_SQYD;
	if (unit === 'sqm') return sqFt * SQM_PER_SQFT;
	return sqFt;
}

/** Converts an area in `unit` to ft². */
export function areaToSqFt(value: number, unit: AreaUnit): number {
	if (unit === 'sqyd') return value * SQFT_PER_SQYD;
	if (unit === 'sqm') return value / SQM_PER_SQFT;
	return value;
}

const AREA_LABEL: Record<AreaUnit, string> = { sqft: 'ft²', sqyd: 'yd²', sqm: 'm²' };

/** Formats an area held in ft², e.g. `142.5 ft²`, `15.83 yd²`, `13.24 m²`. */
export function formatArea(sqFt: number, unit: AreaUnit = 'sqft', digits = 2): string {
	return `${trimFixed(areaFromSqFt(sqFt, unit), digits)} ${AREA_LABEL[unit]}`;
}
