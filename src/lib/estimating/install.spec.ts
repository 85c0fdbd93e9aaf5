/**
 * Issue 12: the rules a practitioner found wrong, and the rest of a real install, each with a
 * worked example and its source (published / secondary / common practice / memory).
 */
import { describe, expect, it } from 'vitest';
import { estimate } from './estimate';
import type { EstimateInput, RoomMeasure } from './index';
import type { PriceBook } from './pricing';
import { samplePriceBook } from './sample';
import { defaultSettings } from './settings';
import {
	flatnessCheck,
	iJoistCheck,
	joistCheck,
	panelMinimumIn,
	probeDepthIn,
	sheathingChecks
} from './substrate';
import { baysSpanned, holeRepair, rollTakeoff } from './takeoff';

const book: PriceBook = structuredClone(samplePriceBook);
book.floors.push({
	id: 'oak-solid',
	name: 'Solid oak strip 2 1/4 in',
	kind: 'hardwood',
	fastening: 'nailed',
	cartonSqFt: 20,
	boardWidthIn: 2.25,
	thicknessIn: 0.75,
	material: { basis: 'carton', priceCents: 9_000 },
	labourCentsPerSqFt: 400,
	payCentsPerSqFt: 250
});
const run = (rooms: RoomMeasure[], priceBook: PriceBook = book, settings = defaultSettings) =>
	estimate({ job: { rooms, builtYear: 2005 }, settings, priceBook } satisfies EstimateInput);

const room = (over: Partial<RoomMeasure> = {}): RoomMeasure => ({
	id: 'a',
	name: 'Room A',
	shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
	floor: { productId: 'lvp-grey', layout: 'straight' },
	subfloor: { kind: 'plywood', thicknessIn: 0.625 },
	...over
});
const slabRoom = (id: string, over: Partial<RoomMeasure> = {}): RoomMeasure =>
	room({
		id,
		name: `Basement ${id}`,
		// 120 ft² each
		shape: { kind: 'rect', widthIn: 120, lengthIn: 144 },
		subfloor: { kind: 'concrete', slab: { id: 'B', thicknessIn: 4, drying: 'top' } },
		readings: { rhPct: [70] },
		...over
	});
const keys = (r: ReturnType<typeof run>) => r.lines.map((l) => l.key);

describe('1. nominal and actual panel thickness', () => {
	const hardwood = (thicknessIn: number, kind: 'plywood' | 'osb' = 'plywood') =>
		sheathingChecks(
			{ kind, thicknessIn, joistSpacingIn: 16, floorKind: 'hardwood' },
			defaultSettings.sheathing
		)[0];

	it('passes 19/32 in plywood (a "5/8 in" panel) under nailed hardwood at 16 in o.c.', () => {
		// NWFA guidance in Wood Floor Business (published): 5/8 in plywood at joists ≤ 16 in;
		// PS 1 / PS 2 Performance Categories (secondary): 5/8 in panels measure 19/32 in
		expect(panelMinimumIn(5 / 8)).toBe(19 / 32);
		const c = hardwood(19 / 32);
		expect(c.pass).toBe(true);
		expect(c.message).toContain('19/32" (5/8 in Performance Category)');
		expect(c.message).toContain('compared by actual thickness');
		expect(hardwood(5 / 8).pass).toBe(true);
	});

	it('fails 15/32 in ("1/2 in") and says which name it uses', () => {
		const c = hardwood(15 / 32);
		expect(c.pass).toBe(false);
		expect(c.message).toContain('15/32" (1/2 in Performance Category)');
		expect(c.suggestedPrep[0].kind).toBe('subfloor_overlay');
		// 23/32 in OSB is the NWFA's own figure (an actual thickness): "3/4 in" OSB meets it
		expect(hardwood(23 / 32, 'osb').pass).toBe(true);
		expect(hardwood(3 / 4, 'osb').pass).toBe(true);
	});

	it('no longer prices a new subfloor layer for a 19/32 in subfloor in a whole estimate', () => {
		const r = run([
			room({
				floor: { productId: 'oak-solid', layout: 'straight' },
				subfloor: { kind: 'plywood', thicknessIn: 19 / 32 }
			})
		]);
		expect(keys(r)).not.toContain('prep:subfloor_overlay');
	});
});

