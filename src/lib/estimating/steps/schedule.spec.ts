import { describe, expect, it } from 'vitest';
import { defaultSettings } from '../settings';
import { hoursByKey, prepHours, scheduleStep, WORK_STEPS } from './schedule';

describe('prepHours', () => {
	it('counts hours in the prep’s own unit', () => {
		// seam patch: 0.02 h per linear ft (store setting) × 16 ft
		expect(prepHours('seam_patch', { linft: 16, each: 2 }, defaultSettings)).toBeCloseTo(0.32, 12);
		expect(prepHours('seam_patch', { each: 2 }, defaultSettings)).toBe(0);
	});
});

describe('scheduleStep', () => {
	it('adds hours by key and lays the work out in install order, holding it while patch cures', () => {
		const hours = hoursByKey([
			['install', 6],
			['seam_patch', 0.5],
			['install', 2],
			['removal', 2],
			['dent_patch', 0.5]
		]);
		expect([...hours]).toEqual([
			['install', 8],
			['seam_patch', 0.5],
			['removal', 2],
			['dent_patch', 0.5]
		]);
		const s = scheduleStep(hours, defaultSettings);
		expect(s.steps.map((x) => [x.key, x.hours, x.cureHours])).toEqual([
			['removal', 2, undefined],
			// patch about 4 h before traffic (common practice; the label governs)
			['patch', 1, 4],
			['install', 8, undefined]
		]);
		// tear-out 8–10, patch 10–11, cure to 15, install 15–16 and 8–15 the next day
		expect(s.steps[2].start).toEqual({ day: 0, hour: 15 });
		expect(s.days).toBe(2);
	});

	it('names a step for every prep kind the engine emits, once', () => {
		const kinds = WORK_STEPS.flatMap((s) => s.kinds);
		expect(new Set(kinds).size).toBe(kinds.length);
		for (const k of Object.keys(defaultSettings.schedule.prepHoursPerUnit))
			expect(kinds).toContain(k);
	});
});
