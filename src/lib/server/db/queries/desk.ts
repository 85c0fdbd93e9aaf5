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
	type Placeholder,
	type SQL,
	type Subquery
} from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { JobStatus } from '../../../jobs/status';
import { addDays } from '../../../schedule/days';
import { MAX_BOOKING_DAYS } from '../../../schemas/crew';
import { booking, changeOrder, customer, job, payment, user } from '../schema';
import { literalLimit, oneOf, runShape } from '../named';
import type { StoreTx } from '../tenant';
import { jobScopeFilter, type JobScope } from './access';
import { statusIs } from './jobs';

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
	/** How many there are, counted as far as `DESK_COUNT_MAX`. */
	total: number;
	/** Whether there are more than `total` (the count stopped there). */
	totalCapped: boolean;
}

/**
 * The furthest a kind's total is counted: each count reads at most one more row than this, so no
 * desk reads a big store's every sold job to say how many there are (1,000+ is what it shows).
 */
export const DESK_COUNT_MAX = 1000;

/**
 * The desk's reads are statements built once per kind and scope and kept (`runShape`): the desk
 * sent some 30 statements a page, each parsed and planned again, 16 of PostgreSQL's 32 ms a page
 * on the big store (bench/README.md, "The desk's reads built once"). Their values are these
 * placeholders: the store, the scope's user, and a list of job ids. The week's bookings are the
 * exception (`bookingsBetween`).
 */
const P = {
	store: sql.placeholder('store'),
	viewer: sql.placeholder('viewer'),
	ids: sql.placeholder('ids')
};

/** The placeholders' values for a store transaction and a scope. */
function scopeValues(tx: StoreTx, scope: JobScope) {
	return { store: tx.storeId, viewer: 'userId' in scope ? scope.userId : null };
}

/**
 * Counts the rows of the query `build` makes (its select list one constant), as far as
 * `DESK_COUNT_MAX`, built once per `shape` like the rows it counts.
 */
async function countUpTo(
	tx: StoreTx,
	shape: string,
	build: () => { limit(n: Placeholder): { as(alias: string): Subquery } },
	values: Record<string, unknown>
): Promise<{ total: number; totalCapped: boolean }> {
	const [{ n }] = await runShape(
		tx,
		`desk.count ${shape}`,
		() =>
			tx.select({ n: count() }).from(
				build()
					.limit(literalLimit(DESK_COUNT_MAX + 1))
					.as('counted')
			),
		values
	);
	return { total: Math.min(n, DESK_COUNT_MAX), totalCapped: n > DESK_COUNT_MAX };
}

const one = () => sql<number>`1`.as('one');

/** What a desk line shows of its job, and the join to the job's customer it needs. */
const lineColumns = {
	id: job.id,
	number: job.number,
	title: job.title,
	status: job.status,
	customerName: customer.name
};
const ofCustomer = () =>
	and(eq(customer.id, job.customerId), eq(customer.organizationId, job.organizationId));

// Each kind's state written as SQL text, not a bound value (`statusIs`): the planner then proves
// the kind's partial index (see `job` in ../schema.ts, migration 0023) from it in every plan.
const draft = statusIs('draft');
const measured = sql`${job.roomsMeasured}`;
const notMeasured = sql`not ${job.roomsMeasured}`;

// `offset 0` keeps PostgreSQL from turning the test into an anti-join: for a plan kept for any
// store (`runShape`) it then hashed all of the store's 44,448 live bookings to count its sold jobs
// without one (23-33 ms); tested job by job, the count's 1,001 jobs take 5-8 ms (bench/README.md).
const liveBooking = exists(
	sql`(select 1 from ${booking} where ${booking.organizationId} = ${job.organizationId} and ${booking.jobId} = ${job.id} and ${booking.cancelledAt} is null offset 0)`
);

/**
 * Jobs of the store in the scope that meet `where` (the kind `kind`), oldest `since` first, with
 * the total.
 */
async function jobsWhere(
	tx: StoreTx,
	scope: JobScope,
	kind: string,
	where: SQL | undefined,
	since: SQL<Date> | typeof job.statusChangedAt = job.statusChangedAt
): Promise<DeskRows> {
	const filter = () => and(eq(job.organizationId, P.store), jobScopeFilter(scope, P.viewer), where);
	const shape = `${kind} ${scope.kind}`;
	const values = scopeValues(tx, scope);
	const rows = await runShape(
		tx,
		`desk.rows ${shape}`,
		() =>
			tx
				.select({
					...lineColumns,
					since: sql<Date>`${since}`.mapWith((v: string | Date) => new Date(v))
				})
				.from(job)
				.innerJoin(customer, ofCustomer())
				.where(filter())
				.orderBy(asc(since), asc(job.number))
				.limit(literalLimit(DESK_LINES)),
		values
	);
	const total = await countUpTo(
		tx,
		shape,
		() => tx.select({ one: one() }).from(job).where(filter()),
		values
	);
	return { rows, ...total };
}