describe('2. concrete moisture tests per slab', () => {
	it('counts three 120 ft² rooms on one slab as one 360 ft² slab: three tests in all', () => {
		// ASTM F2170 §10.1 (secondary): 3 tests for the first 1000 ft²
		const r = run([slabRoom('1'), slabRoom('2'), slabRoom('3')]);
		const counts = r.findings.filter((f) => f.check === 'moisture_rh_tests');
		expect(counts).toHaveLength(1);
		expect(counts[0]).toMatchObject({ pass: true, measured: 3, limit: 3, roomId: '1' });
		expect(counts[0].message).toContain('3 of 3 RH probes for 360 ft² of slab');
		expect(keys(r)).not.toContain('prep:moisture_test');
		// Each room as its own slab (no slab named): 3 tests each, 2 missing in each
		const apart = run(
			['1', '2', '3'].map((id) => slabRoom(id, { subfloor: { kind: 'concrete' } }))
		);
		const tests = apart.lines.filter((l) => l.key === 'prep:moisture_test');
		expect(tests.map((l) => l.qty)).toEqual([2, 2, 2]);
	});

	it('sets the probe depth by how the slab dries, and prices the tests still needed', () => {
		// ASTM F2170 §10.2 (secondary): 40 % of 4 in = 1.6 in from the top; 20 % = 0.8 in both ways
		expect(probeDepthIn(4, 'top')).toBeCloseTo(1.6, 12);
		expect(probeDepthIn(4, 'both')).toBeCloseTo(0.8, 12);
		const r = run([slabRoom('1', { shape: { kind: 'rect', widthIn: 360, lengthIn: 480 } })]);
		// 1200 ft²: 3 + ⌈200 ÷ 1000⌉ = 4 tests; 1 taken, 3 to take
		const f = r.findings.find((x) => x.check === 'moisture_rh_tests')!;
		expect(f).toMatchObject({ pass: false, measured: 1, limit: 4 });
		expect(f.message).toContain('probes 1 5/8" deep (40 % of a 4" slab drying from the top only)');
		expect(f.message).toContain('read 24 h after the probes are set');
		expect(r.lines.find((l) => l.key === 'prep:moisture_test')?.qty).toBe(3);
		// ASTM F2170 (secondary): the probes equilibrate 24 h before reading; the schedule waits
		const tests = r.schedule.steps.find((s) => s.key === 'tests');
		expect(tests?.cureHours).toBe(24);
	});

	it('prices and schedules the tests a slab needs when none were taken, before the floor', () => {
		// ASTM F2170 §10.1 (secondary): 3 probes for the first 1000 ft²; two 120 ft² rooms on
		// slab B with no reading under vinyl plank: 3 probes for the slab, listed with its first room
		const none = (id: string) => slabRoom(id, { readings: {} });
		const r = run([none('1'), none('2')]);
		const f = r.findings.filter((x) => x.check === 'moisture_rh_tests');
		expect(f).toHaveLength(1);
		expect(f[0]).toMatchObject({ pass: false, measured: 0, limit: 3, roomId: '1' });
		expect(f[0].message).toContain('Slab B: 0 of 3 RH probes for 240 ft² of slab');
		expect(r.lines.filter((l) => l.key === 'prep:moisture_test').map((l) => l.qty)).toEqual([3]);
		// tests first, and the floor waits the probes' 24 h (ASTM F2170, secondary)
		const order = r.schedule.steps.map((s) => s.key);
		expect(order.indexOf('tests')).toBeLessThan(order.indexOf('install'));
		expect(r.schedule.steps.find((s) => s.key === 'tests')?.cureHours).toBe(24);
		// carpet on a slab has no moisture limit here: nothing priced
		const carpet = run([
			slabRoom('1', { readings: {}, floor: { productId: 'carpet-12', layout: 'straight' } })
		]);
		expect(keys(carpet)).not.toContain('prep:moisture_test');
	});

	it('waits the calcium chloride dishes’ exposure before the next step', () => {
		// ASTM F1869 (secondary): dishes exposed 60–72 h; the store's setting is 72 h
		const r = run([
			slabRoom('1', {
				readings: { calciumChloride: [{ gainGrams: 10, areaSqFt: 0.25, hours: 72 }] }
			})
		]);
		expect(r.schedule.steps.find((s) => s.key === 'tests')?.cureHours).toBe(72);
		expect(r.findings.find((f) => f.check === 'moisture_mver_tests')?.message).toContain(
			'dishes stay sealed 72 h before weighing'
		);
	});
});

