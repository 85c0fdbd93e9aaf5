import Flatten from '@flatten-js/core';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roomOutline, roomShape, type Point, type RoomShape, type Shape } from './geometry';

const ok = (shape: Shape, cutouts: Parameters<typeof roomShape>[1] = []): RoomShape => {
	const r = roomShape(shape, cutouts);
	if (!r.ok) throw new Error(r.message);
	return r;
};

/** Area by @flatten-js/core, an independent polygon library. */
function flattenArea(rects: { xIn: number; yIn: number; widthIn: number; lengthIn: number }[]) {
	const polys = rects.map(
		(r) =>
			new Flatten.Polygon([
				[r.xIn, r.yIn],
				[r.xIn + r.widthIn, r.yIn],
				[r.xIn + r.widthIn, r.yIn + r.lengthIn],
				[r.xIn, r.yIn + r.lengthIn]
			])
	);
	return polys
		.slice(1)
		.reduce((u, p) => Flatten.BooleanOperations.unify(u, p), polys[0])
		.area();
}

describe('roomShape: rectangles and unions', () => {
	it('measures a rectangle: area and perimeter', () => {
		// 12 ft × 10 ft = 144 in × 120 in = 17,280 in² = 120 ft²; perimeter 2 × (144 + 120) = 528 in
		const r = ok({ kind: 'rect', widthIn: 144, lengthIn: 120 });
		expect(r.areaSqFt).toBe(120);
		expect(r.perimeterIn).toBe(528);
		expect(r.isRect).toBe(true);
	});

	it('joins an L of two rectangles sharing a wall', () => {
		// 10×12 ft + 5×6 ft closet = 120 + 30 = 150 ft²; L outline 2 × (15 + 12) ft = 54 ft = 648 in
		const r = ok({
			kind: 'rects',
			rects: [
				{ xIn: 0, yIn: 0, widthIn: 120, lengthIn: 144 },
				{ xIn: 120, yIn: 0, widthIn: 60, lengthIn: 72 }
			]
		});
		expect(r.areaSqFt).toBeCloseTo(150, 9);
		expect(r.perimeterIn).toBeCloseTo(648, 9);
		expect(r.polygon).toHaveLength(1);
	});

	it('counts overlapping rectangles once', () => {
		const r = ok({
			kind: 'rects',
			rects: [
				{ xIn: 0, yIn: 0, widthIn: 100, lengthIn: 100 },
				{ xIn: 50, yIn: 50, widthIn: 100, lengthIn: 100 }
			]
		});
		// 2 × 10,000 − 2,500 overlap = 17,500 in²
		expect(r.areaSqIn).toBeCloseTo(17_500, 9);
	});

	it('rejects rectangles that do not touch, or touch only at a corner', () => {
		const apart = roomShape({
			kind: 'rects',
			rects: [
				{ xIn: 0, yIn: 0, widthIn: 10, lengthIn: 10 },
				{ xIn: 20, yIn: 0, widthIn: 10, lengthIn: 10 }
			]
		});
		expect(apart).toMatchObject({ ok: false, field: 'shape' });
		if (!apart.ok) expect(apart.message).toContain('2 separate areas');
		const corner = roomShape({
			kind: 'rects',
			rects: [
				{ xIn: 0, yIn: 0, widthIn: 10, lengthIn: 10 },
				{ xIn: 10, yIn: 10, widthIn: 10, lengthIn: 10 }
			]
		});
		expect(corner.ok).toBe(false);
	});

	it('rejects zero sizes, naming the rectangle', () => {
		expect(roomShape({ kind: 'rect', widthIn: 0, lengthIn: 10 })).toMatchObject({
			ok: false,
			field: 'shape'
		});
		expect(
			roomShape({
				kind: 'rects',
				rects: [
					{ xIn: 0, yIn: 0, widthIn: 10, lengthIn: 10 },
					{ xIn: 10, yIn: 0, widthIn: 10, lengthIn: -1 }
				]
			})
		).toMatchObject({ ok: false, field: 'shape.rects.1' });
		expect(roomShape({ kind: 'rects', rects: [] }).ok).toBe(false);
	});

	it('matches @flatten-js/core on generated unions', () => {
		const rect = fc.record({
			xIn: fc.integer({ min: 0, max: 200 }),
			yIn: fc.integer({ min: 0, max: 200 }),
			widthIn: fc.integer({ min: 1, max: 200 }),
			lengthIn: fc.integer({ min: 1, max: 200 })
		});
		fc.assert(
			fc.property(fc.array(rect, { minLength: 1, maxLength: 5 }), (rects) => {
				const r = roomShape({ kind: 'rects', rects });
				if (!r.ok) {
					expect(r.message).toMatch(/separate areas/);
					return;
				}
				expect(r.areaSqIn).toBeCloseTo(flattenArea(rects), 6);
			})
		);
	});

	it('keeps the area when a rectangle is split in two', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 2, max: 500 }),
				fc.integer({ min: 1, max: 500 }),
				fc.double({ min: 0.01, max: 0.99, noNaN: true }),
				fc.boolean(),
				(w, l, at, alongX) => {
					const whole = ok({ kind: 'rect', widthIn: w, lengthIn: l });
					const cut = alongX ? w * at : l * at;
					const rects = alongX
						? [
								{ xIn: 0, yIn: 0, widthIn: cut, lengthIn: l },
								{ xIn: cut, yIn: 0, widthIn: w - cut, lengthIn: l }
							]
						: [
								{ xIn: 0, yIn: 0, widthIn: w, lengthIn: cut },
								{ xIn: 0, yIn: cut, widthIn: w, lengthIn: l - cut }
							];
					const split = ok({ kind: 'rects', rects });
					expect(split.areaSqIn).toBeCloseTo(whole.areaSqIn, 6);
					expect(split.perimeterIn).toBeCloseTo(whole.perimeterIn, 6);
				}
			)
		);
	});
});