/** Draft jobs with no room measured yet. */
export function toMeasure(tx: StoreTx, scope: JobScope) {
	return jobsWhere(tx, scope, 'measure', and(draft, notMeasured));
}

/** Draft jobs with rooms measured: the quote is to be built or sent (again, after changes). */
export function toQuote(tx: StoreTx, scope: JobScope) {
	return jobsWhere(tx, scope, 'quote', and(draft, measured));
}

/** Jobs whose quote is with the customer, longest since its latest version was sent first. */
export function waitingOnCustomer(tx: StoreTx, scope: JobScope) {
	// The same expression as `job_quoted_since_idx`'s, so its order is the index's.
	const sentAt = sql<Date>`coalesce(${job.quoteSentAt}, ${job.statusChangedAt})`;
	return jobsWhere(tx, scope, 'waiting', statusIs('quoted'), sentAt);
}

/** Accepted jobs whose deposit is not in yet. */
export function depositsDue(tx: StoreTx, scope: JobScope) {
	return jobsWhere(tx, scope, 'deposits', statusIs('accepted'));
}

/** Sold jobs with no live booking. */
export function toBook(tx: StoreTx, scope: JobScope) {
	return jobsWhere(tx, scope, 'book', and(statusIs('sold'), not(liveBooking)));
}

/**
 * Jobs with a change order the installer sent that no one has reviewed, oldest sent first. Read
 * from the change orders sent, not by testing every job of the store for one: a job has at most
 * one open change order (`change_order_one_open_uq`), so its sent one is its oldest, and each
 * line and each count is one job.
 */
export async function changeOrdersToReview(tx: StoreTx, scope: JobScope): Promise<DeskRows> {
	const sent = () =>
		and(eq(changeOrder.organizationId, P.store), sql`${changeOrder.status} = 'submitted'`);
	const scoped = () => jobScopeFilter(scope, P.viewer);
	const filter = () => and(sent(), eq(job.organizationId, P.store), scoped());
	const ofJob = () =>
		and(eq(job.id, changeOrder.jobId), eq(job.organizationId, changeOrder.organizationId));
	const values = scopeValues(tx, scope);
	const rows = await runShape(
		tx,
		`desk.rows change-orders ${scope.kind}`,
		() =>
			tx
				.select({
					...lineColumns,
					since: changeOrder.createdAt
				})
				.from(changeOrder)
				.innerJoin(job, ofJob())
				.innerJoin(customer, ofCustomer())
				.where(filter())
				.orderBy(asc(changeOrder.createdAt), asc(job.number))
				.limit(literalLimit(DESK_LINES)),
		values
	);
	// The whole store's are counted from `change_order_submitted_idx` alone: each is of one of the
	// store's jobs (its same-store foreign key), so the join only narrows to a scope.
	const total = await countUpTo(
		tx,
		`change-orders ${scope.kind}`,
		() =>
			scoped()
				? tx.select({ one: one() }).from(changeOrder).innerJoin(job, ofJob()).where(filter())
				: tx.select({ one: one() }).from(changeOrder).where(sent()),
		values
	);
	return { rows, ...total };
}

/** Completed jobs (the balance is asked for once the work is done), oldest first: `limit` of them. */
export function completed(tx: StoreTx, scope: JobScope, limit: number) {
	return runShape(
		tx,
		`desk.completed ${scope.kind} ${limit}`,
		() =>
			tx
				.select({ id: job.id })
				.from(job)
				.where(
					and(
						eq(job.organizationId, P.store),
						jobScopeFilter(scope, P.viewer),
						statusIs('completed')
					)
				)
				.orderBy(asc(job.statusChangedAt), asc(job.number))
				.limit(literalLimit(limit)),
		scopeValues(tx, scope)
	);
}

/** The rows of `ids` as desk lines (for kinds worked out outside SQL, such as balances). */
export async function deskJobs(tx: StoreTx, ids: string[]): Promise<DeskJob[]> {
	if (!ids.length) return [];
	return runShape(
		tx,
		'desk.jobs',
		() =>
			tx
				.select({
					...lineColumns,
					since: job.statusChangedAt
				})
				.from(job)
				.innerJoin(customer, ofCustomer())
				.where(and(eq(job.organizationId, P.store), oneOf(job.id, P.ids)))
				.orderBy(asc(job.statusChangedAt)),
		{ store: tx.storeId, ids }
	);
}

