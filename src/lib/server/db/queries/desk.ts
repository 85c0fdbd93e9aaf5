// Rows for the desk's "store's day": the jobs that need someone now, each kind with its count and
// its oldest few. SQL only; which kinds a member sees, and what each line says, is the desk
// module's ($lib/server/desk/day.ts).
import {
	and,
	asc,
	count,
	eq,
	exists,
	gte,
	inArray,
	isNotNull,
	isNull,
	lte,
	not,
	sql,
	type SQL
} from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { JobStatus } from '../../../jobs/status';
import { booking, changeOrder, customer, job, measure, payment, quote, user } from '../schema';
import type { StoreTx } from '../tenant';
import { jobScopeFilter, type JobScope } from './access';

/** The most lines of one kind the desk lists; the count says how many there are in all. */
export const DESK_LINES = 8;

export interface DeskJob {
	id: string;
	number: number;
	title: string;
	status: JobStatus;
	customerName: string;
	/** When the job came to need this (the quote sent, the state entered…). */
	since: Date;
}

export interface DeskRows {
	rows: DeskJob[];
	total: number;
}

const roomsMeasured = (jobId: SQL | typeof job.id) =>
	exists(
		sql`(select 1 from ${measure} where ${measure.organizationId} = ${job.organizationId} and ${measure.jobId} = ${jobId} and jsonb_array_length(coalesce(${measure.draft} -> 'rooms', '[]'::jsonb)) > 0)`
	);

const liveBooking = exists(
	sql`(select 1 from ${booking} where ${booking.organizationId} = ${job.organizationId} and ${booking.jobId} = ${job.id} and ${booking.cancelledAt} is null)`
);

/** Jobs of the store in the scope that meet `where`, oldest `since` first, with the total. */
async function jobsWhere(
	tx: StoreTx,
	scope: JobScope,
	where: SQL | undefined,
	since: SQL<Date> | typeof job.statusChangedAt = job.statusChangedAt
): Promise<DeskRows> {
	const filter = and(eq(job.organizationId, tx.storeId), jobScopeFilter(scope), where);
	const rows = await tx
		.select({
			id: job.id,
			number: job.number,
			title: job.title,
			status: job.status,
			customerName: customer.name,
			since: sql<Date>`${since}`.mapWith((v: string | Date) => new Date(v))
		})
		.from(job)
		.innerJoin(
			customer,
			and(eq(customer.id, job.customerId), eq(customer.organizationId, job.organizationId))
		)
		.where(filter)
		.orderBy(asc(since), asc(job.number))
		.limit(DESK_LINES);
	const [{ total }] = await tx.select({ total: count() }).from(job).where(filter);
	return { rows, total };
}

/** Draft jobs with no room measured yet. */
export function toMeasure(tx: StoreTx, scope: JobScope) {
	return jobsWhere(tx, scope, and(eq(job.status, 'draft'), not(roomsMeasured(job.id))));
}

/** Draft jobs with rooms measured: the quote is to be built or sent (again, after changes). */
export function toQuote(tx: StoreTx, scope: JobScope) {
	return jobsWhere(tx, scope, and(eq(job.status, 'draft'), roomsMeasured(job.id)));
}

/** Jobs whose quote is with the customer, oldest sent first. */
export function waitingOnCustomer(tx: StoreTx, scope: JobScope) {
	const sentAt = sql<Date>`coalesce((select max(${quote.sentAt}) from ${quote} where ${quote.organizationId} = ${job.organizationId} and ${quote.jobId} = ${job.id}), ${job.statusChangedAt})`;
	return jobsWhere(tx, scope, eq(job.status, 'quoted'), sentAt);
}

/** Accepted jobs whose deposit is not in yet. */
export function depositsDue(tx: StoreTx, scope: JobScope) {
	return jobsWhere(tx, scope, eq(job.status, 'accepted'));
}

/** Sold jobs with no live booking. */
export function toBook(tx: StoreTx, scope: JobScope) {
	return jobsWhere(tx, scope, and(eq(job.status, 'sold'), not(liveBooking)));
}

/**
 * Jobs with a change order the installer sent that no one has reviewed, oldest sent first. Read
 * from the change orders sent, not by testing every job of the store for one: a job has at most
 * one open change order (`change_order_one_open_uq`), so its sent one is its oldest, and each
 * line and each count is one job.
 */
