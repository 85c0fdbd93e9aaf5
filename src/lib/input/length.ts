/**
 * Lengths, areas and volumes as people type them. Lengths are read by the engine's own
 * `parseLength` (feet and inches with fractions, `12-6`, mm, cm, m), which follows the number
 * rule of `./number` for its digits; areas and volumes are a number and a unit, or two lengths
 * multiplied. Every value comes back in the engine's units: inches, ft², in³. Browser-safe.
 */
import {
	areaToSqFt,
	CUIN_PER_CUFT,
	CUIN_PER_US_GAL,
	MM_PER_IN,
	parseLength,
	SQIN_PER_SQFT,
	type AreaUnit,
	type LengthUnit
} from '$lib/estimating/units';
import { capital, readDecimal, shown, tooLong, type Read } from './number';

export interface LengthOptions {
	/** The field in messages, with its article: "the roll width". */
	label?: string;
	/** Zero is refused too. */
	positive?: boolean;
	/** Largest allowed, in inches. */
	maxIn?: number;
}

/**
 * A length as typed (`12' 6 1/2"`, `3810 mm`, `1,500 mm`, or a plain number in `defaultUnit`)
 * in inches. Never throws.
 */
export function readLength(
	text: string,
	defaultUnit: LengthUnit = 'in',
	options: LengthOptions = {}
): Read<number> {
	const long = tooLong(text);
	if (long) return long;
	const r = parseLength(text, defaultUnit);
	if (!r.ok) return r;
	const label = capital(options.label ?? 'a length');
	if (options.positive && !(r.inches > 0))
		return { ok: false, message: `${label} must be more than 0` };
	if (options.maxIn !== undefined && r.inches > options.maxIn)
		return { ok: false, message: `${label} must be at most ${shown(options.maxIn)} in` };
	return { ok: true, value: r.inches };
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
export function readArea(
	text: string,
	defaultUnit: AreaUnit = 'sqft',
	lengthUnit: LengthUnit = 'ft'
): Read<number> {
	const long = tooLong(text);
	if (long) return long;
	const t = text.trim();
	if (!t) return { ok: false, message: 'Enter an area' };
	const sides = t.split(/\s*(?:[x×*]|\bby\b)\s*/i);
	if (sides.length === 2 && sides.every((s) => s.trim() !== '')) {
		const a = readLength(sides[0], lengthUnit);
		if (!a.ok) return a;
		const b = readLength(sides[1], lengthUnit);
		if (!b.ok) return b;
		return { ok: true, value: (a.value * b.value) / SQIN_PER_SQFT };
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
	const d = readDecimal(number);
	if (!d.ok) {
		if (/comma|digits|spaces/.test(d.message)) return { ok: false, message: d.message };
		return {
			ok: false,
			message: `Cannot read "${t}": type an area such as 120, 120 ft², 11.2 m² or 12' x 10'`
		};
	}
	if (d.value.negative) return { ok: false, message: 'An area cannot be negative' };
	return { ok: true, value: areaToSqFt(d.value.value, unit) };
}

const US_QT_CUIN = CUIN_PER_US_GAL / 4;
/** 1 L = 1000 cm³ and 1 in = 2.54 cm exactly, so 1 in³ = 16.387064 cm³. */
const CUIN_PER_LITRE = 1000 / (MM_PER_IN / 10) ** 3;
const VOLUME_UNITS: [RegExp, number][] = [
	[/^(gal|gallons?)$/i, CUIN_PER_US_GAL],
	[/^(qt|quarts?)$/i, US_QT_CUIN],
	[/^(l|litres?|liters?)$/i, CUIN_PER_LITRE],
	[/^(cu\s*in|in³|in3|cubic\s+inch(es)?)$/i, 1],
	[/^(cu\s*ft|ft³|ft3|cubic\s+f(oo|ee)t)$/i, CUIN_PER_CUFT]
];

/** A container volume typed as `1 gal`, `2 qt`, `3.78 L`, `231 cu in`, to cubic inches (US units). */
export function readVolume(text: string): Read<number> {
	const long = tooLong(text);
	if (long) return long;
	const m = /^\s*([-−]?[\d.,]+)\s*(.*)$/.exec(text);
	if (!m) return { ok: false, message: `Cannot read "${text.trim()}": type e.g. 1 gal or 3.78 L` };
	const d = readDecimal(m[1]);
	if (!d.ok) return d;
	const unitText = m[2].trim();
	if (!unitText) return { ok: false, message: 'Add the unit: gal, qt, L, cu in or cu ft' };
	const unit = VOLUME_UNITS.find(([re]) => re.test(unitText));
	if (!unit)
		return { ok: false, message: `Cannot read "${unitText}": use gal, qt, L, cu in or cu ft` };
	if (!(d.value.value > 0)) return { ok: false, message: 'A volume must be more than 0' };
	return { ok: true, value: d.value.value * unit[1] };
}
