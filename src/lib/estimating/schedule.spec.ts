import { describe, expect, it } from 'vitest';
import { schedule } from './schedule';

const day = { workdayHours: 8, dayStartHour: 8 };

describe('schedule', () => {
	it('runs work inside the working day and spills into the next', () => {
		const s = schedule(
			[
				{ key: 'a', label: 'A', hours: 6 },
				{ key: 'b', label: 'B', hours: 4 }
			],
			day
		);
		expect(s.steps[1].start).toEqual({ day: 0, hour: 14 });
		expect(s.steps[1].end).toEqual({ day: 1, hour: 10 });
		expect(s.days).toBe(2);
		expect(s.workHours).toBe(10);
	});

	it('holds the next step while a patch cures (about 4 h, common practice; label governs)', () => {
		const s = schedule(
			[
				{ key: 'patch', label: 'Patch', hours: 2, cureHours: 4 },
				{ key: 'install', label: 'Install', hours: 2 }
			],
			day
		);
		// patch 8–10, cures until 14, install 14–16: one day
		expect(s.steps[0].readyAt).toEqual({ day: 0, hour: 14 });
		expect(s.steps[1].start).toEqual({ day: 0, hour: 14 });
		expect(s.days).toBe(1);
	});

	it('lets a cure run overnight and starts the next morning', () => {
		const s = schedule(
			[
				{ key: 'patch', label: 'Patch', hours: 6, cureHours: 4 },
				{ key: 'install', label: 'Install', hours: 3 }
			],
			day
		);
		// patch 8–14, cure to 18 (past the 16:00 end of day) → install day 1 from 8
		expect(s.steps[1].start).toEqual({ day: 1, hour: 8 });
		expect(s.days).toBe(2);
		const long = schedule(
			[
				{ key: 'level', label: 'Level', hours: 1, cureHours: 16 },
				{ key: 'install', label: 'Install', hours: 1 }
			],
			day
		);
		// level 8–9, cure to 01:00 next day → next working start day 1 at 8
		expect(long.steps[1].start).toEqual({ day: 1, hour: 8 });
		const later = schedule(
			[
				{ key: 'level', label: 'Level', hours: 1, cureHours: 26 },
				{ key: 'install', label: 'Install', hours: 1 }
			],
			day
		);
		// cure to 11:00 on day 1, inside its working day
		expect(later.steps[1].start).toEqual({ day: 1, hour: 11 });
	});

	it('skips empty steps', () => {
		expect(schedule([{ key: 'x', label: 'X', hours: 0 }], day)).toMatchObject({
			steps: [],
			days: 0
		});
	});
});
