/**
 * The schedule step: hours of work by kind become work steps in install order, each holding the
 * next while it cures, laid out over working days by `schedule()`.
 */
import { PREP, type Measures, type PrepKind } from '../prep';
import { schedule, type Schedule, type WorkStep } from '../schedule';
import type { StoreSettings } from '../settings';
import type { HoursEntry } from './room';

/** Work steps in install order; a step's cure holds the next. */
export const WORK_STEPS: readonly { key: string; label: string; kinds: readonly string[] }[] = [
	{ key: 'removal', label: 'Tear out existing floors', kinds: ['removal'] },
	{ key: 'fasteners', label: 'Pull fasteners, sweep, vacuum', kinds: ['fastener_removal'] },
	{ key: 'structure', label: 'Structure', kinds: ['structural_consult', 'joist_sister'] },
	{ key: 'holes', label: 'Close subfloor holes', kinds: ['hole_repair'] },
	{ key: 'overlay', label: 'Subfloor overlay', kinds: ['subfloor_overlay'] },
	{ key: 'underlayment', label: 'Underlayment panels', kinds: ['underlayment'] },
	{ key: 'grind', label: 'Grind high spots', kinds: ['grind'] },
	{ key: 'patch', label: 'Patch seams and dents', kinds: ['seam_patch', 'dent_patch'] },
	{ key: 'level', label: 'Level low spots', kinds: ['level'] },
	{
		key: 'moisture',
		label: 'Moisture',
		kinds: ['moisture_test', 'moisture_retest', 'moisture_barrier']
	},
	{ key: 'install', label: 'Install floors', kinds: ['install'] },
	{ key: 'finish', label: 'Trim and transitions', kinds: ['trim', 'transition'] }
];

/** Hours of one prep item: the store's hours per unit × its quantity in the prep's own unit. */
export function prepHours(kind: PrepKind, measures: Measures, s: StoreSettings): number {
	const perUnit = s.schedule.prepHoursPerUnit[kind] ?? 0;
	return perUnit * (measures[PREP[kind].unit] ?? 0);
}

/** Adds hours by key, in the order they come (so sums are the same for the same job). */
export function hoursByKey(entries: readonly HoursEntry[]): Map<string, number> {
	const hours = new Map<string, number>();
	for (let i = 0; i < entries.length; i++) {
		const e = entries[i];
		hours.set(e[0], (hours.get(e[0]) ?? 0) + e[1]);
	}
	return hours;
}

/** The job's work steps (those with work) and their layout over working days. */
export function scheduleStep(hours: ReadonlyMap<string, number>, s: StoreSettings): Schedule {
	const steps: WorkStep[] = [];
	for (const st of WORK_STEPS) {
		let h = 0;
		let cure = 0;
		for (const k of st.kinds) {
			const kh = hours.get(k) ?? 0;
			h += kh;
			if (kh > 0) cure = Math.max(cure, s.schedule.cureHours[k] ?? 0);
		}
		if (h <= 0) continue;
		steps.push({ key: st.key, label: st.label, hours: h, cureHours: cure || undefined });
	}
	return schedule(steps, s.schedule);
}
