import fc from 'fast-check';
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
	areaFromSqFt,
	areaToSqFt,
	formatArea,
	formatLength,
	fromInches,
	parseLength,
	toInches,
	type LengthUnit
} from './units';

const inches = (text: string, unit?: LengthUnit) => {
	const r = parseLength(text, unit);
	if (!r.ok) throw new Error(r.message);
	return r.inches;
};

describe('parseLength', () => {
	it('reads feet, inches and fractions as people type them', () => {
		expect(inches(`12' 6 1/2"`)).toBe(150.5);
		expect(inches('12 ft 6.5 in')).toBe(150.5);
		expect(inches('150 1/4"')).toBe(150.25);
		expect(inches('12-6')).toBe(150);
		expect(inches('12-6 1/2')).toBe(150.5);
		expect(inches(`12'-6"`)).toBe(150);
		expect(inches(`12'6"`)).toBe(150);
		expect(inches(`12'`)).toBe(144);
		expect(inches('6-1/2"')).toBe(6.5);
		expect(inches('3/8"')).toBe(0.375);
		expect(inches('12 feet 3 inches')).toBe(147);
		expect(inches('12′ 6½″')).toBe(150.5);
	});

	it('reads metric lengths exactly (1 in = 25.4 mm)', () => {
		// 3810 mm ÷ 25.4 = 150 in (exact definition, published)
		expect(inches('3810 mm')).toBeCloseTo(150, 12);
		expect(inches('3810mm')).toBeCloseTo(150, 12);
		expect(inches('3.81 m')).toBeCloseTo(150, 12);
		expect(inches('381 cm')).toBeCloseTo(150, 12);
	});

	it('reads a plain number in the store default unit', () => {
		expect(inches('150')).toBe(150);
		expect(inches('12.5', 'ft')).toBe(150);
		expect(inches('3810', 'mm')).toBeCloseTo(150, 12);
		expect(inches('150 1/2')).toBe(150.5);
	});

	it('names the bad part of the text', () => {
		expect(parseLength(`12' 6 1/0"`)).toEqual({
			ok: false,
			message: `Cannot read "6 1/0" in "12' 6 1/0"": a fraction's bottom cannot be 0`
		});
		expect(parseLength('12 ft abc')).toEqual({
			ok: false,
			message:
				'Cannot read "abc" in "12 ft abc": expected a number, a fraction or a unit (ft, in, mm, cm, m)'
		});
		const wrongOrder = parseLength(`6" 12'`);
		expect(wrongOrder.ok).toBe(false);
		if (!wrongOrder.ok) expect(wrongOrder.message).toContain(`"12"`);
		const improper = parseLength('6 3/2"');
		expect(improper.ok).toBe(false);
		if (!improper.ok) expect(improper.message).toContain("fraction's top");
	});

	it('refuses empty, negative and dangling input', () => {
		expect(parseLength('  ')).toEqual({ ok: false, message: 'Enter a length' });
		expect(parseLength('-12').ok).toBe(false);
		expect(parseLength('12-').ok).toBe(false);
		expect(parseLength('3 m 20 cm').ok).toBe(false);
		expect(parseLength(`12' 6 mm`).ok).toBe(false);
	});
});

describe('formatLength', () => {
	it('writes ft-in to the nearest 1/16 in, fractions in lowest terms', () => {
		expect(formatLength(150.5)).toBe(`12' 6 1/2"`);
		expect(formatLength(144)).toBe(`12' 0"`);
		expect(formatLength(0.375)).toBe(`3/8"`);
		expect(formatLength(150.25, 'in')).toBe(`150 1/4"`);
		// 150.03 in is nearer 150 than 150 1/16
		expect(formatLength(150.03)).toBe(`12' 6"`);
		expect(formatLength(11.99)).toBe(`1' 0"`);
	});

	it('writes metric', () => {
		expect(formatLength(150, 'mm')).toBe('3810 mm');
		expect(formatLength(150, 'm')).toBe('3.81 m');
		expect(formatLength(150, 'cm')).toBe('381 cm');
	});

	it('parse(format(x)) is within 1/32 in of x (rounding to 1/16)', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 12_000, noNaN: true }), (x) => {
				const back = inches(formatLength(x));
				expect(Math.abs(back - x)).toBeLessThanOrEqual(1 / 32 + 1e-9);
				expect(inches(formatLength(x, 'in'))).toBe(back);
			})
		);
	});

	it('format(parse(text)) gives the same text for lengths on the 1/16 grid', () => {
		fc.assert(
			fc.property(fc.integer({ min: 1, max: 16 * 12 * 200 }), (ticks) => {
				const text = formatLength(ticks / 16);
				expect(formatLength(inches(text))).toBe(text);
			})
		);
	});
});

describe('conversions against mathjs (an independent units library)', () => {
	const units: [LengthUnit, string][] = [
		['mm', 'mm'],
		['cm', 'cm'],
		['m', 'm'],
		['ft', 'ft'],
		['in', 'inch']
	];

	it('agree on generated lengths and round-trip', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0.001, max: 100_000, noNaN: true }),
				fc.constantFrom(...units),
				(x, [ours, theirs]) => {
					const want = unit(x, 'inch').toNumber(theirs);
					expect(fromInches(x, ours)).toBeCloseTo(want, 9);
					expect(toInches(fromInches(x, ours), ours)).toBeCloseTo(x, 9);
				}
			)
		);
	});

	it('agree on areas (ft², yd², m²)', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.01, max: 1_000_000, noNaN: true }), (a) => {
				expect(areaFromSqFt(a, 'sqm')).toBeCloseTo(unit(a, 'ft^2').toNumber('m^2'), 6);
				expect(areaFromSqFt(a, 'sqyd')).toBeCloseTo(unit(a, 'ft^2').toNumber('yd^2'), 6);
				expect(areaToSqFt(areaFromSqFt(a, 'sqm'), 'sqm')).toBeCloseTo(a, 6);
			})
		);
	});

	it('uses the exact definitions (published: 1959 international yard and pound)', () => {
		expect(toInches(1, 'ft')).toBe(12);
		expect(fromInches(12, 'm')).toBeCloseTo(0.3048, 15);
		expect(fromInches(36, 'm')).toBeCloseTo(0.9144, 15);
		expect(areaFromSqFt(1, 'sqm')).toBe(0.09290304);
		expect(areaFromSqFt(9, 'sqyd')).toBe(1);
	});
});

describe('formatArea', () => {
	it('writes ft², yd² and m²', () => {
		expect(formatArea(142.5)).toBe('142.5 ft²');
		expect(formatArea(144, 'sqyd')).toBe('16 yd²');
		// 100 ft² × 0.09290304 = 9.290304 m²
		expect(formatArea(100, 'sqm')).toBe('9.29 m²');
	});
});
