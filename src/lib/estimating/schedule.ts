/**
 * Install duration: work steps in order, each holding the next while it cures. One crew;
 * work runs inside the working day, cures run on the clock (overnight counts).
 */
import { countWithin, figure, LIMITS, LimitError, within } from './limits';

export interface WorkStep {
	key: string;
	label: string;
	hours: number;
	/** Clock hours the next step must wait (a patch before traffic; the label governs). */
	cureHours?: number;
	/** Clock hours from the start of the job before this step may begin (acclimation). */
	notBeforeHours?: number;
}

export interface TimePoint {
	/** Day index from 0. */
	day: number;
	/** Clock hour in that day. */
	hour: number;
}

export interface ScheduledStep extends WorkStep {
	start: TimePoint;
	end: TimePoint;
	/** When the cure ends and the next step may start. */
	readyAt: TimePoint;
}

export interface Schedule {
	steps: ScheduledStep[];
	workHours: number;
	cureHours: number;
	/** Working days the job spans (a day counts once any work falls in it). */
	days: number;
}

/** Lays out the steps in order; returns each step's start, end and when the next may start. */
export function schedule(
	steps: readonly WorkStep[],
	settings: { workdayHours: number; dayStartHour: number }
): Schedule {
	const H = settings.workdayHours;
	const start0 = settings.dayStartHour;
	within(H, 'workdayHours', 'The working day', 24, 'h', 1);
	within(start0, 'dayStartHour', 'The start of the day', 23, 'h', 0);
	countWithin(steps.length, 'steps', 'work steps', LIMITS.settingsRows);
	let total = 0;
	steps.forEach((step, i) => {
		within(step.hours, `steps.${i}.hours`, `${step.label}: the work`, LIMITS.workHours, 'h', 0);
		within(step.cureHours ?? 0, `steps.${i}.cureHours`, 'A cure', LIMITS.cureHours, 'h', 0);
		total += step.hours;
	});
	if (!(total <= LIMITS.workHours))
		throw new LimitError(
			'steps',
			LIMITS.workHours,
			`The work comes to ${figure(total)} h; the engine plans up to ${figure(LIMITS.workHours)} h`
		);
	// Each pass of the loop below ends a working day or a step: at most this many passes.
	let passes = Math.ceil(total / H) + 2 * steps.length + 1;
	// Working time as (day, hours into the working day).
	let day = 0;
	let into = 0;
	const point = (d: number, h: number): TimePoint => ({ day: d, hour: start0 + h });
	const out: ScheduledStep[] = [];
	let lastWorkDay = -1;
	let workHours = 0;
	let cureHours = 0;
	for (const step of steps) {
		if (step.hours <= 0 && !step.cureHours) continue;
		if (into >= H) {
			day += 1;
			into = 0;
		}
		const notBefore = step.notBeforeHours ?? 0;
		within(notBefore, 'notBeforeHours', 'A wait', LIMITS.cureHours, 'h', 0);
		if (day * 24 + into < notBefore) {
			// the wait runs on the clock from the start of day 0's working window
			let d = Math.floor(notBefore / 24);
			let h = notBefore - d * 24;
			if (h >= H) {
				d += 1;
				h = 0;
			}
			day = d;
			into = h;
		}
		const start = point(day, into);
		let left = step.hours;
		while (left > 1e-9 && passes-- > 0) {
			if (into >= H) {
				day += 1;
				into = 0;
			}
			const take = Math.min(left, H - into);
			into += take;
			left -= take;
			lastWorkDay = day;
		}
		const end = point(day, into);
		workHours += step.hours;
		let readyAt = end;
		const cure = step.cureHours ?? 0;
		if (cure > 0) {
			cureHours += cure;
			// clock hours from the start of day 0's working window
			const done = day * 24 + into + cure;
			let d = Math.floor(done / 24);
			let h = done - d * 24;
			if (h >= H) {
				d += 1;
				h = 0;
			}
			day = d;
			into = h;
			readyAt = point(day, into);
		}
		out.push({
			key: step.key,
			label: step.label,
			hours: step.hours,
			cureHours: step.cureHours,
			...(step.notBeforeHours ? { notBeforeHours: step.notBeforeHours } : {}),
			start,
			end,
			readyAt
		});
	}
	return { steps: out, workHours, cureHours, days: lastWorkDay + 1 };
}
