/**
 * The rectangles' fast path against the outside reference, polygon-clipping: wherever the fast
 * path answers, polygon-clipping makes one polygon with the very same ring (same corners, same
 * order, same start); where it declines, polygon-clipping is left to answer.
 */
import fc from 'fast-check';
import polygonClipping from 'polygon-clipping';
import type { Polygon } from 'polygon-clipping';
import { describe, expect, it } from 'vitest';
import { rectUnionRing, type Rect } from './rect-union';

/** What geometry.ts did before the fast path: polygon-clipping's union, rings kept open. */
function reference(rects: readonly Rect[]): Polygon[] {
	const polys: Polygon[] = rects.map((r) => [
		[
			[r.xIn, r.yIn],
			[r.xIn + r.widthIn, r.yIn],
			[r.xIn + r.widthIn, r.yIn + r.lengthIn],
			[r.xIn, r.yIn + r.lengthIn]
		]
	]);
	return polygonClipping.union(polys).map((poly) => poly.map((ring) => ring.slice(0, -1)));
}

/**
 * Rectangles on a coarse grid (so they often overlap and share walls and corners), at a scale:
 * binary fractions add up exactly; tenths and thirds do not, so their walls may land a hair
 * apart, the case left to polygon-clipping's rounding.
 */
const rectSetsAt = (scales: number[]) =>
	fc
		.tuple(
			fc.constantFrom(...scales),
			fc.array(
				fc.record({
					x: fc.integer({ min: -4, max: 8 }),
					y: fc.integer({ min: -4, max: 8 }),
					w: fc.integer({ min: 1, max: 10 }),
					l: fc.integer({ min: 1, max: 10 })
				}),
				{ minLength: 2, maxLength: 8 }
			)
		)
		.map(([scale, list]) =>
			list.map((r): Rect => ({
				xIn: r.x * scale,
				yIn: r.y * scale,
				widthIn: r.w * scale,
				lengthIn: r.l * scale
			}))
		);

describe('rectUnionRing', () => {
	it('gives exactly polygon-clipping’s ring wherever it answers', () => {
		let answered = 0;
		fc.assert(
			fc.property(rectSetsAt([1, 12, 0.5, 0.1, 1 / 3, 7.25]), (rects) => {
				const ring = rectUnionRing(rects);
				if (ring === null) return;
				answered++;
				expect(reference(rects)).toEqual([[ring]]);
			}),
			{ numRuns: 3000 }
		);
		// the property means little unless the fast path answers a good share of the sets
		expect(answered).toBeGreaterThan(750);
	});

	it('answers whenever polygon-clipping makes one area without holes or pinch points', () => {
		fc.assert(
			fc.property(rectSetsAt([1, 12, 0.5, 0.25, 7.25]), (rects) => {
				const ref = reference(rects);
				const oneSimpleArea =
					ref.length === 1 &&
					ref[0].length === 1 &&
					new Set(ref[0][0].map(([x, y]) => `${x},${y}`)).size === ref[0][0].length;
				if (oneSimpleArea) expect(rectUnionRing(rects)).toEqual(ref[0][0]);
			}),
			{ numRuns: 2000 }
		);
	});

	it('draws an L of two rooms counter-clockwise from the lowest corner of the leftmost wall', () => {
		expect(
			rectUnionRing([
				{ xIn: 0, yIn: 0, widthIn: 120, lengthIn: 144 },
				{ xIn: 120, yIn: 0, widthIn: 60, lengthIn: 72 }
			])
		).toEqual([
			[0, 0],
			[180, 0],
			[180, 72],
			[120, 72],
			[120, 144],
			[0, 144]
		]);
	});

	it('leaves separate areas, holes and pinch points to polygon-clipping', () => {
		const square = (xIn: number, yIn: number, side = 10): Rect => ({
			xIn,
			yIn,
			widthIn: side,
			lengthIn: side
		});
		// apart
		expect(rectUnionRing([square(0, 0), square(20, 0)])).toBeNull();
		// meeting only at a corner
		expect(rectUnionRing([square(0, 0), square(10, 10)])).toBeNull();
		// a ring of four around an empty middle
		expect(
			rectUnionRing([
				{ xIn: 0, yIn: 0, widthIn: 30, lengthIn: 10 },
				{ xIn: 0, yIn: 20, widthIn: 30, lengthIn: 10 },
				{ xIn: 0, yIn: 0, widthIn: 10, lengthIn: 30 },
				{ xIn: 20, yIn: 0, widthIn: 10, lengthIn: 30 }
			])
		).toBeNull();
		// walls a hair apart, which polygon-clipping snaps together
		expect(rectUnionRing([square(0, 0), square(10 + 1e-9, 0)])).toBeNull();
	});
});
