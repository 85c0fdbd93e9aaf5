import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ceilTo, ceilUnits, floorUnits } from './math';

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