describe('3. order of wet-slab work', () => {
	it('tests, then the barrier on the bare slab, then primer and leveller, then the floor', () => {
		// common practice (TRADE.md); the products' data sheets govern
		const r = run([
			slabRoom('1', {
				readings: { rhPct: [82], flatness: [{ spanIn: 120, gapIn: 0.375, areaSqFt: 20 }] }
			})
		]);
		const order = r.schedule.steps.map((s) => s.key);
		const at = (k: string) => order.indexOf(k);
		expect(at('tests')).toBeGreaterThanOrEqual(0);
		expect(at('tests')).toBeLessThan(at('barrier'));
		expect(at('barrier')).toBeLessThan(at('level'));
		expect(at('level')).toBeLessThan(at('install'));
		expect(keys(r)).toEqual(expect.arrayContaining(['prep:moisture_barrier', 'prep:primer']));
	});

	it('patches a slab’s dents after the barrier, with the leveller, never under the barrier', () => {
		// common practice (TRADE.md "order on a wet slab"): the barrier goes on the bare slab; patch
		// and leveller go over the primed barrier. Over wood, patch still goes before the panels.
		const r = run([
			slabRoom('1', {
				readings: { rhPct: [82], flatness: [{ spanIn: 120, gapIn: 0.375, areaSqFt: 20 }] },
				repairs: { dents: [{ lengthIn: 6, widthIn: 6, depthIn: 0.25 }] }
			})
		]);
		expect(keys(r)).toContain('prep:dent_patch');
		const order = r.schedule.steps.map((s) => s.key);
		expect(order).not.toContain('patch');
		expect(order.indexOf('barrier')).toBeLessThan(order.indexOf('level'));
		const level = r.schedule.steps.find((s) => s.key === 'level')!;
		expect(level.label).toBe('Prime and level low spots, patch slab cracks and dents');
		// the dent's hours are in that step: primer and level alone take less
		const without = run([
			slabRoom('1', {
				readings: { rhPct: [82], flatness: [{ spanIn: 120, gapIn: 0.375, areaSqFt: 20 }] }
			})
		]);
		expect(level.hours).toBeGreaterThan(
			without.schedule.steps.find((s) => s.key === 'level')!.hours
		);
	});
});

describe('4. short straightedges', () => {
	const tile = defaultSettings.flatness.rules.tile;
	it('holds a 2 ft straightedge under tile to 1/16 in in 12 in, not 1/4 in in 10 ft', () => {
		// ANSI A108.02 (secondary, via NTCA): 1/4 in in 10 ft and 1/16 in in 12 in
		const c = flatnessCheck({ spanIn: 24, gapIn: 3 / 32 }, tile);
		expect(c.limit).toBe(1 / 16);
		expect(c.pass).toBe(false);
		// a 10 ft straightedge keeps the 10 ft rule
		expect(flatnessCheck({ spanIn: 120, gapIn: 3 / 32 }, tile).pass).toBe(true);
	});

	it('never says "3/16 in, allowed 3/16 in" for a fail: exact values, enough precision', () => {
		// NWFA (memory): 3/16 in in 6 ft under wood; 0.19 in is over 0.1875 in
		const c = flatnessCheck({ spanIn: 72, gapIn: 0.19 }, defaultSettings.flatness.rules.wood);
		expect(c.pass).toBe(false);
		expect(c.message).toContain('0.19 in');
		expect(c.message).toContain('0.188 in');
		expect(c.message).toMatch(/fails/);
		// exactly at the tolerance passes
		expect(
			flatnessCheck({ spanIn: 72, gapIn: 3 / 16 }, defaultSettings.flatness.rules.wood).pass
		).toBe(true);
	});
});

describe('5. backing and blocking fit the bay', () => {
	const base = {
		newUnderlayment: false,
		ignoreUnderIn: 1,
		subfloorThicknessIn: 0.75,
		joistThicknessIn: 1.5,
		backingLapIn: 2,
		roughCutAllowanceIn: 0.5
	};
	it('cuts blocking to the clear bay, one pair a bay (arithmetic, TRADE.md)', () => {
		// 24 in o.c.: 24 − 1.5 = 22.5 in clear; a 30 in hole opens 1 + ⌈7.5 ÷ 24⌉ = 2 bays → 4 blocks
		const r = holeRepair({
			...base,
			widthIn: 30,
			lengthIn: 6,
			method: 'blocking',
			joistSpacingIn: 24
		});
		expect(r.pieces[0]).toMatchObject({ name: 'blocking', count: 4, lengthIn: 22.5 });
		// the infill is cut from subfloor-thickness plywood (3/4 in), not the 1/4 in underlayment
		expect(r.pieces[1]).toMatchObject({ name: 'infill', thicknessIn: 0.75 });
	});

	it('counts the bays a hole opens wherever it lies, not width ÷ spacing (arithmetic)', () => {
		// 16 in o.c., 1.5 in joists: a clear bay is 14.5 in; two bays and the joist between them
		// hold at most 14.5 + 16 = 30.5 in; three at most 46.5 in
		expect(baysSpanned(14.5, 16, 14.5)).toBe(1);
		expect(baysSpanned(15, 16, 14.5)).toBe(2);
		expect(baysSpanned(30.5, 16, 14.5)).toBe(2);
		expect(baysSpanned(32, 16, 14.5)).toBe(3);
		const at16 = (widthIn: number, method: 'blocking' | 'backing') =>
			holeRepair({ ...base, widthIn, lengthIn: 10, method, joistSpacingIn: 16 }).pieces[0];
		// a 15 in hole cannot sit inside one 14.5 in bay: it bares a joist, a pair of blocks each side
		expect(at16(15, 'blocking')).toMatchObject({ name: 'blocking', count: 4, lengthIn: 14.5 });
		// a 32 in hole bares two joists: three bays, three backing pieces each cut to the clear bay
		expect(at16(32, 'backing')).toMatchObject({ name: 'backing', count: 3, widthIn: 14.5 });
	});
});

