import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roomShape, type RoomShape, type Shape } from './geometry';
import { defaultSettings } from './settings';
import {
	cartonTakeoff,
	containerVolume,
	fastenersPerPanel,
	holeRepair,
	levellerTakeoff,
	patchTakeoff,
	rollTakeoff,
	roughCut,
	underlaymentTakeoff
} from './takeoff';

const schedules = defaultSettings.underlayment.schedules;
const panel = { widthIn: 48, lengthIn: 96 };

const room = (shape: Shape): RoomShape => {
	const r = roomShape(shape);
	if (!r.ok) throw new Error(r.message);
	return r;
};
const roll = (shape: Shape, rollWidthIn = 144, direction?: 'x' | 'y') => {
	const r = room(shape);
	return rollTakeoff({
		polygon: r.polygon,
		isRect: r.isRect,
		rollWidthIn,
		trimPerEndIn: 3,
		orderIncrementIn: 12,
		direction
	});
};

describe('cartonTakeoff (arithmetic only: waste by layout has no published standard)', () => {
	it('rounds area × (1 + waste) ÷ coverage up to whole cartons', () => {
		// 120 ft² × 1.10 = 132 ft²; ÷ 20.5 = 6.44 → 7 cartons covering 143.5 ft²
		const t = cartonTakeoff({ areaSqFt: 120, wastePct: 10, coverageSqFt: 20.5 });
		expect(t.neededSqFt).toBeCloseTo(132, 12);
		expect(t.cartons).toBe(7);
		expect(t.suppliedSqFt).toBeCloseTo(143.5, 12);
	});

	it('buys no extra carton for float noise at an exact fit', () => {
		// 82 ÷ 1.1 ft² × 1.1 = 82 ft² = exactly 4 cartons of 20.5 ft²
		expect(cartonTakeoff({ areaSqFt: 82 / 1.1, wastePct: 10, coverageSqFt: 20.5 }).cartons).toBe(4);
		expect(cartonTakeoff({ areaSqFt: 82.001, wastePct: 0, coverageSqFt: 20.5 }).cartons).toBe(5);
		expect(cartonTakeoff({ areaSqFt: 0, wastePct: 10, coverageSqFt: 20.5 }).cartons).toBe(0);
	});

	it('never needs fewer cartons for more area, and always covers the need', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0, max: 5000, noNaN: true }),
				fc.double({ min: 0, max: 500, noNaN: true }),
				fc.integer({ min: 0, max: 30 }),
				fc.double({ min: 5, max: 40, noNaN: true }),
				(a, more, waste, coverage) => {
					const small = cartonTakeoff({ areaSqFt: a, wastePct: waste, coverageSqFt: coverage });
					const big = cartonTakeoff({
						areaSqFt: a + more,
						wastePct: waste,
						coverageSqFt: coverage
					});
					expect(big.cartons).toBeGreaterThanOrEqual(small.cartons);
					expect(small.suppliedSqFt).toBeGreaterThanOrEqual(small.neededSqFt - 1e-9 * coverage);
					expect(small.suppliedSqFt - small.neededSqFt).toBeLessThan(coverage);
				}
			)
		);
	});
});

