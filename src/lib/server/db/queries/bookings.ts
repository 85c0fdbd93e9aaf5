import { and, asc, eq, gte, isNull, lte, ne, sql } from 'drizzle-orm';
import type { Schedule } from '../../../estimating/schedule';
import { booking, customer, job, jobEvent, site, user } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { runShape } from '../named';

export type Booking = typeof booking.$inferSelect;

const bookingColumns = {
	id: booking.id,
	jobId: booking.jobId,
	installerId: booking.installerId,
	installerName: user.name,
	startsOn: booking.startsOn,
	days: booking.days,
	arrivesAt: booking.arrivesAt,
	proposedDays: booking.proposedDays,
	notes: booking.notes,
	version: booking.version,
	jobNumber: job.number,
	jobTitle: job.title,
	jobStatus: job.status,
	customerName: customer.name
};

function selectBookings(tx: StoreTx) {
	return tx
		.select(bookingColumns)
		.from(booking)
		.innerJoin(job, and(eq(job.id, booking.jobId), eq(job.organizationId, booking.organizationId)))
		.innerJoin(
			customer,
			and(eq(customer.id, job.customerId), eq(customer.organizationId, job.organizationId))
		)
		.innerJoin(user, eq(user.id, booking.installerId));
}

export type BookingRow = Awaited<ReturnType<typeof listLive>>[number];

/** Live bookings with a day in `from`..`to` (both included), by day. */
export async function listLive(
	tx: StoreTx,
	range: { from: string; to: string; installerId?: string }
) {
	return selectBookings(tx)
		.where(
			and(
				eq(booking.organizationId, tx.storeId),
				isNull(booking.cancelledAt),
				lte(booking.startsOn, range.to),
				gte(booking.endsOn, range.from),
				range.installerId ? eq(booking.installerId, range.installerId) : undefined
			)
		)
		.orderBy(asc(booking.startsOn), asc(job.number))
		.limit(2000);
}

/** The job's live booking, if any. */
export async function liveForJob(tx: StoreTx, jobId: string) {
	const [row] = await runShape(
		tx,
		'bookings.liveForJob',
		() =>
			selectBookings(tx).where(
				and(
					eq(booking.organizationId, sql.placeholder('store')),
					eq(booking.jobId, sql.placeholder('job')),
					isNull(booking.cancelledAt)
				)
			),
		{ store: tx.storeId, job: jobId }
	);
	return row;
}

/** A live booking of the store, its row locked until the transaction ends. */
export async function lockLive(tx: StoreWriteTx, id: string): Promise<Booking | undefined> {
	const [row] = await tx
		.select()
		.from(booking)
		.where(
			and(eq(booking.organizationId, tx.storeId), eq(booking.id, id), isNull(booking.cancelledAt))
		)
		.for('update');
	return row;
}

/** Other live bookings of an installer touching these days (for the double-booking warning). */
export async function othersOf(
	tx: StoreTx,
	installerId: string,
	from: string,
	to: string,
	exceptJobId: string
) {
	return tx
		.select({ startsOn: booking.startsOn, days: booking.days, jobNumber: job.number })
		.from(booking)
		.innerJoin(job, and(eq(job.id, booking.jobId), eq(job.organizationId, booking.organizationId)))
		.where(
			and(
				eq(booking.organizationId, tx.storeId),
				eq(booking.installerId, installerId),
				isNull(booking.cancelledAt),
				ne(booking.jobId, exceptJobId),
				lte(booking.startsOn, to),
				gte(booking.endsOn, from)
			)
		)
		.limit(500);
}

export interface NewBooking {
	jobId: string;
	installerId: string;
	startsOn: string;
	days: number;
	arrivesAt: string | null;
	proposedDays: number;
	proposal: Schedule;
	notes: string;
}

export async function insert(tx: StoreWriteTx, input: NewBooking, actorId: string) {
	const [row] = await tx
		.insert(booking)
		.values({ organizationId: tx.storeId, ...input, bookedBy: actorId })
		.returning();
	return row;
}

/** New days or installer: the version rises, so the calendar update replaces the first. */
export async function reschedule(
	tx: StoreWriteTx,
	id: string,
	input: {
		installerId: string;
		startsOn: string;
		days: number;
		arrivesAt: string | null;
		notes: string;
	}
) {
	const [row] = await tx
		.update(booking)
		.set({ ...input, version: sql`${booking.version} + 1`, updatedAt: new Date() })
		.where(and(eq(booking.organizationId, tx.storeId), eq(booking.id, id)))
		.returning();
	return row;
}

export async function cancel(tx: StoreWriteTx, id: string, actorId: string) {
	const now = new Date();
	const [row] = await tx
		.update(booking)
		.set({
			cancelledAt: now,
			cancelledBy: actorId,
			version: sql`${booking.version} + 1`,
			updatedAt: now
		})
		.where(and(eq(booking.organizationId, tx.storeId), eq(booking.id, id)))
		.returning();
	return row;
}

/** A line in the job's history for a booking change. */
export async function recordEvent(tx: StoreWriteTx, jobId: string, actorId: string, note: string) {
	await tx
		.insert(jobEvent)
		.values({ organizationId: tx.storeId, jobId, kind: 'booking', actorId, note });
}

/** What the calendar file and the e-mails say about the job: customer, site, address. */
export async function mailFacts(tx: StoreTx, jobId: string) {
	const [row] = await tx
		.select({
			number: job.number,
			title: job.title,
			customerName: customer.name,
			customerEmail: customer.email,
			address: site.address,
			town: site.town
		})
		.from(job)
		.innerJoin(
			customer,
			and(eq(customer.id, job.customerId), eq(customer.organizationId, job.organizationId))
		)
		.leftJoin(site, and(eq(site.id, job.siteId), eq(site.organizationId, job.organizationId)))
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, jobId)));
	return row;
}