describe('roomShape: polygons', () => {
	it('walks sides and turns (a closed L)', () => {
		// 8 ft × 5 ft less a 2.5 × 3 ft notch: 40 − 7.5 = 32.5 ft²... drawn as six sides
		const r = ok({
			kind: 'sides',
			sides: [
				{ lengthIn: 96, turn: 'left' },
				{ lengthIn: 60, turn: 'left' },
				{ lengthIn: 36, turn: 'left' },
				{ lengthIn: 30, turn: 'right' },
				{ lengthIn: 60, turn: 'left' },
				{ lengthIn: 30, turn: 'left' }
			]
		});
		// 96 × 60 − 60 × 30 = 5760 − 1800 = 3960 in² = 27.5 ft²
		expect(r.areaSqFt).toBeCloseTo(27.5, 9);
		expect(r.perimeterIn).toBeCloseTo(96 + 60 + 36 + 30 + 60 + 30, 9);
	});

	it('takes turns in degrees (an equilateral triangle)', () => {
		const r = ok({
			kind: 'sides',
			sides: [
				{ lengthIn: 100, turn: 120 },
				{ lengthIn: 100, turn: 120 },
				{ lengthIn: 100, turn: 120 }
			]
		});
		// √3/4 × 100² = 4330.127 in²
		expect(r.areaSqIn).toBeCloseTo((Math.sqrt(3) / 4) * 10_000, 6);
	});

	it('takes a 45° bay from points, either winding', () => {
		const pts: Point[] = [
			[0, 0],
			[120, 0],
			[120, 96],
			[96, 120],
			[24, 120],
			[0, 96]
		];
		const a = ok({ kind: 'points', points: pts });
		const b = ok({ kind: 'points', points: [...pts].reverse() });
		// 120 × 120 − 2 corner triangles of 24 × 24 / 2 = 14,400 − 576 = 13,824 in²
		expect(a.areaSqIn).toBeCloseTo(13_824, 9);
		expect(b.areaSqIn).toBeCloseTo(13_824, 9);
	});

	it('rejects an open outline, saying how far it misses', () => {
		const r = roomShape({
			kind: 'sides',
			sides: [
				{ lengthIn: 100, turn: 'left' },
				{ lengthIn: 100, turn: 'left' },
				{ lengthIn: 100, turn: 'left' },
				{ lengthIn: 96.5, turn: 'left' }
			]
		});
		expect(r).toEqual({
			ok: false,
			field: 'shape',
			message: 'The sides end 3 1/2" from where they start: the outline is not closed'
		});
	});

	it('closes within the tolerance', () => {
		const r = roomShape(
			{
				kind: 'sides',
				sides: [
					{ lengthIn: 100, turn: 'left' },
					{ lengthIn: 100, turn: 'left' },
					{ lengthIn: 100, turn: 'left' },
					{ lengthIn: 99.875, turn: 'left' }
				]
			},
			[],
			{ closureToleranceIn: 0.25 }
		);
		expect(r.ok).toBe(true);
	});

	it('rejects a self-crossing outline (a bow tie)', () => {
		const r = roomShape({
			kind: 'points',
			points: [
				[0, 0],
				[100, 100],
				[100, 0],
				[0, 100]
			]
		});
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.message).toContain('crosses itself');
	});

	it('rejects a wall folding back on itself and a flat outline', () => {
		expect(
			roomShape({
				kind: 'points',
				points: [
					[0, 0],
					[100, 0],
					[50, 0],
					[50, 50]
				]
			}).ok
		).toBe(false);
		expect(
			roomShape({
				kind: 'points',
				points: [
					[0, 0],
					[50, 0],
					[100, 0]
				]
			})
		).toMatchObject({ ok: false, message: 'The outline has no area' });
	});

	it('matches @flatten-js/core on generated star-shaped polygons', () => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 20, max: 400 }), { minLength: 3, maxLength: 12 }),
				(radii) => {
					const n = radii.length;
					const pts: Point[] = radii.map((r, i) => [
						r * Math.cos((2 * Math.PI * i) / n),
						r * Math.sin((2 * Math.PI * i) / n)
					]);
					const r = ok({ kind: 'points', points: pts });
					expect(r.areaSqIn).toBeCloseTo(new Flatten.Polygon(pts).area(), 6);
				}
			)
		);
	});
});