describe('rollTakeoff (common practice; 1 yd² = 9 ft²)', () => {
	it('tries both directions and keeps the one using less material', () => {
		// 12 × 10 ft room, 12 ft roll, 3 in trim per end.
		// Drops along x: one strip, 144 + 6 = 150 in → 13 ft ordered = 156 ft² = 17.33 yd².
		// Drops along y: one strip, 120 + 6 = 126 in → 11 ft ordered = 132 ft² = 14.67 yd². Keep y.
		const t = roll({ kind: 'rect', widthIn: 144, lengthIn: 120 });
		expect(t.direction).toBe('y');
		expect(t.drops).toEqual([{ strip: 0, startIn: 0, coverIn: 120, cutIn: 126 }]);
		expect(t.seams).toBe(0);
		expect(t.orderLinFt).toBe(11);
		expect(t.orderSqYd).toBeCloseTo(132 / 9, 12);
		expect(t.other.orderLinFt).toBe(13);
	});

	it('counts drops and seams across a wide room', () => {
		// 15 × 20 ft (180 × 240 in), 12 ft roll.
		// Along x: ⌈240 ÷ 144⌉ = 2 strips × (180 + 6) = 372 in → 31 ft; one seam 180 in long.
		// Along y: ⌈180 ÷ 144⌉ = 2 strips × (240 + 6) = 492 in → 41 ft. Keep x.
		const t = roll({ kind: 'rect', widthIn: 180, lengthIn: 240 });
		expect(t.direction).toBe('x');
		expect(t.drops).toHaveLength(2);
		expect(t.orderLinFt).toBe(31);
		expect(t.seams).toBe(1);
		expect(t.seamLengthIn).toBe(180);
		expect(t.orderSqFt).toBe(372);
		expect(t.other.orderLinFt).toBe(41);
	});

	it('cuts each strip of an L to its own length', () => {
		// L: 120 × 144 plus 60 × 72 beside it (x 120–180, y 0–72); 6 ft roll along x.
		// strip 0 (y 0–72): 180 + 6 = 186; strip 1 (y 72–144): 120 + 6 = 126 → 312 in → 26 ft.
		// The seam at y = 72 runs 120 in where both strips have floor.
		const t = roll(
			{
				kind: 'rects',
				rects: [
					{ xIn: 0, yIn: 0, widthIn: 120, lengthIn: 144 },
					{ xIn: 120, yIn: 0, widthIn: 60, lengthIn: 72 }
				]
			},
			72,
			'x'
		);
		expect(t.drops.map((d) => d.cutIn)).toEqual([186, 126]);
		expect(t.orderLinFt).toBe(26);
		expect(t.seams).toBe(1);
		expect(t.seamLengthIn).toBeCloseTo(120, 6);
	});

	it('cuts separate drops where a strip crosses both arms of a U', () => {
		// U: arms x 0–48 and 96–144 from y 0 to 144, joined by y 96–144. 12 ft roll along y
		// would be one strip; along x, strip 0 (y 0–96... ) with a 96 in roll: two arm drops.
		const t = roll(
			{
				kind: 'points',
				points: [
					[0, 0],
					[48, 0],
					[48, 96],
					[96, 96],
					[96, 0],
					[144, 0],
					[144, 144],
					[0, 144]
				]
			},
			96,
			'x'
		);
		// strip 0 (y 0–96): arms 48 + 6 and 48 + 6; strip 1 (y 96–144): 144 + 6 → 258 in
		expect(t.drops.map((d) => d.cutIn)).toEqual([54, 54, 150]);
		expect(t.cutLengthIn).toBe(258);
		// the seam at y = 96 runs along both arms: 48 + 48
		expect(t.seams).toBe(2);
		expect(t.seamLengthIn).toBeCloseTo(96, 6);
	});

	it('follows slanted walls within a strip', () => {
		// Right triangle legs 144 (x) and 144 (y), 72 in roll along x:
		// strip y 0–72 spans x 0–144; strip y 72–144 spans x 0–72.
		const t = roll(
			{
				kind: 'points',
				points: [
					[0, 0],
					[144, 0],
					[0, 144]
				]
			},
			72,
			'x'
		);
		expect(t.drops.map((d) => d.coverIn)).toEqual([144, 72]);
		expect(t.seamLengthIn).toBeCloseTo(72, 9);
	});

	it('orders at least the floor area, whatever the room', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 12, max: 400 }),
				fc.integer({ min: 12, max: 400 }),
				fc.constantFrom(72, 144, 180),
				(w, l, rw) => {
					const t = roll({ kind: 'rect', widthIn: w, lengthIn: l }, rw);
					expect(t.orderSqFt * 144).toBeGreaterThanOrEqual(w * l);
					expect(t.orderLengthIn % 12).toBe(0);
					// fewest seams first, then less material (issue 12 item 9, common practice)
					expect(t.seams).toBeLessThanOrEqual(t.other.seams);
					if (t.seams === t.other.seams) expect(t.orderSqFt).toBeLessThanOrEqual(t.other.orderSqFt);
				}
			)
		);
	});
});

