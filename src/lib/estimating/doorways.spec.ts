/**
 * Doors over the new floor: a finding when a door swings where the new floor stands above the
 * next room's (common practice: undercut the door to clear it), tied to the undercut line.
 */
import { describe, expect, it } from 'vitest';
import { buildUpIn, doorChecks } from './doorways';
import { estimate } from './estimate';
import { samplePriceBook } from './sample';
import { defaultSettings } from './settings';
import type { RoomMeasure } from './types';

const kitchen: RoomMeasure = {
	id: 'k',
	name: 'Kitchen',
	shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
	floor: { productId: 'lvp-grey', layout: 'straight' },
	subfloor: { kind: 'plywood', thicknessIn: 0.625 },
	doorways: [
		{ widthIn: 32, door: true, nextFloorIn: 0.125 }, // 3/8 in below the new floor: a finding
		{ widthIn: 30, door: true, nextFloorIn: 0.75 }, // the new floor is lower: none
		{ widthIn: 36, nextFloorIn: 0 } // no door: none
	]
};

describe('door clearance', () => {
	it('worked example: 1/4 in plank on new 1/4 in underlayment is 1/2 in; 3/8 in above a 1/8 in floor', () => {
		const plank = samplePriceBook.floors.find((f) => f.id === 'lvp-grey')!;
		expect(buildUpIn(plank, true)).toBe(0.5);
		expect(buildUpIn(plank, false)).toBe(0.25);
		const checks = doorChecks(kitchen.doorways!, 0.5);
		expect(checks).toHaveLength(1);
		const c = checks[0].check;
		expect(checks[0].doorway).toBe(0);
		expect(c).toMatchObject({
			check: 'door_clearance',
			pass: false,
			measured: 0.375,
			unit: 'in',
			source: 'common practice'
		});
		expect(c.message).toBe(
			'Doorway 1: the new floor stands 3/8" above the next room\'s where a door swings; check that the door clears it, and undercut the door by 3/8" if it does not'
		);
		expect(c.suggestedPrep[0].kind).toBe('door_undercut');
	});

	it('says nothing when the floor’s thickness is not in the price book', () => {
		expect(doorChecks(kitchen.doorways!, undefined)).toEqual([]);
	});

	it('is a finding on the estimate, tied to the undercut line both ways', () => {
		const r = estimate({
			job: { builtYear: 2005, rooms: [kitchen] },
			settings: defaultSettings,
			priceBook: samplePriceBook
		});
		expect(r.errors).toEqual([]);
		const f = r.findings.find((x) => x.check === 'door_clearance')!;
		expect(f.id).toBe('k:door_clearance:0');
		const line = r.lines.find((l) => l.key === 'prep:door_undercut')!;
		expect(line.qty).toBe(1);
		expect(f.lineIds).toEqual([line.id]);
		expect(line.findingIds).toContain(f.id);
		expect(r.rooms[0].findingIds).toContain(f.id);
		expect(f.cautionTexts.length).toBeGreaterThan(0);
	});
});
