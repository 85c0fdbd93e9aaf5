// A paid job booked for a new installer, as the schedule leaves it (the "crew" part writes
// bookings; here the row is written straight into `booking`), for the field report's specs.
import * as jobs from '$lib/server/db/queries/jobs';
import { booking } from '$lib/server/db/schema';
import { inStore } from '$lib/server/db/tenant';
import { makePaidJob, type TestStore } from './factories';
import { makeInstaller } from './field-factories';

export async function makeBookedJob(
	store: TestStore,
	installer?: Awaited<ReturnType<typeof makeInstaller>>,
	startsOn = new Date().toISOString().slice(0, 10),
	days = 2
) {
	const paid = await makePaidJob(store);
	const who = installer ?? (await makeInstaller(store));
	await inStore(store.id, async (tx) => {
		await tx.insert(booking).values({
			organizationId: store.id,
			jobId: paid.job.id,
			installerId: who.user.id,
			startsOn,
			days,
			proposedDays: paid.quote.result.schedule.days,
			proposal: paid.quote.result.schedule,
			notes: 'Key under the blue pot',
			bookedBy: store.owner.id
		});
		if ((await jobs.assign(tx, paid.job.id, who.user.id, store.owner.id)) !== 'assigned')
			throw new Error('not assigned');
		const moved = await jobs.move(tx, paid.job.id, 'scheduled', store.owner.id, 'Booked');
		if (!moved.ok) throw new Error(`not scheduled: ${moved.reason}`);
	});
	return { ...paid, installer: who };
}
