/**
 * The schedule step: hours of work by kind become work steps in install order, each holding the
 * next while it cures, laid out over working days by `schedule()`.
 */
import { PREP, type Measures, type PrepKind } from '../prep';
import { schedule, type Schedule, type WorkStep } from '../schedule';
import type { StoreSettings } from '../settings';
import type { HoursEntry } from './room';

/**
 * Work steps in the order they are done; a step's cure (or a test's wait, `waits`) holds the
 * next. On a wet slab: tests first, then the barrier on the bare slab, then primer and leveller,
 * then the floor (common practice; the products' data sheets govern), with a slab's cracks and
 * dents patched after the barrier too. Over wood: patch under the
 * panels before the panels, skim after. Install waits for the flooring's acclimation from the
 * start of the job (`notBefore`), which runs beside the prep.
 */
/**
 * Hours of patch on a concrete slab: done after the moisture barrier, with the primer and
 * leveller, so it has a schedule key of its own (its cure is the patch's).
 */
export const SLAB_PATCH = 'slab_patch';

export const WORK_STEPS: readonly {
	key: string;
	label: string;
	kinds: readonly string[];
	/** Wait keys (`wait:<key>` hours entries) whose longest wait holds the next step. */
	waits?: readonly string[];
	/** A wait key that must have run out, from the start of the job, before this step begins. */
	notBefore?: string;
}[] = [
	{
		key: 'moving',
		label: 'Move furniture, disconnect fixtures',
		kinds: ['furniture', 'appliance_reset', 'toilet_reset']
	},
	{ key: 'removal', label: 'Tear out existing floors', kinds: ['removal', 'haul_away'] },
	{ key: 'fasteners', label: 'Pull fasteners, sweep, vacuum', kinds: ['fastener_removal'] },
	{
		key: 'tests',
		label: 'Moisture tests (probes equilibrate, dishes stay out before reading)',
		kinds: ['moisture_test', 'moisture_retest'],
		waits: ['rh', 'calciumChloride']
	},
	{ key: 'structure', label: 'Structure', kinds: ['structural_consult', 'joist_sister'] },
	{ key: 'holes', label: 'Close subfloor holes', kinds: ['hole_repair'] },
	{ key: 'overlay', label: 'Subfloor overlay', kinds: ['subfloor_overlay'] },
	{ key: 'grind', label: 'Grind high spots', kinds: ['grind'] },
	{ key: 'patch', label: 'Patch seams and dents', kinds: ['seam_patch', 'dent_patch'] },
	{ key: 'underlayment', label: 'Underlayment panels', kinds: ['underlayment'] },
	{
		key: 'skim',
		label: 'Skim underlayment seams and fastener heads',
		kinds: ['underlayment_skim']
	},
	{ key: 'barrier', label: 'Moisture barrier on the bare slab', kinds: ['moisture_barrier'] },
	{
		key: 'level',
		label: 'Prime and level low spots, patch slab cracks and dents',
		kinds: ['primer', SLAB_PATCH, 'level']
	},
	{
		key: 'layers',
		label: 'Backer, membrane, retarder, underlay, pad',
		kinds: ['tile_backer', 'vapour_retarder', 'underlay', 'felt_paper', 'carpet_pad', 'tack_strip']
	},
	{
		key: 'install',
		label: 'Install floors',
		kinds: ['install', 'tile_setting', 'carpet_seam', 'stairs'],
		notBefore: 'acclimation'
	},
	{
		key: 'finish',
		label: 'Trim, transitions, doors, reset fixtures',
		kinds: [
			'trim',
			'transition',
			'reducer',
			'threshold',
			'door_undercut',
			'base_reset',
			'base_new',
			'shoe_new'
		]
	},
	// Charges with no work of their own (no hours unless a store gives them some).
	{ key: 'charges', label: 'Trip and minimum charges', kinds: ['trip_charge', 'minimum_job'] }
];

/** Hours of one prep item: the store's hours per unit × its quantity in the prep's own unit. */
export function prepHours(kind: PrepKind, measures: Measures, s: StoreSettings): number {
	const perUnit = s.schedule.prepHoursPerUnit[kind] ?? 0;
	return perUnit * (measures[PREP[kind].unit] ?? 0);
}

/**
 * Adds hours by key, in the order they come (so sums are the same for the same job). Waits
 * (`wait:<key>`) are not work: the longest counts.
 */
export function hoursByKey(entries: readonly HoursEntry[]): Map<string, number> {
	const hours = new Map<string, number>();
	for (let i = 0; i < entries.length; i++) {
		const e = entries[i];
		const had = hours.get(e[0]) ?? 0;
		hours.set(e[0], e[0].startsWith('wait:') ? Math.max(had, e[1]) : had + e[1]);
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
			if (kh > 0)
				cure = Math.max(cure, s.schedule.cureHours[k === SLAB_PATCH ? 'dent_patch' : k] ?? 0);
		}
		if (h <= 0) continue;
		for (const w of st.waits ?? []) cure = Math.max(cure, hours.get(`wait:${w}`) ?? 0);
		const step: WorkStep = { key: st.key, label: st.label, hours: h, cureHours: cure || undefined };
		const notBefore = st.notBefore ? (hours.get(`wait:${st.notBefore}`) ?? 0) : 0;
		if (notBefore > 0) {
			step.notBeforeHours = notBefore;
			step.label = `${st.label} (after ${notBefore} h acclimation on site)`;
		}
		steps.push(step);
	}
	return schedule(steps, s.schedule);
}
