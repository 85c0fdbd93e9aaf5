import { describe, expect, it } from 'vitest';
import { BASES, PREP, PREP_KINDS } from './prep';
import { defaultSettings } from './settings';

describe('prep kinds', () => {
	it('each has a label, a unit the price book can use, and hours in the schedule settings', () => {
		for (const kind of PREP_KINDS) {
			expect(PREP[kind].label.length).toBeGreaterThan(0);
			expect(BASES).toContain(PREP[kind].unit);
			expect(defaultSettings.schedule.prepHoursPerUnit[kind]).toBeGreaterThanOrEqual(0);
		}
	});

	it('waits about 4 h for patch before the next step (common practice; the label governs)', () => {
		expect(defaultSettings.schedule.cureHours.seam_patch).toBe(4);
		expect(defaultSettings.schedule.cureHours.dent_patch).toBe(4);
	});
});
