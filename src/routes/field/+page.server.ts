import { isOpen } from '$lib/jobs/status';
import * as field from '$lib/server/db/queries/field';
import { list } from '$lib/server/db/queries/jobs';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

/** 'YYYY-MM-DD' of `now` in the store's time zone. */
function dayIn(timeZone: string, now = new Date()): string {
	return new Intl.DateTimeFormat('en-CA', {
		timeZone,
		year: 'numeric',
		month: '2-digit',
		day: '2-digit'
	}).format(now);
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
	const open = rows.filter((j) => isOpen(j.status) && !bookedIds.has(j.id));
	const done = rows.filter((j) => !isOpen(j.status));
	return { today, todays, upcoming, open, done };
};