describe('6. code-table spans and I-joists', () => {
	const j = defaultSettings.joists;
	it('passes a joist at its printed span, and shows the allowed deflection in inches', () => {
		// IRC Table R502.3.1(2) (published) prints spans to the inch: a span at the longest
		// span rounded to the inch must not fail, nor be priced for sistering
		const probe = joistCheck(
			{ size: '2x10', species: 'douglas_fir_larch', spacingIn: 16, spanIn: 180, ratio: 360 },
			j
		);
		const printed = Math.round(probe.maxSpanIn);
		const at = joistCheck(
			{ size: '2x10', species: 'douglas_fir_larch', spacingIn: 16, spanIn: printed, ratio: 360 },
			j
		);
		expect(at.checks.every((c) => c.pass)).toBe(true);
		expect(at.checks.flatMap((c) => c.suggestedPrep)).toEqual([]);
		// L/360 at 180 in allows 180 ÷ 360 = 0.5 in (IRC Table R301.7, published)
		expect(probe.allowedDeflectionIn).toBe(0.5);
		expect(probe.checks[0].message).toContain('(at most 0.500 in)');
	});

	it('says a printed span passes, and names the same longest span the check passes', () => {
		// 2x8 Douglas Fir-Larch No.2 at 12 in: deflection governs at 169.59 in exactly; IRC 2012
		// Table R502.3.1(2) (secondary, see substrate.spec.ts) prints 14-2 = 170 in. At 170 in
		// L/Δ = 357.6 < 360 by the fraction the print rounded away: it passes, and says why.
		const at = joistCheck(
			{ size: '2x8', species: 'douglas_fir_larch', spacingIn: 12, spanIn: 170, ratio: 360 },
			j
		);
		expect(at.maxSpanIn).toBeCloseTo(169.59, 2);
		expect(at.lOverDelta).toBeLessThan(360);
		expect(at.checks[0].pass).toBe(true);
		expect(at.checks[0].message).toContain('within the inch the span table rounds');
		// L/360 at 170 in allows 170 ÷ 360 = 0.472 in, shown beside L/Δ
		expect(at.checks[0].message).toContain('needs L/360 (at most 0.472 in)');
		// the longest span named is the one that passes, never one inch short of the span that did
		expect(at.passSpanIn).toBe(170);
		expect(at.checks[0].message).toContain(`Longest span that passes: 14' 2"`);
		expect(
			joistCheck(
				{ size: '2x8', species: 'douglas_fir_larch', spacingIn: 12, spanIn: 171, ratio: 360 },
				j
			).checks[0].pass
		).toBe(false);
		// in a whole estimate under tile (L/360): no sistering, no consult priced
		const r = run([
			room({
				floor: { productId: 'tile-12', layout: 'straight' },
				joists: { size: '2x8', species: 'douglas_fir_larch', spacingIn: 12, spanIn: 170 }
			})
		]);
		expect(r.findings.filter((f) => f.check.startsWith('joist_')).every((f) => f.pass)).toBe(true);
		expect(keys(r)).not.toContain('prep:joist_sister');
		expect(keys(r)).not.toContain('prep:structural_consult');
	});

	it('checks I-joists from the maker’s EI at L/480 under tile, or asks for EI', () => {
		// δ = 5wL⁴/(384EI) (AISC Manual Table 3-23 case 1): w = 40 psf × 16 in ÷ 144 = 4.444 lb/in,
		// L = 192 in, EI = 300 × 10⁶ lb·in² → δ = 5 × 4.444 × 192⁴ ÷ (384 × 3 × 10⁸) = 0.2621 in,
		// L/δ = 732 ≥ 480 (NTCA Reference Manual, published)
		const c = iJoistCheck({ eiLbIn2: 300e6, spacingIn: 16, spanIn: 192, ratio: 480 }, j);
		expect(c.measured).toBeCloseTo(192 / ((5 * (640 / 144) * 192 ** 4) / (384 * 300e6)), 9);
		expect(Math.floor(c.measured)).toBe(732);
		expect(c.pass).toBe(true);
		const tile = room({
			floor: { productId: 'tile-12', layout: 'straight' },
			joists: { size: '2x10', species: 'hem_fir', spacingIn: 16, spanIn: 192, iJoist: {} }
		});
		expect(run([tile]).warnings.map((w) => w.message)).toContain(
			"I-joists: enter EI from the maker's data to check deflection (L/480 under this floor)"
		);
		const withEi = run([
			{ ...tile, joists: { ...tile.joists!, iJoist: { eiLbIn2: 300e6 } } }
		]).findings.find((f) => f.check === 'joist_deflection');
		expect(withEi).toMatchObject({ pass: true, limit: 480 });
	});
});

