import { formatDate } from '$lib/format';

/**
 * Calendar days as the schedule keeps them: `YYYY-MM-DD` strings, days of the store's own
 * calendar (no time, no zone). Pure, shared by the server and the schedule page.
 */

const DAY_MS = 86_400_000;
const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Whether the text is a real calendar day (`2026-02-30` is not). */
export function isDay(text: string): boolean {
	const m = ISO_DAY.exec(text);
	if (!m) return false;
	const d = new Date(Date.UTC(+m[1], +m[2] - 1, +m[3]));
	return d.toISOString().slice(0, 10) === text;
}

function toUtc(day: string): number {
	const m = ISO_DAY.exec(day);
	if (!m) throw new Error(`Not a day: ${day}`);
	return Date.UTC(+m[1], +m[2] - 1, +m[3]);
}

const fromUtc = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** The day `n` days after (before, for negative `n`) `day`. */
export function addDays(day: string, n: number): string {
	return fromUtc(toUtc(day) + n * DAY_MS);
}

/** Days from `a` to `b` (`b` − `a`). */
export function daysBetween(a: string, b: string): number {
	return Math.round((toUtc(b) - toUtc(a)) / DAY_MS);
}

/** ISO weekday: 1 = Monday … 7 = Sunday. */
export function weekday(day: string): number {
	const d = new Date(toUtc(day)).getUTCDay();
	return d === 0 ? 7 : d;
}

/** `count` consecutive days from `start`. */
export function dayRange(start: string, count: number): string[] {
	return Array.from({ length: count }, (_, i) => addDays(start, i));
}

/** The Monday of the week `day` is in. */
export function weekStart(day: string): string {
	return addDays(day, 1 - weekday(day));
}

/** The first day of `day`'s month. */
export function monthStart(day: string): string {
	return `${day.slice(0, 8)}01`;
}

/** How many days `day`'s month has. */
export function monthLength(day: string): number {
	const [y, m] = [+day.slice(0, 4), +day.slice(5, 7)];
	return new Date(Date.UTC(y, m, 0)).getUTCDate();
}

/** One formatter per time zone: making one costs more than formatting with it many times. */
const dayFormats = new Map<string, Intl.DateTimeFormat>();

/** Today in a time zone, as a day. */
export function today(timeZone: string, now = new Date()): string {
	let format = dayFormats.get(timeZone);
	if (!format) {
		// en-CA formats dates as YYYY-MM-DD.
		format = new Intl.DateTimeFormat('en-CA', {
			timeZone,
			year: 'numeric',
			month: '2-digit',
			day: '2-digit'
		});
		// Stores' zones are a few hundred at most (the IANA names); the cap is a guard.
		if (dayFormats.size < 1000) dayFormats.set(timeZone, format);
	}
	return format.format(now);
}

/** A weekday's short name (for headers), from an ISO weekday. */
export const WEEKDAY_NAMES = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'] as const;

export interface DaySpan {
	startsOn: string;
	days: number;
}

export type BookingWarning =
	| { kind: 'double'; day: string; jobLabel: string }
	| { kind: 'day_off'; day: string }
	| { kind: 'away'; day: string; note: string };

/**
 * What is wrong with booking an installer on these days, day by day: another live booking of
 * theirs on the same day, a weekday they never work, or time away. Warnings, never refusals:
 * the manager may know better (a half day, a swapped day off).
 */
export function bookingWarnings(
	span: DaySpan,
	facts: {
		others: (DaySpan & { jobLabel: string })[];
		daysOff: readonly number[];
		timeOff: { startsOn: string; endsOn: string; note: string }[];
	}
): BookingWarning[] {
	const out: BookingWarning[] = [];
	for (const day of dayRange(span.startsOn, span.days)) {
		for (const o of facts.others) {
			const offset = daysBetween(o.startsOn, day);
			if (offset >= 0 && offset < o.days) out.push({ kind: 'double', day, jobLabel: o.jobLabel });
		}
		if (facts.daysOff.includes(weekday(day))) out.push({ kind: 'day_off', day });
		for (const t of facts.timeOff) {
			if (t.startsOn <= day && day <= t.endsOn) out.push({ kind: 'away', day, note: t.note });
		}
	}
	return out;
}

/** A warning in words (the day formatted by the caller). */
export function warningText(w: BookingWarning, dayText: string): string {
	switch (w.kind) {
		case 'double':
			return `${dayText}: already booked on ${w.jobLabel}.`;
		case 'day_off':
			return `${dayText}: a day this installer does not work.`;
		case 'away':
			return `${dayText}: away${w.note ? ` (${w.note})` : ''}.`;
	}
}

/**
 * A calendar day in words (`Dec 14, 2026`). A day has no time and is already the store's own,
 * so it is formatted at noon UTC, where no zone moves it to another date.
 */
export function formatDay(day: string, style: 'medium' | 'long' = 'medium'): string {
	return formatDate(`${day}T12:00:00Z`, 'UTC', style);
}

/** `Mon 14`: a day in a grid header. */
export function shortDay(day: string): string {
	return `${WEEKDAY_NAMES[weekday(day) - 1]} ${+day.slice(8, 10)}`;
}