describe('roomShape: cut-outs', () => {
	it('subtracts an island inside the room and adds its faces to the trim length', () => {
		// 144 × 120 − 48 × 30 = 17,280 − 1,440 = 15,840 in² = 110 ft²
		const r = ok({ kind: 'rect', widthIn: 144, lengthIn: 120 }, [
			{ name: 'Island', shape: { kind: 'rect', xIn: 40, yIn: 40, widthIn: 48, lengthIn: 30 } }
		]);
		expect(r.areaSqFt).toBeCloseTo(110, 9);
		expect(r.wallPerimeterIn).toBe(528);
		expect(r.perimeterIn).toBeCloseTo(528 + 156, 9);
		expect(r.polygon).toHaveLength(2);
	});

	it('subtracts cabinets along a wall (clipped)', () => {
		// cabinets 24 in deep along the 144 in wall: 17,280 − 3,456 = 13,824 in²
		const r = ok({ kind: 'rect', widthIn: 144, lengthIn: 120 }, [
			{ name: 'Cabinets', shape: { kind: 'rect', xIn: 0, yIn: 96, widthIn: 144, lengthIn: 24 } }
		]);
		expect(r.areaSqIn).toBeCloseTo(13_824, 9);
		expect(r.perimeterIn).toBeCloseTo(2 * (144 + 96), 9);
		expect(r.warnings).toEqual([]);
	});

	it('warns when cut-outs overlap or reach past the walls', () => {
		const r = ok({ kind: 'rect', widthIn: 100, lengthIn: 100 }, [
			{ name: 'Hearth', shape: { kind: 'rect', xIn: 80, yIn: 10, widthIn: 40, lengthIn: 20 } }
		]);
		expect(r.areaSqIn).toBeCloseTo(10_000 - 400, 9);
		expect(r.warnings).toHaveLength(1);
	});

	it('rejects cut-outs covering the room or splitting it', () => {
		expect(
			roomShape({ kind: 'rect', widthIn: 100, lengthIn: 100 }, [
				{ name: 'All', shape: { kind: 'rect', xIn: -1, yIn: -1, widthIn: 102, lengthIn: 102 } }
			])
		).toMatchObject({ ok: false, field: 'cutouts', message: 'The cut-outs cover the whole room' });
		const split = roomShape({ kind: 'rect', widthIn: 100, lengthIn: 100 }, [
			{ name: 'Wall', shape: { kind: 'rect', xIn: 40, yIn: 0, widthIn: 10, lengthIn: 100 } }
		]);
		expect(split).toMatchObject({ ok: false, field: 'cutouts' });
	});

	it('names a bad cut-out', () => {
		expect(
			roomShape({ kind: 'rect', widthIn: 100, lengthIn: 100 }, [
				{ name: 'A', shape: { kind: 'rect', xIn: 10, yIn: 10, widthIn: 10, lengthIn: 10 } },
				{ name: 'Sink', shape: { kind: 'rect', widthIn: 0, lengthIn: 10 } }
			])
		).toEqual({
			ok: false,
			field: 'cutouts.1',
			message: 'Cut-out "Sink": A rectangle needs a width and a length above zero'
		});
	});

	it('gives the same area whether a cut-out is a hole as-is or clipped', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 1, max: 50 }),
				fc.integer({ min: 1, max: 50 }),
				fc.integer({ min: 1, max: 40 }),
				fc.integer({ min: 1, max: 40 }),
				(x, y, w, l) => {
					const room = { kind: 'rect', widthIn: 100, lengthIn: 100 } as const;
					const r = ok(room, [
						{ name: 'c', shape: { kind: 'rect', xIn: x, yIn: y, widthIn: w, lengthIn: l } }
					]);
					const f = new Flatten.Polygon([
						[0, 0],
						[100, 0],
						[100, 100],
						[0, 100]
					]);
					const c = new Flatten.Polygon([
						[x, y],
						[x + w, y],
						[x + w, y + l],
						[x, y + l]
					]);
					expect(r.areaSqIn).toBeCloseTo(Flatten.BooleanOperations.subtract(f, c).area(), 6);
				}
			)
		);
	});
});

describe('roomOutline', () => {
	it('gives rings in inches, a bounding box and an SVG viewBox', () => {
		const r = ok({ kind: 'rect', widthIn: 144, lengthIn: 120 }, [
			{ name: 'Island', shape: { kind: 'rect', xIn: 40, yIn: 40, widthIn: 48, lengthIn: 30 } }
		]);
		const o = roomOutline(r);
		expect(o.outer).toHaveLength(4);
		expect(o.holes).toHaveLength(1);
		expect(o.bbox).toMatchObject({ minX: 0, minY: 0, widthIn: 144, lengthIn: 120 });
		expect(o.viewBox).toBe('0 0 144 120');
		expect(o.outer).toEqual([
			[0, 0],
			[144, 0],
			[144, 120],
			[0, 120]
		]);
	});
});