describe('7. tile and stone need their subfloor', () => {
	const tileRoom = (thicknessIn: number, layers = 1, productId = 'tile-12') =>
		room({
			floor: { productId, layout: 'straight' },
			subfloor: { kind: 'plywood', thicknessIn, layers }
		});
	const stoneBook: PriceBook = structuredClone(book);
	stoneBook.floors.push({
		id: 'stone',
		name: 'Honed stone 12 in',
		kind: 'stone_tile',
		cartonSqFt: 10,
		tileEdgesIn: [12, 12],
		material: { basis: 'carton', priceCents: 9_000 },
		labourCentsPerSqFt: 800,
		payCentsPerSqFt: 500
	});

	it('adds a second layer under ceramic over one thin layer, a backer or membrane always', () => {
		// TCNA Handbook floor methods (memory): one layer ≥ 5/8 in (19/32 in actual) with backer
		const thin = run([tileRoom(15 / 32)]);
		const f = thin.findings.find((x) => x.check === 'tile_subfloor')!;
		expect(f.pass).toBe(false);
		expect(f.source).toContain('TCNA Handbook');
		expect(keys(thin)).toEqual(
			expect.arrayContaining(['prep:subfloor_overlay', 'prep:tile_backer', 'prep:tile_setting'])
		);
		const ok = run([tileRoom(19 / 32)]);
		expect(ok.findings.find((x) => x.check === 'tile_subfloor')?.pass).toBe(true);
		expect(keys(ok)).not.toContain('prep:subfloor_overlay');
	});

	it('asks two layers under natural stone', () => {
		const one = run([tileRoom(0.75, 1, 'stone')], stoneBook);
		expect(one.findings.find((x) => x.check === 'tile_subfloor')?.pass).toBe(false);
		const two = run([tileRoom(0.75, 2, 'stone')], stoneBook);
		expect(two.findings.find((x) => x.check === 'tile_subfloor')?.pass).toBe(true);
	});

	it('lays a panel layer over board sheathing before tile or stone', () => {
		// TCNA Handbook floor methods (memory): tile goes over a panel subfloor, never boards alone
		const boards = (productId: string, pb: PriceBook = book) =>
			run(
				[
					room({
						floor: { productId, layout: 'straight' },
						subfloor: { kind: 'board', thicknessIn: 0.75 }
					})
				],
				pb
			);
		for (const r of [boards('tile-12'), boards('stone', stoneBook)]) {
			const f = r.findings.find((x) => x.check === 'tile_subfloor')!;
			expect(f.pass).toBe(false);
			expect(f.message).toContain('over board sheathing: lay a structural panel layer');
			expect(f.source).toContain('TCNA Handbook');
			expect(keys(r)).toEqual(
				expect.arrayContaining(['prep:subfloor_overlay', 'prep:tile_backer'])
			);
		}
		// vinyl plank over the same boards: no tile rule
		expect(boards('lvp-grey').findings.some((x) => x.check === 'tile_subfloor')).toBe(false);
	});

	it('refuses nailed solid hardwood on a slab, with the reason', () => {
		const r = run([
			room({
				floor: { productId: 'oak-solid', layout: 'straight' },
				subfloor: { kind: 'concrete' }
			})
		]);
		expect(r.errors).toEqual([
			expect.objectContaining({
				path: 'job.rooms.0.floor.productId',
				message: expect.stringContaining(
					'nailed solid hardwood cannot be fastened to a concrete slab'
				)
			})
		]);
	});
});

describe('8. small holes, declined underlayment', () => {
	it('fills a small hole with patch when nothing covers it, and never adds declined panels', () => {
		// common practice (TRADE.md "Subfloor repairs"): under about 1 in, new panels cover it
		const holes = { holes: [{ widthIn: 0.75, lengthIn: 0.75 }] };
		const covered = run([room({ repairs: holes })]);
		expect(keys(covered)).not.toContain('prep:hole_repair');
		expect(keys(covered)).not.toContain('supply:patch');
		const declined = run([room({ underlayment: false, repairs: holes })]);
		expect(keys(declined)).not.toContain('prep:hole_repair');
		expect(keys(declined)).toContain('supply:patch');
		expect(keys(declined)).not.toContain('prep:underlayment');
		// a big hole under a declined underlayment: blocked, infill skimmed, still no panels
		const big = run([
			room({ underlayment: false, repairs: { holes: [{ widthIn: 6, lengthIn: 4 }] } })
		]);
		expect(keys(big)).toContain('prep:hole_repair');
		expect(keys(big)).not.toContain('prep:underlayment');
	});
});

