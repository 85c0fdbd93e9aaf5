/**
 * Numbers and areas as people type them on the Calculators page. Lengths go to the engine's own
 * `parseLength`; these helpers cover what it does not read: plain numbers with their unit
 * (`12 %`, `1,500`) and areas (`120 ft²`, `11.2 m²`, or a room's two sides, `12' x 10' 6"`).
 * Never throw.
 */
import {
	areaToSqFt,
	parseLength,
	SQIN_PER_SQFT,
	type AreaUnit,
	type LengthUnit
} from '$lib/estimating';

export type ReadResult = { ok: true; value: number } | { ok: false; message: string };

const THOUSANDS = /^\d{1,3}(,\d{3})+(\.\d+)?$/;

/** A number with `,` as thousands (`1,500`) or as the decimal mark (`0,5`). */
function readDecimal(text: string): number | undefined {
	let t = text.replace(/\s+/g, '');
	if (THOUSANDS.test(t)) t = t.replace(/,/g, '');
	else if (/^\d*,\d+$/.test(t)) t = t.replace(',', '.');
	if (!/^(\d+(\.\d*)?|\.\d+)$/.test(t)) return undefined;
	const n = Number(t);
	return Number.isFinite(n) ? n : undefined;
}

function escape(word: string) {
	return word.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/**
 * A plain number, optionally followed by one of `units` (`%`, `g`, `psf`), within `[min, max]`.
 * `label` names the field in messages ("the waste").
 */
export function parseNumber(
	text: string,
	options: {
		label: string;
		units?: readonly string[];
		min?: number;
		max?: number;
		integer?: boolean;
	}
): ReadResult {
	const { label, units = [], min = 0, max = Number.MAX_SAFE_INTEGER } = options;
	let t = text.trim();
	if (!t) return { ok: false, message: `Enter ${label}` };
	if (t.startsWith('-')) return { ok: false, message: `${capital(label)} cannot be negative` };
	for (const unit of [...units].sort((a, b) => b.length - a.length)) {
		const m = new RegExp(`^(.*?)\\s*${escape(unit)}$`, 'i').exec(t);
		if (m) {
			t = m[1];
			break;
		}
	}
	const n = readDecimal(t);
	if (n === undefined) {
		const also = units.length ? ` (and ${units.join(', ')})` : '';
		return { ok: false, message: `Cannot read "${text.trim()}": type a number${also}` };
	}
	if (options.integer && !Number.isInteger(n))
		return { ok: false, message: `${capital(label)} must be a whole number` };
	if (n < min || n > max)
		return { ok: false, message: `${capital(label)} must be between ${min} and ${max}` };
	return { ok: true, value: n };
}

const AREA_UNITS: [RegExp, AreaUnit][] = [
	[/^(.*?)\s*(ft²|ft2|sq\.?\s*ft|sqft|sf|square\s+feet|square\s+foot)$/i, 'sqft'],
	[/^(.*?)\s*(m²|m2|sq\.?\s*m|sqm|square\s+met(?:re|er)s?)$/i, 'sqm'],
	[/^(.*?)\s*(yd²|yd2|sq\.?\s*yd|sqyd|square\s+yards?)$/i, 'sqyd']
];

/**
 * An area in ft²: a number in `defaultUnit` or with its unit (`120 ft²`, `11.2 m²`, `13 yd²`),
 * or two lengths multiplied (`12' x 10' 6"`, `3.6 m × 3 m`; plain numbers in `lengthUnit`).
 */
export function parseArea(
	text: string,
	defaultUnit: AreaUnit = 'sqft',
	lengthUnit: LengthUnit = 'ft'
): ReadResult {
	const t = text.trim();
	if (!t) return { ok: false, message: 'Enter an area' };
	const sides = t.split(/\s*(?:[x×*]|\bby\b)\s*/i);
	if (sides.length === 2 && sides.every((s) => s.trim() !== '')) {
		const a = parseLength(sides[0], lengthUnit);
		if (!a.ok) return a;
		const b = parseLength(sides[1], lengthUnit);
		if (!b.ok) return b;
		return { ok: true, value: (a.inches * b.inches) / SQIN_PER_SQFT };
	}
	if (sides.length > 2)
		return { ok: false, message: `Cannot read "${t}": multiply two sides only` };
	let unit = defaultUnit;
	let number = t;
	for (const [pattern, u] of AREA_UNITS) {
		const m = pattern.exec(t);
		if (m) {
			number = m[1];
			unit = u;
			break;
		}
	}
	if (number.trim().startsWith('-')) return { ok: false, message: 'An area cannot be negative' };
	const n = readDecimal(number);
	if (n === undefined)
		return {
			ok: false,
			message: `Cannot read "${t}": type an area such as 120, 120 ft², 11.2 m² or 12' x 10'`
		};
	return { ok: true, value: areaToSqFt(n, unit) };
}

function capital(s: string) {
	return s.charAt(0).toUpperCase() + s.slice(1);
}
