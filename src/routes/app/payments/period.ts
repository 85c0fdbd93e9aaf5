import { z } from 'zod';

const day = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/)
	.optional();

/** The period a reconciliation covers, from `?from=&to=` (whole days, UTC); the last 30 days by default. */
export function periodOf(url: URL) {
	const parsed = z.object({ from: day, to: day }).safeParse(Object.fromEntries(url.searchParams));
	const today = new Date().toISOString().slice(0, 10);
	const monthAgo = new Date(Date.now() - 30 * 86_400_000).toISOString().slice(0, 10);
	const fromDay = (parsed.success && parsed.data.from) || monthAgo;
	const toDay = (parsed.success && parsed.data.to) || today;
	const from = new Date(`${fromDay}T00:00:00Z`);
	const to = new Date(`${toDay}T23:59:59Z`);
	const valid = !Number.isNaN(from.getTime()) && !Number.isNaN(to.getTime()) && from <= to;
	return {
		fromDay: valid ? fromDay : monthAgo,
		toDay: valid ? toDay : today,
		from: valid ? from : new Date(`${monthAgo}T00:00:00Z`),
		to: valid ? to : new Date(`${today}T23:59:59Z`),
		problem:
			parsed.success && valid ? null : 'That period could not be read; showing the last 30 days.'
	};
}