describe('9. sheet goods and roll goods', () => {
	it('lays a 3 ft 6 in × 16 ft 4 in hall in 6 ft sheet in one 17 ft piece, no seams', () => {
		// common practice (TRADE.md "sheet goods seams"): no cross seam where a run fits in one piece
		const t = rollTakeoff({
			polygon: [
				[
					[0, 0],
					[42, 0],
					[42, 196],
					[0, 196]
				]
			],
			isRect: true,
			rollWidthIn: 72,
			trimPerEndIn: 3,
			orderIncrementIn: 12
		});
		expect(t.seams).toBe(0);
		expect(t.drops).toHaveLength(1);
		// 196 + 2 × 3 = 202 in → 17 ft ordered
		expect(t.orderLinFt).toBe(17);
		// the other way: ⌈196 ÷ 72⌉ = 3 drops, 2 seams across the hall
		expect(t.other.seams).toBe(2);
	});

	it('follows the direction chosen on the measure and draws the seams', () => {
		// 13 × 20 ft in 12 ft carpet: one seam either way; drops along x stack in y, seam at 12 ft
		const carpet = (rollDirection?: 'x' | 'y') =>
			run([
				room({
					shape: { kind: 'rect', widthIn: 240, lengthIn: 156 },
					floor: { productId: 'carpet-12', layout: 'straight', rollDirection }
				})
			]).rooms[0];
		const x = carpet('x');
		expect(x.floor?.roll?.direction).toBe('x');
		expect(x.outline?.seams).toEqual([{ x1: 0, y1: 144, x2: 240, y2: 144 }]);
		const y = carpet('y');
		expect(y.outline?.seams).toEqual([{ x1: 144, y1: 0, x2: 144, y2: 156 }]);
	});

	it('runs seams along the main light when that costs no extra seam', () => {
		// common practice (TRADE.md "sheet goods seams"): no seam first, then along the light,
		// then less material. 10 × 10 ft in 6 ft sheet: one seam either way, the same material.
		const square = (light?: 'x' | 'y', rollDirection?: 'x' | 'y') =>
			run([
				room({
					shape: { kind: 'rect', widthIn: 120, lengthIn: 120 },
					floor: { productId: 'sheet-6', layout: 'straight', light, rollDirection }
				})
			]).rooms[0];
		expect(square().floor?.roll?.direction).toBe('x');
		const lit = square('y');
		expect(lit.floor?.roll?.direction).toBe('y');
		expect(lit.floor?.roll?.rule).toContain('seams along the main light');
		expect(lit.outline?.seams).toEqual([{ x1: 72, y1: 0, x2: 72, y2: 120 }]);
		// the light never buys a seam: the 3 ft 6 in × 16 ft 4 in hall stays one piece
		const hall = run([
			room({
				shape: { kind: 'rect', widthIn: 42, lengthIn: 196 },
				floor: { productId: 'sheet-6', layout: 'straight', light: 'x' }
			})
		]).rooms[0];
		expect(hall.floor?.roll).toMatchObject({ direction: 'y', seams: 0, orderLinFt: 17 });
		// and the salesperson's own choice still wins
		expect(square('y', 'x').floor?.roll?.direction).toBe('x');
	});

	it('draws each seam only where floor lies on both sides of it (an L-shaped room)', () => {
		// 20 × 8 ft 4 in with a 8 ft 4 in × 8 ft 4 in leg; 6 ft sheet run along x: strips end at
		// 72 and 144 in. The first seam runs the full 240 in; the second only across the 100 in leg.
		const r = run([
			room({
				floor: { productId: 'sheet-6', layout: 'straight' },
				shape: {
					kind: 'points',
					points: [
						[0, 0],
						[240, 0],
						[240, 100],
						[100, 100],
						[100, 200],
						[0, 200]
					]
				}
			})
		]).rooms[0];
		expect(r.floor?.roll?.direction).toBe('x');
		expect(r.floor?.roll?.seams).toBe(2);
		expect(r.floor?.roll?.seamLengthIn).toBe(340);
		expect(r.outline?.seams).toEqual([
			{ x1: 0, y1: 72, x2: 240, y2: 72 },
			{ x1: 0, y1: 144, x2: 100, y2: 144 }
		]);
		// the seams drawn add up to the seam length priced
		const drawn = r.outline!.seams!.reduce((t, l) => t + Math.hypot(l.x2 - l.x1, l.y2 - l.y1), 0);
		expect(drawn).toBe(r.floor?.roll?.seamLengthIn);
	});
});

