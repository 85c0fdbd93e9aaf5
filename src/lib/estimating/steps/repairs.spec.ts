import { describe, expect, it } from 'vitest';
import { repairsStep } from './repairs';
import { contextFor, plankRoom } from './testing';

describe('repairsStep', () => {
	it('pulls fasteners over the area given (never more than the room)', () => {
		const r = repairsStep(contextFor({ ...plankRoom, repairs: { fasteners: { areaSqFt: 500 } } }));
		expect(r.needs).toEqual([
			{ kind: 'fastener_removal', measures: { sqft: 120, room: 1 }, findings: [] }
		]);
		const some = repairsStep(
			contextFor({ ...plankRoom, repairs: { fasteners: { areaSqFt: 30 } } })
		);
		expect(some.needs[0].measures).toEqual({ sqft: 30, room: 1 });
	});

	it('ignores a hole under 1 in under new underlayment and closes bigger ones', () => {
		const r = repairsStep(
			contextFor({
				...plankRoom,
				repairs: {
					holes: [
						{ widthIn: 0.5, lengthIn: 0.5 },
						{ widthIn: 6, lengthIn: 4 }
					]
				}
			})
		);
		// common practice (TRADE.md "Subfloor repairs"): under about 1 in needs nothing
		expect(r.holes.map((h) => h.ignored)).toEqual([true, false]);
		expect(r.holes[1].method).toBe('blocking_underlayment');
		expect(r.needs).toEqual([
			{ kind: 'hole_repair', measures: { each: 1, room: 1 }, findings: [] }
		]);
		expect(r.cautions).toEqual([{ kind: 'dust_tools', roomId: 'bed' }]);
	});

	it('backs a hole under nailed wood and blocks one under floating wood', () => {
		const oak = { ...plankRoom, floor: { productId: 'oak-7', layout: 'straight' as const } };
		const hole = { repairs: { holes: [{ widthIn: 10, lengthIn: 8 }] } };
		expect(repairsStep(contextFor({ ...oak, ...hole })).holes[0].method).toBe('backing');
		const floating = contextFor({ ...oak, ...hole });
		floating.product = { ...floating.product, fastening: 'floating' };
		expect(repairsStep(floating).holes[0].method).toBe('blocking');
	});

	it('patches seams by their length and dents by their count, seams first', () => {
		const seam = { lengthIn: 96, widthIn: 0.25, depthIn: 0.125 };
		const dent = { lengthIn: 3, widthIn: 2, depthIn: 0.0625 };
		// Straight onto the old subfloor (underlayment declined): seams and dents are filled.
		const r = repairsStep(
			contextFor({
				...plankRoom,
				underlayment: false,
				repairs: { seams: [seam, seam], dents: [dent] }
			})
		);
		expect(r.needs).toEqual([
			// 2 × 96 in = 16 ft of seam
			{ kind: 'seam_patch', measures: { linft: 16, each: 2, room: 1 }, findings: [] },
			// 3 × 2 in = 6 in² = 1/24 ft²
			{ kind: 'dent_patch', measures: { each: 1, sqft: 6 / 144, room: 1 }, findings: [] }
		]);
		expect(r.voids).toEqual([seam, seam, dent]);
		// Issue 12 item 10 (common practice, TRADE.md "Subfloor repairs"): under new underlayment
		// the old subfloor's seams and dents are covered, not filled and not charged.
		const covered = repairsStep(
			contextFor({ ...plankRoom, repairs: { seams: [seam], dents: [dent] } })
		);
		expect(covered.needs).toEqual([]);
		expect(covered.voids).toEqual([]);
		expect(covered.warnings[0]).toMatch(/covered by the new underlayment: not filled, not charged/);
	});
});
