import { isOpen } from '$lib/jobs/status';
import { today } from '$lib/schedule/days';
import * as field from '$lib/server/db/queries/field';
import { list } from '$lib/server/db/queries/jobs';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, scope, user } = requirePermission({ assignedJob: ['read'] });
	const day = today(store.timeZone);
	const { rows, booked } = await readInStore(store.id, async (tx) => ({
		...(await list(tx, { sort: 'updated', dir: 'desc', page: 1, pageSize: 100, q: null }, scope)),
		booked: await field.listBookingsFor(tx, user.id, day)
	}));
	const bookedIds = new Set(booked.map((b) => b.jobId));
	const todays = booked.filter((b) => b.startsOn <= day);
	const upcoming = booked.filter((b) => b.startsOn > day);
	// What the page shows of each job, no more: the phone loads the page over a weak signal.
	const cards = rows.map(({ id, number, status, title, customerName }) => ({
		id,
		number,
		status,
		title,
		customerName
	}));
	// Jobs given to the installer without days on the schedule yet (or whose days are past).
	const open = cards.filter((j) => isOpen(j.status) && !bookedIds.has(j.id));
	const done = cards.filter((j) => !isOpen(j.status));
	return { today: day, todays, upcoming, open, done };
};