describe('10. prep that new underlayment covers', () => {
	it('skims the underlayment before sheet vinyl, after the panels, and says spacing was assumed', () => {
		const r = run([
			room({
				floor: { productId: 'sheet-6', layout: 'straight' },
				repairs: {
					seams: [{ lengthIn: 48, widthIn: 0.25, depthIn: 0.125 }],
					holes: [{ widthIn: 6, lengthIn: 4 }]
				}
			})
		]);
		expect(keys(r)).toContain('prep:underlayment_skim');
		expect(keys(r)).not.toContain('prep:seam_patch');
		const order = r.schedule.steps.map((s) => s.key);
		expect(order.indexOf('holes')).toBeLessThan(order.indexOf('underlayment'));
		expect(order.indexOf('underlayment')).toBeLessThan(order.indexOf('skim'));
		expect(r.warnings.map((w) => w.message).join('\n')).toContain(
			'16 in o.c. (assumed, not found)'
		);
	});
});

describe('10. seams and dents filled only where the floor goes straight on', () => {
	it('fills them under vinyl laid straight on, not under tile, carpet, underlay or nailed wood', () => {
		// common practice (TRADE.md "Subfloor repairs"): resilient floors telegraph open seams and
		// dents; a backer, pad, underlay, new panels or a nailed wood floor bridge them
		const repairs = {
			seams: [{ lengthIn: 48, widthIn: 0.25, depthIn: 0.125 }],
			dents: [{ lengthIn: 3, widthIn: 2, depthIn: 0.0625 }]
		};
		const on = (productId: string, over: Partial<RoomMeasure> = {}) =>
			run([room({ floor: { productId, layout: 'straight' }, repairs, ...over })]);
		const straight = on('lvp-grey', { underlayment: false });
		expect(keys(straight)).toEqual(expect.arrayContaining(['prep:seam_patch', 'prep:dent_patch']));
		for (const [productId, by] of [
			['lvp-grey', 'the new underlayment'],
			['tile-12', 'the backer board or membrane'],
			['carpet-12', 'the carpet pad'],
			['oak-7', 'the nailed wood floor']
		] as const) {
			const r = on(productId);
			expect(keys(r), productId).not.toContain('prep:seam_patch');
			expect(keys(r), productId).not.toContain('prep:dent_patch');
			expect(r.warnings.map((w) => w.message)).toContain(
				`Open seams and dents in the old subfloor are covered by ${by}: not filled, not charged`
			);
		}
	});
});

describe('10. thin vinyl shows the underlayment: skimmed like sheet vinyl', () => {
	it('skims the panels under glued or 1/8 in vinyl plank, not under a thick floating plank', () => {
		// common practice (TRADE.md "Subfloor repairs"): resilient floors telegraph seams and heads
		const thin: PriceBook = structuredClone(book);
		thin.floors.push(
			{
				id: 'lvt-glued',
				name: 'Glue-down vinyl plank 2.5 mm',
				kind: 'vinyl_plank',
				fastening: 'glued',
				cartonSqFt: 36,
				thicknessIn: 0.1,
				material: { basis: 'sqft', priceCents: 250 },
				labourCentsPerSqFt: 250,
				payCentsPerSqFt: 160
			},
			{
				id: 'lvt-eighth',
				name: 'Vinyl plank 1/8 in',
				kind: 'vinyl_plank',
				cartonSqFt: 36,
				thicknessIn: 0.125,
				material: { basis: 'sqft', priceCents: 250 },
				labourCentsPerSqFt: 250,
				payCentsPerSqFt: 160
			}
		);
		const on = (productId: string) =>
			keys(run([room({ floor: { productId, layout: 'straight' } })], thin));
		expect(on('lvt-glued')).toContain('prep:underlayment_skim');
		expect(on('lvt-eighth')).toContain('prep:underlayment_skim');
		// the sample's 1/4 in plank (rigid, floating): panels, no skim
		expect(on('lvp-grey')).toContain('prep:underlayment');
		expect(on('lvp-grey')).not.toContain('prep:underlayment_skim');
	});
});