describe('fastenersPerPanel', () => {
	it('counts the APA E30V Table 14 schedule for 1/4 in underlayment (published)', () => {
		// APA E30V Table 14 (published): 3 in o.c. edges, 6 in each way in the field, 3/8 in in.
		// Edge rows: ⌈(48 − 0.75) ÷ 3⌉ + 1 = 17 and ⌈(96 − 0.75) ÷ 3⌉ + 1 = 33;
		// perimeter 2 × 17 + 2 × 33 − 4 corners = 96. Field lines every 6 in: 7 × 15 = 105.
		const c = fastenersPerPanel(panel, schedules.apa_quarter_in);
		expect(c).toMatchObject({ perimeter: 96, field: 105, perPanel: 201 });
		expect(c.source).toBe('APA E30V Table 14 (published)');
	});

	it('counts the 11/32 in schedule (published) and the tighter staple schedule (common practice)', () => {
		// APA E30V Table 14 (published): 6 in edges, 8 in field:
		// ⌈47.25 ÷ 6⌉ + 1 = 9, ⌈95.25 ÷ 6⌉ + 1 = 17 → 2·9 + 2·17 − 4 = 48; field 5 × 11 = 55
		expect(fastenersPerPanel(panel, schedules.apa_11_32_in).perPanel).toBe(103);
		// APA E30V Table 14 notes (published): 6 in edges, 12 in field: 48 + 3 × 7 = 69
		expect(fastenersPerPanel(panel, schedules.apa_over_half_in).perPanel).toBe(69);
		// common practice: staples 2 in edges, 6 in grid: 2·25 + 2·49 − 4 = 144; + 105 = 249
		expect(fastenersPerPanel(panel, schedules.staples).perPanel).toBe(249);
	});
});

describe('underlaymentTakeoff', () => {
	it('counts 4 × 8 ft panels with waste and fasteners in boxes', () => {
		// APA product literature (published): 4 × 8 ft = 32 ft². 300 ft² × 1.1 ÷ 32 = 10.3 → 11
		const u = underlaymentTakeoff({
			areaSqFt: 300,
			wastePct: 10,
			panel,
			schedule: schedules.apa_quarter_in,
			perBox: 1000
		});
		expect(u.panels).toBe(11);
		expect(u.fasteners).toBe(11 * 201);
		expect(u.boxes).toBe(3);
		expect(
			underlaymentTakeoff({ areaSqFt: 64, wastePct: 0, panel, schedule: schedules.staples }).panels
		).toBe(2);
	});
});

describe('patchTakeoff', () => {
	it('sums length × width × depth and rounds up to containers', () => {
		// seam 96 × 1/4 × 1/8 = 3 in³; dent 3 × 2 × 1/16 = 0.375 in³; × 1.1 = 3.71 in³ < 231 in³
		const p = patchTakeoff({
			voids: [
				{ lengthIn: 96, widthIn: 0.25, depthIn: 0.125 },
				{ lengthIn: 3, widthIn: 2, depthIn: 0.0625 }
			],
			wastePct: 10,
			container: { volumeCuIn: 231 }
		});
		expect(p.volumeCuIn).toBeCloseTo(3.375, 12);
		expect(p.containers).toBe(1);
		// a 1 US gal pail is 231 in³ exactly (published definition)
		expect(p.volumeUsGal).toBeCloseTo(3.375 / 231, 12);
	});

	it('takes a container by coverage at a depth', () => {
		// 30 ft² at 1/8 in = 30 × 144 × 0.125 = 540 in³
		expect(containerVolume({ coverageSqFt: 30, atDepthIn: 0.125 })).toBe(540);
		const p = patchTakeoff({
			voids: [{ lengthIn: 120, widthIn: 12, depthIn: 0.5 }],
			wastePct: 0,
			container: { coverageSqFt: 30, atDepthIn: 0.125 }
		});
		// 720 in³ ÷ 540 = 1.33 → 2
		expect(p.containers).toBe(2);
	});
});

describe('levellerTakeoff (coverage = yield × 12 ÷ depth, TRADE.md Quantities)', () => {
	it('covers 21.6 ft² per 0.45 ft³ bag at 1/4 in', () => {
		// 0.45 × 12 ÷ 0.25 = 21.6 ft²; 100 ft² ÷ 21.6 = 4.63 → 5 bags
		const t = levellerTakeoff({
			areas: [{ areaSqFt: 100, depthIn: 0.25 }],
			bagYieldCuFt: 0.45,
			wastePct: 0
		});
		expect(t.coverageSqFtPerBag).toBeCloseTo(21.6, 12);
		expect(t.bags).toBe(5);
	});

	it('adds several areas before rounding, and fills exactly at a whole bag', () => {
		// 43.2 ft² at 1/4 in = 0.9 ft³ = exactly 2 bags
		expect(
			levellerTakeoff({
				areas: [{ areaSqFt: 43.2, depthIn: 0.25 }],
				bagYieldCuFt: 0.45,
				wastePct: 0
			}).bags
		).toBe(2);
		const t = levellerTakeoff({
			areas: [
				{ areaSqFt: 10, depthIn: 0.25 },
				{ areaSqFt: 10, depthIn: 0.125 }
			],
			bagYieldCuFt: 0.45,
			wastePct: 0
		});
		// (10 × 0.25 + 10 × 0.125) ÷ 12 = 0.3125 ft³ → 1 bag
		expect(t.volumeCuFt).toBeCloseTo(0.3125, 12);
		expect(t.bags).toBe(1);
		expect(t.coverageSqFtPerBag).toBeUndefined();
	});
});

