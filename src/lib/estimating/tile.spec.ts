/**
 * Tile setting materials with worked examples. The grout volume is arithmetic (the joint's share
 * of each tile's module times its depth), checked against mathjs; coverages and yields come from
 * the products' data sheets (the price book), the 10 % waste is memory.
 */
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { groutCuInPerSqFt, groutUnits, unitsByCoverage } from './tile';

describe('grout by the joints', () => {
	it('worked example: 12 × 24 in tile, 1/8 in joints 3/8 in deep', () => {
		// module 12.125 × 24.125 = 292.515625 in²; joint 0.125 × 36.125 = 4.515625 in²
		// 144 × 4.515625 × 0.375 = 243.84375; ÷ 292.515625 = 0.83361 in³ per ft²
		expect(groutCuInPerSqFt(12, 24, 0.125, 0.375)).toBeCloseTo(0.83361, 5);
		// a 6 × 8 ft bathroom, 48 ft²: 40.0 in³; with 10 % waste 44.0 in³ < one 0.2 ft³ bag (345.6 in³)
		expect(groutUnits(48 * groutCuInPerSqFt(12, 24, 0.125, 0.375), 0.2, 10)).toBe(1);
	});

	it('small tile takes far more grout: 2 × 2 in mosaic with 1/16 in joints, 1/4 in deep', () => {
		// 144 × 0.0625 × 4.0625 × 0.25 = 9.140625; ÷ 2.0625² (4.25390625) = 2.14876 in³ per ft²
		expect(groutCuInPerSqFt(2, 2, 1 / 16, 1 / 4)).toBeCloseTo(2.14876, 5);
	});

	it('matches an independent evaluation of the same geometry (property)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1, max: 48, noNaN: true }),
				fc.double({ min: 1, max: 48, noNaN: true }),
				fc.double({ min: 1 / 32, max: 1, noNaN: true }),
				fc.double({ min: 1 / 16, max: 1, noNaN: true }),
				(L, W, J, D) => {
					const expected = evaluate('144 * (L*W + J*(L+W) + J^2 - L*W) * D / ((L+J)*(W+J))', {
						L,
						W,
						J,
						D
					}) as number;
					expect(groutCuInPerSqFt(L, W, J, D)).toBeCloseTo(expected, 9);
				}
			)
		);
	});
});

describe('thinset and backer by coverage', () => {
	it('worked example: 48 ft² with 10 % waste at 60 ft² a bag is 1 bag; at 15 ft² a sheet, 4 sheets', () => {
		// 52.8 ÷ 60 = 0.88 → 1;   52.8 ÷ 15 = 3.52 → 4 (3 × 5 ft sheets: maker literature, memory)
		expect(unitsByCoverage(48, 60, 10)).toBe(1);
		expect(unitsByCoverage(48, 15, 10)).toBe(4);
		// whole numbers stay whole: 150 ft² at 15 ft² with no waste is 10 sheets, not 11
		expect(unitsByCoverage(150, 15, 0)).toBe(10);
	});
});