/** Payments whose checkout did not pay what they ask (amount or currency): never taken as paid. */
export async function paymentMismatches(tx: StoreTx, scope: JobScope) {
	const filter = () =>
		and(
			eq(payment.organizationId, P.store),
			isNotNull(payment.mismatch),
			jobScopeFilter(scope, P.viewer)
		);
	const ofJob = () =>
		and(eq(job.id, payment.jobId), eq(job.organizationId, payment.organizationId));
	const values = scopeValues(tx, scope);
	const rows = await runShape(
		tx,
		`desk.rows reconcile ${scope.kind}`,
		() =>
			tx
				.select({
					id: payment.id,
					jobId: job.id,
					number: job.number,
					title: job.title,
					note: payment.mismatch,
					since: payment.updatedAt
				})
				.from(payment)
				.innerJoin(job, ofJob())
				.where(filter())
				.orderBy(asc(payment.updatedAt))
				.limit(literalLimit(DESK_LINES)),
		values
	);
	const total = await countUpTo(
		tx,
		`reconcile ${scope.kind}`,
		() => tx.select({ one: one() }).from(payment).innerJoin(job, ofJob()).where(filter()),
		values
	);
	return { rows, ...total };
}

const installer = alias(user, 'installer');

/** The most bookings the desk's week shows. */
export const WEEK_BOOKINGS = 200;

/**
 * Live bookings on any of the days from `from` to `to` (store dates, both included): the first
 * `WEEK_BOOKINGS` by installer and day, and whether there are more.
 */
export async function bookingsBetween(tx: StoreTx, scope: JobScope, from: string, to: string) {
	// The week's bookings first, alone (joined to the job only to narrow to a scope), then their
	// jobs by id. As one join, PostgreSQL guessed thousands of bookings for a week of a big store
	// (it cannot know that another store's dates are not this one's) and read all of the store's
	// jobs to hash them: 85-105 ms where the week's 256 bookings take 1 ms. Planned on every run,
	// not kept: a plan for any week (its days parameters) reads the store's days index, 2.4 ms,
	// where the plan for this week's days reads the live bookings' ends, 1.5 ms (bench/README.md).
	const scoped = jobScopeFilter(scope);
	const where = and(
		eq(booking.organizationId, tx.storeId),
		isNull(booking.cancelledAt),
		lte(booking.startsOn, to),
		gte(booking.endsOn, from),
		// No booking is longer than its check allows: those reaching into the week started at most
		// that many days before it, so the days index is read from there, not from the first.
		gte(booking.startsOn, addDays(from, 1 - MAX_BOOKING_DAYS)),
		scoped
	);
	const columns = {
		id: booking.id,
		jobId: booking.jobId,
		installerId: booking.installerId,
		installerName: installer.name,
		startsOn: booking.startsOn,
		days: booking.days
	};
	const query = tx
		.select(columns)
		.from(booking)
		.leftJoin(installer, eq(installer.id, booking.installerId))
		.$dynamic();
	if (scoped)
		query.innerJoin(
			job,
			and(eq(job.id, booking.jobId), eq(job.organizationId, booking.organizationId))
		);
	const week = await query
		.where(where)
		.orderBy(asc(installer.name), asc(booking.startsOn), asc(booking.id))
		.limit(WEEK_BOOKINGS + 1);
	// One past the most says whether there are more than the desk shows.
	const more = week.length > WEEK_BOOKINGS;
	if (more) week.length = WEEK_BOOKINGS;
	if (!week.length) return { bookings: [], more };
	const jobs = await tx
		.select({ id: job.id, number: job.number, title: job.title, customerName: customer.name })
		.from(job)
		.innerJoin(customer, ofCustomer())
		.where(
			and(
				eq(job.organizationId, tx.storeId),
				inArray(job.id, [...new Set(week.map((b) => b.jobId))])
			)
		);
	const byId = new Map(jobs.map((j) => [j.id, j]));
	const bookings = week.flatMap((b) => {
		const j = byId.get(b.jobId);
		// Every booking has its job (the same-store foreign key); none is made up if it had not.
		return j ? [{ ...b, number: j.number, title: j.title, customerName: j.customerName }] : [];
	});
	return { bookings, more };
}
