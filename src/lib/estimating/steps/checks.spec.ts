import { describe, expect, it } from 'vitest';
import { checksStep, joistCount } from './checks';
import { contextFor, plankRoom } from './testing';

const tile = {
	...plankRoom,
	id: 'bath',
	floor: { productId: 'tile-12', layout: 'straight' as const }
};

describe('checksStep', () => {
	it('fails soft joists under tile and asks to sister every joist under the room', () => {
		const r = checksStep(
			contextFor({
				...tile,
				joists: { size: '2x8', species: 'hem_fir', spacingIn: 16, spanIn: 180 }
			})
		);
		const deflection = r.findings.find((f) => f.check === 'joist_deflection');
		// NTCA Reference Manual (published): L/360 under ceramic tile
		expect(deflection).toMatchObject({ id: 'bath:joist_deflection:0', pass: false, limit: 360 });
		// joists across the 12 ft side at 16 in o.c.: ⌊144 ÷ 16⌋ + 1 = 10
		expect(r.needs[0]).toEqual({
			kind: 'joist_sister',
			measures: { each: 10, room: 1 },
			findings: [deflection]
		});
		expect(r.cautions).toContainEqual({ kind: 'structure', roomId: 'bath' });
		expect(r.warnings).toEqual([]);
	});

	it('warns when the joists under tile were not measured', () => {
		expect(checksStep(contextFor(tile)).warnings).toEqual([
			'Joists were not measured: the deflection check for tile or stone was not run'
		]);
	});

	it('levels a low spot by area and depth and grinds a high one', () => {
		const r = checksStep(
			contextFor({
				...tile,
				readings: {
					flatness: [
						{ spanIn: 120, gapIn: 0.25, areaSqFt: 10 },
						{ spanIn: 120, gapIn: 0.25, kind: 'high' },
						{ spanIn: 120, gapIn: 0.0625 }
					]
				}
			})
		);
		// 12 × 24 in tile is large-format: 1/8 in in 10 ft (ANSI A108.02, secondary)
		const flat = r.findings.filter((f) => f.check === 'flatness');
		expect(flat.map((f) => f.pass)).toEqual([false, false, true]);
		// average depth half the gap (store setting): 1/8 in over 10 ft² = 10 ft²-per-1/8-in
		expect(r.needs).toEqual([
			{
				kind: 'level',
				measures: { sqft: 10, sqft_per_eighth_in: 10, each: 1, room: 1 },
				findings: [flat[0]]
			},
			{ kind: 'grind', measures: { each: 1, room: 1 }, findings: [flat[1]] }
		]);
		expect(r.levelAreas).toEqual([{ areaSqFt: 10, depthIn: 0.125 }]);
	});

	it('holds a slab to the RH limit and counts the tests it needs', () => {
		const slab = { ...plankRoom, id: 'bsmt', subfloor: { kind: 'concrete' as const } };
		const r = checksStep(contextFor({ ...slab, readings: { rhPct: [78, 72] } }));
		// 78 % > 75 % (ASTM F710 / F2170, secondary): a barrier over the room
		expect(r.findings.map((f) => [f.check, f.pass])).toEqual([['moisture_rh', false]]);
		// How many tests are needed is counted per slab by the estimate (ASTM F2170 §10.1,
		// secondary); the room reports what was taken on it.
		expect(r.slabReadings).toEqual({ rh: 2, cc: 0, needsTests: true });
		expect(r.needs).toEqual([
			{ kind: 'moisture_barrier', measures: { sqft: 120, room: 1 }, findings: [r.findings[0]] }
		]);
		expect(checksStep(contextFor(slab)).warnings).toEqual([
			'No moisture readings for a concrete subfloor: the slab’s RH tests are on the quote and in the schedule, before any barrier or floor'
		]);
	});

	it('retests wood that is too wet for the flooring', () => {
		const oak = { ...plankRoom, floor: { productId: 'oak-7', layout: 'straight' as const } };
		const r = checksStep(
			contextFor({ ...oak, readings: { woodMc: { subfloorPct: [14], flooringPct: [8] } } })
		);
		// NWFA (published): subfloor at most 12 %; 7 in boards within 2 points of the flooring
		expect(r.findings.map((f) => [f.check, f.pass])).toEqual([
			['wood_subfloor_mc', false],
			['wood_mc_difference', false]
		]);
		expect(r.needs.map((n) => [n.kind, n.findings.length])).toEqual([
			['moisture_retest', 1],
			['moisture_retest', 1]
		]);
	});
});

describe('joistCount', () => {
	it('counts joists across the room, plus one', () => {
		const { shape } = contextFor(plankRoom);
		// joists along x sit across the 10 ft side: ⌊120 ÷ 16⌋ + 1 = 8; by default they run
		// along the shorter side (y), across the 12 ft one: ⌊144 ÷ 16⌋ + 1 = 10
		expect(joistCount(shape, 'x', 16)).toBe(8);
		expect(joistCount(shape, 'y', 16)).toBe(10);
		expect(joistCount(shape, undefined, 16)).toBe(10);
	});
});