describe('items on a whole install, each from the price book', () => {
	it('prices baseboard from the perimeter less doorways, and a strip by the floor-height step', () => {
		// 12 × 10 ft: 44 ft = 528 in of wall, less doorways of 32 + 30 + 30 in
		// build-up: vinyl plank 1/4 in + underlayment 1/4 in = 1/2 in (2010 ADA Standards §303, memory)
		const r = run([
			room({
				doorways: [
					{ widthIn: 32, door: true, nextFloorIn: 0.125 }, // 3/8 in up: reducer, undercut
					{ widthIn: 30, nextFloorIn: 0.5 }, // flush: transition
					{ widthIn: 30, nextFloorIn: 1.25 } // 3/4 in down: threshold, warned
				],
				base: { baseboard: 'reset', shoe: 'new' },
				furniture: true,
				appliances: 1,
				toilets: 1,
				stairs: 3
			})
		]);
		const qty = (k: string) => r.lines.find((l) => l.key === k)?.qty;
		// 528 − 92 = 436 in → 36.33 → 37 ft
		expect(qty('prep:base_reset')).toBe(37);
		expect(qty('prep:shoe_new')).toBe(37);
		expect(qty('prep:reducer')).toBe(1);
		expect(qty('prep:transition')).toBe(1);
		expect(qty('prep:threshold')).toBe(1);
		expect(qty('prep:door_undercut')).toBe(1);
		expect(qty('prep:furniture')).toBe(1);
		expect(qty('prep:appliance_reset')).toBe(1);
		expect(qty('prep:toilet_reset')).toBe(1);
		expect(qty('prep:stairs')).toBe(3);
		expect(r.warnings.map((w) => w.message).join('\n')).toContain('needs a ramped threshold');
		// installer pay beside each
		const line = r.lines.find((l) => l.key === 'prep:toilet_reset')!;
		expect(r.pay.find((p) => p.lineId === line.id)?.amountCents).toBe(7_500);
	});

	it('adds what goes under and with each floor, haul-away, a trip charge and acclimation', () => {
		const r = run([
			room({ id: 'c', floor: { productId: 'carpet-12', layout: 'straight' }, remove: ['carpet'] }),
			room({
				id: 'o',
				name: 'Oak',
				floor: { productId: 'oak-7', layout: 'straight' },
				remove: ['carpet', 'vinyl_tile']
			})
		]);
		expect(keys(r)).toEqual(
			expect.arrayContaining([
				'prep:carpet_pad',
				'prep:tack_strip',
				'prep:felt_paper',
				'prep:haul_away',
				'prep:trip_charge'
			])
		);
		// haul-away by area torn out: 120 ft² × 2 layers
		expect(r.lines.find((l) => l.id === 'o:prep:haul_away')?.qty).toBe(240);
		// acclimation (maker instructions; memory for 48 h): install waits from the job's start
		const install = r.schedule.steps.find((s) => s.key === 'install')!;
		expect(install.notBeforeHours).toBe(48);
		expect(install.start.day * 24 + install.start.hour - 8).toBeGreaterThanOrEqual(48);
	});

	it('raises a small job to the minimum charge, and skips what the store switched off', () => {
		const tiny = run([room({ shape: { kind: 'rect', widthIn: 24, lengthIn: 24 } })]);
		expect(tiny.totals.subtotalCents).toBe(50_000);
		expect(keys(tiny)).toContain('prep:minimum_job');
		const off: PriceBook = { ...book, prep: book.prep.filter((p) => p.kind !== 'toilet_reset') };
		const r = run([room({ toilets: 1 })], off);
		expect(r.errors).toEqual([]);
		expect(keys(r)).not.toContain('prep:toilet_reset');
		expect(r.warnings.map((w) => w.message).join('\n')).toContain(
			'Not on the quote: pull and reset toilets in Room A'
		);
		// and takes no time on the schedule: moving and fixtures have no toilet hours in them
		const on = run([room({ toilets: 1 })]);
		const moving = (x: typeof r) => x.schedule.steps.find((st) => st.key === 'moving')?.hours;
		expect(moving(r)).toBeUndefined();
		expect(moving(on)).toBe(1);
	});

	it('pours leveller within the data sheet’s depths, refusing what is too deep', () => {
		// the invented product's data sheet: 1/8 in to 1 1/2 in a pour
		const deep = run([
			slabRoom('1', { readings: { rhPct: [70], flatness: [{ spanIn: 120, gapIn: 4 }] } })
		]);
		expect(deep.errors[0].message).toContain('allows at most 1 1/2" a pour');
		const shallow = run([
			slabRoom('1', { readings: { rhPct: [70], flatness: [{ spanIn: 120, gapIn: 0.2 }] } })
		]);
		expect(shallow.warnings.map((w) => w.message).join('\n')).toContain('minimum 1/8"');
	});
});

describe('bad input gets a warning naming the limit', () => {
	it('warns on a 1 ft² room, spacing outside 12–24 in and a span beyond the tables', () => {
		const msgs = run([
			room({ shape: { kind: 'rect', widthIn: 12, lengthIn: 12 } }),
			room({
				id: 'b',
				name: 'B',
				joists: { size: '2x12', species: 'douglas_fir_larch', spacingIn: 30, spanIn: 400 }
			})
		]).warnings.map((w) => w.message);
		expect(msgs.join('\n')).toContain('rooms under 4 ft² are usually a typing slip');
		expect(msgs.join('\n')).toContain('outside 12–24 in');
		expect(msgs.join('\n')).toContain('beyond any span the IRC table prints');
	});
});
