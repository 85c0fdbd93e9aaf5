import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ceilTo, ceilUnits, edgeLength, floorUnits, sortShort } from './math';

describe('rounding quantities', () => {
	it('rounds up to whole units, ignoring float noise', () => {
		expect(ceilUnits(4.000000000001)).toBe(4);
		expect(ceilUnits(4.01)).toBe(5);
		expect(ceilUnits(0)).toBe(0);
		expect(ceilUnits(-3)).toBe(0);
		expect(ceilTo(150, 12)).toBe(156);
		expect(ceilTo(144.0000000001, 12)).toBe(144);
		expect(floorUnits(191.99999999999)).toBe(192);
		expect(floorUnits(191.9)).toBe(191);
	});

	it('never rounds below the value by more than the noise slack', () => {
		fc.assert(
			fc.property(fc.double({ min: 0, max: 1e6, noNaN: true }), (x) => {
				expect(ceilUnits(x)).toBeGreaterThanOrEqual(x - 1e-9 * Math.max(1, x));
				expect(ceilUnits(x) - x).toBeLessThan(1);
			})
		);
	});
});

describe('sortShort', () => {
	it('gives the built-in stable sort’s order, ties kept in place, short lists and long', () => {
		fc.assert(
			fc.property(
				fc.array(fc.tuple(fc.integer({ min: -5, max: 5 }), fc.nat()), { maxLength: 80 }),
				(list) => {
					const byKey = (a: [number, number], b: [number, number]) => a[0] - b[0];
					const expected = [...list].sort(byKey);
					const copy = [...list];
					expect(sortShort(copy, byKey)).toBe(copy);
					expect(copy).toEqual(expected);
				}
			)
		);
	});
});

describe('edgeLength', () => {
	it('is Math.hypot to the last bit, along an axis or not', () => {
		const any = fc.oneof(fc.double(), fc.constantFrom(0, -0, Infinity, -Infinity, NaN));
		fc.assert(
			fc.property(any, any, (dx, dy) => {
				expect(Object.is(edgeLength(dx, dy), Math.hypot(dx, dy))).toBe(true);
				expect(Object.is(edgeLength(0, dy), Math.hypot(0, dy))).toBe(true);
				expect(Object.is(edgeLength(dx, -0), Math.hypot(dx, -0))).toBe(true);
			}),
			{ numRuns: 5000 }
		);
	});
});