export async function changeOrdersToReview(tx: StoreTx, scope: JobScope): Promise<DeskRows> {
	const filter = and(
		eq(changeOrder.organizationId, tx.storeId),
		eq(changeOrder.status, 'submitted'),
		eq(job.organizationId, tx.storeId),
		jobScopeFilter(scope)
	);
	const ofJob = and(
		eq(job.id, changeOrder.jobId),
		eq(job.organizationId, changeOrder.organizationId)
	);
	const rows = await tx
		.select({
			id: job.id,
			number: job.number,
			title: job.title,
			status: job.status,
			customerName: customer.name,
			since: changeOrder.createdAt
		})
		.from(changeOrder)
		.innerJoin(job, ofJob)
		.innerJoin(
			customer,
			and(eq(customer.id, job.customerId), eq(customer.organizationId, job.organizationId))
		)
		.where(filter)
		.orderBy(asc(changeOrder.createdAt), asc(job.number))
		.limit(DESK_LINES);
	const [{ total }] = await tx
		.select({ total: count() })
		.from(changeOrder)
		.innerJoin(job, ofJob)
		.where(filter);
	return { rows, total };
}

/** Completed jobs (the balance is asked for once the work is done), oldest first. */
export function completed(tx: StoreTx, scope: JobScope, limit: number) {
	return tx
		.select({ id: job.id })
		.from(job)
		.where(
			and(eq(job.organizationId, tx.storeId), jobScopeFilter(scope), eq(job.status, 'completed'))
		)
		.orderBy(asc(job.statusChangedAt))
		.limit(limit);
}

/** The rows of `ids` as desk lines (for kinds worked out outside SQL, such as balances). */
export async function deskJobs(tx: StoreTx, ids: string[]): Promise<DeskJob[]> {
	if (!ids.length) return [];
	return tx
		.select({
			id: job.id,
			number: job.number,
			title: job.title,
			status: job.status,
			customerName: customer.name,
			since: job.statusChangedAt
		})
		.from(job)
		.innerJoin(
			customer,
			and(eq(customer.id, job.customerId), eq(customer.organizationId, job.organizationId))
		)
		.where(and(eq(job.organizationId, tx.storeId), inArray(job.id, ids)))
		.orderBy(asc(job.statusChangedAt));
}

/** Payments whose checkout did not pay what they ask (amount or currency): never taken as paid. */
export async function paymentMismatches(tx: StoreTx, scope: JobScope) {
	const filter = and(
		eq(payment.organizationId, tx.storeId),
		isNotNull(payment.mismatch),
		jobScopeFilter(scope)
	);
	const rows = await tx
		.select({
			id: payment.id,
			jobId: job.id,
			number: job.number,
			title: job.title,
			note: payment.mismatch,
			since: payment.updatedAt
		})
		.from(payment)
		.innerJoin(job, and(eq(job.id, payment.jobId), eq(job.organizationId, payment.organizationId)))
		.where(filter)
		.orderBy(asc(payment.updatedAt))
		.limit(DESK_LINES);
	const [{ total }] = await tx
		.select({ total: count() })
		.from(payment)
		.innerJoin(job, and(eq(job.id, payment.jobId), eq(job.organizationId, payment.organizationId)))
		.where(filter);
	return { rows, total };
}

const installer = alias(user, 'installer');

/** Live bookings on any of the days from `from` to `to` (store dates, both included). */
export async function bookingsBetween(tx: StoreTx, scope: JobScope, from: string, to: string) {
	return tx
		.select({
			id: booking.id,
			jobId: job.id,
			number: job.number,
			title: job.title,
			customerName: customer.name,
			installerId: booking.installerId,
			installerName: installer.name,
			startsOn: booking.startsOn,
			days: booking.days
		})
		.from(booking)
		.innerJoin(job, and(eq(job.id, booking.jobId), eq(job.organizationId, booking.organizationId)))
		.innerJoin(
			customer,
			and(eq(customer.id, job.customerId), eq(customer.organizationId, job.organizationId))
		)
		.leftJoin(installer, eq(installer.id, booking.installerId))
		.where(
			and(
				eq(booking.organizationId, tx.storeId),
				isNull(booking.cancelledAt),
				lte(booking.startsOn, to),
				gte(sql`${booking.startsOn} + ${booking.days} - 1`, from),
				jobScopeFilter(scope)
			)
		)
		.orderBy(asc(installer.name), asc(booking.startsOn))
		.limit(200);
}