describe('holeRepair (common practice, TRADE.md "Subfloor repairs")', () => {
	const base = {
		newUnderlayment: false,
		ignoreUnderIn: 1,
		subfloorThicknessIn: 0.625,
		joistSpacingIn: 16,
		joistThicknessIn: 1.5,
		backingLapIn: 2,
		roughCutAllowanceIn: 0.5
	};

	it('blocks under tile: two blocks across the bay plus a flush infill', () => {
		// common practice: blocking between joists at 16 in o.c.: 16 − 1.5 = 14.5 in, rough cut 15 in
		const r = holeRepair({ ...base, widthIn: 6, lengthIn: 4, method: 'blocking' });
		expect(r.ignored).toBe(false);
		expect(r.pieces).toEqual([
			{
				name: 'blocking',
				count: 2,
				lengthIn: 14.5,
				widthIn: 3.5,
				thicknessIn: 1.5,
				cutLengthIn: 15,
				cutWidthIn: 4
			},
			{
				name: 'infill',
				count: 1,
				lengthIn: 4,
				widthIn: 6,
				thicknessIn: 0.625,
				cutLengthIn: 4.5,
				cutWidthIn: 6.5
			}
		]);
	});

	it('backs a hole under nailed hardwood for a nailing surface', () => {
		const r = holeRepair({ ...base, widthIn: 6, lengthIn: 4, method: 'backing' });
		// Issue 12 item 5: backing fits the clear bay between joists, 16 − 1.5 = 14.5 in
		// (arithmetic, TRADE.md), and laps the hole 2 in at each end along the joists: 4 + 4 = 8 in
		expect(r.pieces.map((p) => [p.name, p.count, p.lengthIn, p.widthIn])).toEqual([
			['backing', 1, 8, 14.5],
			['infill', 1, 4, 6]
		]);
		// 20 in across joists at 16 in o.c. is wider than the 14.5 in clear bay: 1 + ⌈5.5 ÷ 16⌉ = 2
		// bays, a backing piece in each
		const wide = holeRepair({ ...base, widthIn: 20, lengthIn: 4, method: 'backing' });
		expect(wide.pieces[0]).toMatchObject({ name: 'backing', count: 2, widthIn: 14.5 });
	});

	it('ignores holes under 1 in under new underlayment; exactly 1 in is repaired', () => {
		// common practice, no published source: holes smaller than about 1 in
		const small = { ...base, newUnderlayment: true, method: 'blocking_underlayment' as const };
		expect(holeRepair({ ...small, widthIn: 0.75, lengthIn: 0.5 }).ignored).toBe(true);
		expect(holeRepair({ ...small, widthIn: 1, lengthIn: 0.5 }).ignored).toBe(false);
		// Issue 12 item 8 (common practice): with nothing over it, a small hole is filled with
		// patch, never blocked
		const bare = holeRepair({ ...small, widthIn: 0.75, lengthIn: 0.5, newUnderlayment: false });
		expect(bare).toMatchObject({ ignored: false, patched: true, pieces: [] });
		expect(holeRepair({ ...small, widthIn: 4, lengthIn: 4 }).needsUnderlayment).toBe(true);
	});

	it('blocks every bay a wide hole crosses', () => {
		// 20 in across joists at 16 in: ⌈20 ÷ 16⌉ = 2 bays → 4 blocks
		expect(
			holeRepair({ ...base, widthIn: 20, lengthIn: 6, method: 'blocking' }).pieces[0].count
		).toBe(4);
	});
});

describe('roughCut', () => {
	it('adds 1/2 in for play (common practice, no published source)', () => {
		expect(roughCut(30)).toBe(30.5);
		expect(roughCut(30, 0.25)).toBe(30.25);
	});
});
