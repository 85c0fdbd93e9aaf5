import { z } from 'zod';
import { FLOOR_KINDS } from '$lib/estimating/settings';
import type { FloorKind } from '$lib/estimating';
import { isDay } from '$lib/schedule/days';
import { id, optionalText } from './fields';

/** A calendar day typed as YYYY-MM-DD (what `<input type="date">` posts). */
export const day = (label: string) =>
	z
		.string({ error: `Choose ${label}` })
		.trim()
		.refine(isDay, `Choose ${label} (year-month-day)`);

const notes = (max: number) =>
	z.string().trim().max(max, `Keep it under ${max} characters`).default('');

/** Whole days, typed, within bounds. */
const wholeNumber = (label: string, min: number, max: number) =>
	z
		.string()
		.trim()
		.regex(/^\d{1,4}$/, `Enter ${label} as a whole number`)
		.transform(Number)
		.refine((n) => n >= min && n <= max, `Enter ${label} from ${min} to ${max}`);

/** A time of day, HH:MM (24 h), or nothing. */
const timeOfDay = z
	.string()
	.trim()
	.optional()
	.transform((v) => v || null)
	.pipe(
		z
			.string()
			.regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Enter a time such as 08:00')
			.nullable()
	);

const kindsObject = <T extends z.ZodType>(field: T) =>
	z.object(Object.fromEntries(FLOOR_KINDS.map((k) => [k, field])) as Record<FloorKind, T>);

/** ISO weekdays as form names (`off.d1` = Monday … `off.d7` = Sunday). */
export const WEEKDAY_FIELDS = ['d1', 'd2', 'd3', 'd4', 'd5', 'd6', 'd7'] as const;

/**
 * The profile form. Checkboxes and per-kind fields are named after our own lists (`kinds.<kind>`,
 * `output.<kind>`, `off.d<n>`), so zod keeps only names we know; pay rates come as rows
 * (`rates.<i>.key`, `rates.<i>.pay`) whose keys the server matches against the price book.
 */
export const profileSchema = z.object({
	crewSize: wholeNumber('the crew size', 1, 50),
	kinds: kindsObject(z.string().max(3).optional()).default({} as never),
	off: z
		.object(Object.fromEntries(WEEKDAY_FIELDS.map((d) => [d, z.string().max(3).optional()])))
		.default({}),
	phone: z
		.string()
		.trim()
		.max(40)
		.refine(
			(v) => v === '' || /^\+?[0-9 ().-]{7,20}$/.test(v),
			'Enter a phone number: digits, spaces, + ( ) - only'
		)
		.default(''),
	notes: notes(2000),
	output: kindsObject(z.string().trim().max(20).optional()).default({} as never),
	// A row left out of a partial form is a hole in the array: skipped, not refused.
	rates: z
		.array(
			z
				.object({ key: z.string().trim().max(200), pay: z.string().trim().max(20).default('') })
				.optional()
		)
		.max(500)
		.default([])
});

export const timeOffSchema = z
	.object({
		startsOn: day('the first day away'),
		endsOn: day('the last day away'),
		note: notes(200)
	})
	.refine((v) => v.endsOn >= v.startsOn, {
		path: ['endsOn'],
		message: 'The last day comes on or after the first'
	});

export const removeTimeOffSchema = z.object({ timeOffId: id });

/** The most days one booking lasts (the `booking_days` check on the table says the same). */
export const MAX_BOOKING_DAYS = 60;

export const bookSchema = z.object({
	jobId: id,
	installerId: z
		.string({ error: 'Choose an installer' })
		.trim()
		.min(1, 'Choose an installer')
		.max(64),
	startsOn: day('the first day'),
	days: z
		.string()
		.trim()
		.optional()
		.transform((v) => v || null)
		.pipe(wholeNumber('the days', 1, MAX_BOOKING_DAYS).nullable()),
	arrivesAt: timeOfDay,
	notes: notes(1000)
});

export const moveSchema = bookSchema.omit({ jobId: true }).extend({ bookingId: id });

export const cancelSchema = z.object({ bookingId: id });

export const statementCreateSchema = z
	.object({
		installerId: z
			.string({ error: 'Choose an installer' })
			.trim()
			.min(1, 'Choose an installer')
			.max(64),
		periodStart: day('the first day of the period'),
		periodEnd: day('the last day of the period')
	})
	.refine((v) => v.periodEnd >= v.periodStart, {
		path: ['periodEnd'],
		message: 'The period ends on or after it starts'
	})
	.refine((v) => daysApart(v.periodStart, v.periodEnd) < 366, {
		path: ['periodEnd'],
		message: 'A statement covers at most a year'
	});

function daysApart(a: string, b: string) {
	return Math.round((Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / 86_400_000);
}

export const statementLineSchema = z.object({
	kind: z.enum(['chargeback', 'adjustment'], { error: 'Choose chargeback or adjustment' }),
	amount: z.string().trim().max(30),
	reason: z
		.string({ error: 'Say why' })
		.trim()
		.min(1, 'Say why: the installer sees it')
		.max(300, 'Keep it under 300 characters'),
	description: optionalText(200)
});

export const statementPaySchema = z.object({
	reference: z
		.string({ error: 'Enter the payment reference' })
		.trim()
		.min(1, 'Enter the payment reference (transfer id, cheque number)')
		.max(120, 'Keep it under 120 characters')
});

export const scheduleViewSchema = z.object({
	view: z.enum(['week', 'month']).catch('week'),
	from: z
		.string()
		.optional()
		.transform((v) => (v && isDay(v) ? v : null))
		.catch(null),
	job: z.string().max(64).optional().catch(undefined)
});
