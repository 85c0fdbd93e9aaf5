/**
 * Baseboard and shoe in stock lengths, with worked examples. Stock lengths of 8, 12 and 16 ft
 * and a couple of inches per cut piece for squaring and coping the ends are common practice
 * (memory); the packing is arithmetic (first-fit decreasing).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lessDoorways, PACK_MAX, runPieces, stockLengths, wallRuns } from './trim';

describe('wall runs less doorways', () => {
	it('takes each edge of a 12 × 10 ft room as a run', () => {
		const runs = wallRuns([
			[0, 0],
			[144, 0],
			[144, 120],
			[0, 120]
		]);
		expect(runs).toEqual([144, 120, 144, 120]);
	});

	it('puts each doorway in the longest run left and splits it there', () => {
		// 144 − 32 = 112 → two runs of 56; then the other 144 → 56 + 56
		expect(lessDoorways([144, 120, 144, 120], [32, 32])).toEqual([56, 56, 120, 56, 56, 120]);
		// a doorway as wide as the wall leaves nothing of it
		expect(lessDoorways([36, 120], [120])).toEqual([36]);
	});

	it('keeps the same length with very many doorways (taken off the total)', () => {
		const runs = Array.from({ length: 1000 }, () => 100);
		const out = lessDoorways(
			runs,
			Array.from({ length: 21 }, () => 30)
		);
		expect(out.reduce((t, r) => t + r, 0)).toBeCloseTo(100_000 - 630, 6);
	});
});

describe('stock lengths', () => {
	it('cuts a run longer than a piece from full pieces and one cut piece', () => {
		// 40 ft wall from 16 ft stock: 16 + 16 + 8 ft (+ 2 in allowance on the cut piece)
		expect(runPieces(480, 192, 2)).toEqual([192, 192, 98]);
		// a wall exactly one stock length long takes the whole piece
		expect(runPieces(192, 192, 2)).toEqual([192]);
	});

	it('worked example: the 12 × 10 ft kitchen with two 32 in doorways takes 3 lengths of 16 ft', () => {
		// runs 56, 56, 120, 56, 56, 120 in, each + 2 in: 122, 122, 58 × 4
		// first-fit decreasing: 122 + 58 | 122 + 58 | 58 + 58 → 3 lengths
		const t = stockLengths([56, 56, 120, 56, 56, 120], 192, 2);
		expect(t.pieces).toBe(3);
		expect(t.runIn).toBe(464);
		expect(t.offcutIn).toBe(3 * 192 - 476);
	});

	it('shares offcuts across rooms: kitchen and hall shoe take 6 lengths, not 3 + 3', () => {
		// hall 3 ft 6 in × 16 ft: 42, 192, 42, 192 → 44, 192, 44, 192
		const hall = stockLengths([42, 192, 42, 192], 192, 2);
		expect(hall.pieces).toBe(3);
		const both = stockLengths([56, 56, 120, 56, 56, 120, 42, 192, 42, 192], 192, 2);
		// 948 in of pieces: 5 lengths by total, but 58 + 58 + 44 + 44 = 204 in > 16 ft, so 6
		expect(both.pieces).toBe(6);
	});

	it('never buys less than the pieces laid end to end, nor leaves a piece out (property)', () => {
		fc.assert(
			fc.property(
				fc.array(fc.double({ min: 1, max: 800, noNaN: true }), { maxLength: 40 }),
				fc.constantFrom(96, 144, 192),
				fc.double({ min: 0, max: 6, noNaN: true }),
				(runs, stock, allowance) => {
					const t = stockLengths(runs, stock, allowance);
					const cut = runs.flatMap((r) => runPieces(r, stock, allowance));
					const total = cut.reduce((s, p) => s + p, 0);
					expect(t.pieces * stock).toBeGreaterThanOrEqual(total - 1e-6);
					// first-fit never needs more than twice the lower bound (plus one)
					expect(t.pieces).toBeLessThanOrEqual(2 * Math.ceil(total / stock - 1e-9) + 1);
					expect(t.offcutIn).toBeGreaterThanOrEqual(-1e-6);
				}
			)
		);
	});

	it('counts by total length past PACK_MAX pieces', () => {
		const runs = Array.from({ length: PACK_MAX + 1 }, () => 100);
		expect(stockLengths(runs, 192, 0).pieces).toBe(Math.ceil(((PACK_MAX + 1) * 100) / 192));
	});
});
