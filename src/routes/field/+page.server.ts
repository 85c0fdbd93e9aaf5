import { isOpen } from '$lib/jobs/status';
import * as field from '$lib/server/db/queries/field';
import { list } from '$lib/server/db/queries/jobs';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

/** One formatter per time zone: making one costs more than the rest of the page's own work. */
const dayFormats = new Map<string, Intl.DateTimeFormat>();

/** 'YYYY-MM-DD' of `now` in the store's time zone. */
function dayIn(timeZone: string, now = new Date()): string {
	let format = dayFormats.get(timeZone);
	if (!format) {
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

export const load: PageServerLoad = async () => {
	const { store, scope, user } = requirePermission({ assignedJob: ['read'] });
	const today = dayIn(store.timeZone);
	const { rows, booked } = await readInStore(store.id, async (tx) => ({
		...(await list(tx, { sort: 'updated', dir: 'desc', page: 1, pageSize: 100, q: null }, scope)),
		booked: await field.listBookingsFor(tx, user.id, today)
	}));
	const bookedIds = new Set(booked.map((b) => b.jobId));
	const todays = booked.filter((b) => b.startsOn <= today);
	const upcoming = booked.filter((b) => b.startsOn > today);
	// Jobs given to the installer without days on the schedule yet (or whose days are past).
	// What the page shows of each job, no more: the phone loads the page over a weak signal.
	const cards = rows.map(({ id, number, status, title, customerName }) => ({
		id,
		number,
		status,
		title,
		customerName
	}));
	const open = cards.filter((j) => isOpen(j.status) && !bookedIds.has(j.id));
	const done = cards.filter((j) => !isOpen(j.status));
	return { today, todays, upcoming, open, done };
};
