import { and, asc, count, desc, eq, ilike, inArray, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { canDelete, canMove, type JobStatus } from '../../../jobs/status';
import type { JobListQuery } from '../../../schemas/job';
import { rolesThatCan } from '../../permissions';
import {
	booking,
	customer,
	job,
	jobEvent,
	jobNumberCounter,
	member,
	payment,
	quote,
	user
} from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { jobScopeFilter, type JobScope } from './access';
import { likePattern } from './customers';

export type Job = typeof job.$inferSelect;

/** Which of the store's jobs the reader sees: a member's `scope`, or `WHOLE_STORE`. */
export type JobViewer = JobScope;

const installer = alias(user, 'installer');
const salesperson = alias(user, 'salesperson');

const viewerFilter = jobScopeFilter;

/** The roles a job can be assigned to: those who work assigned jobs. */
const assignable = () => inArray(member.role, rolesThatCan({ assignedJob: ['report'] }));

const jobColumns = {
	id: job.id,
	number: job.number,
	title: job.title,
	status: job.status,
	customerId: job.customerId,
	customerName: customer.name,
	customerPhone: customer.phone,
	siteId: job.siteId,
	installerId: job.installerId,
	installerName: installer.name,
	salespersonId: job.salespersonId,
	salespersonName: salesperson.name,
	notes: job.notes,
	statusChangedAt: job.statusChangedAt,
	updatedAt: job.updatedAt,
	createdAt: job.createdAt
};

const sortColumns = {
	number: job.number,
	status: job.status,
	updated: job.updatedAt,
	customer: customer.name
} as const;

/** The job columns every view uses, with the customer's and people's names. */
function selectJobs(tx: StoreTx) {
	return tx
		.select(jobColumns)
		.from(job)
		.innerJoin(
			customer,
			and(eq(customer.id, job.customerId), eq(customer.organizationId, job.organizationId))
		)
		.leftJoin(installer, eq(installer.id, job.installerId))
		.leftJoin(salesperson, eq(salesperson.id, job.salespersonId));
}

/**
 * How far a job list counts: past this many (beyond the page's offset) it says "1,000+" rather
 * than read every matching index entry of a large store. Also how many search matches are taken
 * by id from the search function (below); more than that and the search filters as it walks.
 */
export const COUNT_CAP = 1000;

/**
 * How many search matches are taken by id when the list is sorted by customer: walking the
 * customers in name order and testing each one's jobs is slow when the matches sit with a few
 * customers, while sorting a few thousand ids read by primary key stays cheap.
 */
export const SEARCH_IDS_BY_NAME = 5000;

/**
 * The search's condition on `job`: the title or the customer's name contains the text (case
 * ignored, wildcards taken literally), or it is the job's number.
 *
 * Row-level security keeps `ilike` from being an index condition for the app's role (it is not
 * leakproof), so the trigram indexes are reached through `job_search_ids` (migration 0016): a
 * security-definer function that reads the store from `app.store_id` itself and returns only ids.
 * Up to `cap` matches, the list reads those ids by primary key. A text so common that it
 * matches more is tested row by row as the list walks its sort order, which finds a page quickly
 * exactly because the matches are many. `matches`: how many, when the ids are all of them.
 */
async function searchFilter(
	tx: StoreTx,
	q: string,
	cap: number
): Promise<{ filter: SQL; many: boolean; matches?: number }> {
	const pattern = likePattern(q);
	const asNumber = /^j?-?(\d{1,9})$/i.exec(q)?.[1];
	const byNumber = asNumber ? eq(job.number, Number(asNumber)) : undefined;
	const found = await tx.execute<{ id: string }>(
		sql`select s.id from job_search_ids(${pattern}, ${cap + 1}) as s(id)`
	);
	if (found.rows.length <= cap) {
		const ids = found.rows.map((r) => r.id);
		return {
			filter: or(sql`${job.id} = any(${sql.param(ids)}::text[])`, byNumber) as SQL,
			many: false,
			// The number may be one more job: then it is counted.
			matches: byNumber ? undefined : ids.length
		};
	}
	// The customers whose name matches, as a list of ids: the filter stays on `job` alone, so
	// the count reads no customer rows (bench/README.md).
	const named = tx
		.select({ id: customer.id })
		.from(customer)
		.where(and(eq(customer.organizationId, tx.storeId), ilike(customer.name, pattern)));
	return {
		filter: or(
			ilike(job.title, pattern),
			sql`${job.customerId} = any(array(${named}))`,
			byNumber
		) as SQL,
		many: true
	};
}

/**
 * A page of the store's jobs as the viewer may see them, and how many there are: exact up to
 * COUNT_CAP past the page's start, then `totalCapped` says there are more than `total`.
 */
export async function list(
	tx: StoreTx,
	query: JobListQuery & { customerId?: string; salespersonId?: string },
	viewer: JobViewer
) {
	const filters = [eq(job.organizationId, tx.storeId), viewerFilter(viewer)];
	if (query.status) filters.push(eq(job.status, query.status));
	if (query.customerId) filters.push(eq(job.customerId, query.customerId));
	if (query.salespersonId) filters.push(eq(job.salespersonId, query.salespersonId));
	// Whether anything but the search narrows the store's jobs (viewerFilter is undefined for all).
	const narrowed = filters.length > 2 || viewer.kind !== 'store';
	const searchCap = query.sort === 'customer' ? SEARCH_IDS_BY_NAME : COUNT_CAP;
	const search = query.q ? await searchFilter(tx, query.q, searchCap) : undefined;
	if (search) filters.push(search.filter);
	const where = and(...filters);
	const order = query.dir === 'asc' ? asc : desc;
	const orderBy = [order(sortColumns[query.sort]), desc(job.number)];
	const offset = (query.page - 1) * query.pageSize;
	// A later page skips its offset on `job` alone (with the customer only to sort by its name),
	// then reads its people for the page's rows: not for every row skipped.
	const rows = offset
		? await selectJobs(tx)
				.where(
					and(
						eq(job.organizationId, tx.storeId),
						inArray(
							job.id,
							(query.sort === 'customer'
								? tx
										.select({ id: job.id })
										.from(job)
										.innerJoin(
											customer,
											and(
												eq(customer.id, job.customerId),
												eq(customer.organizationId, job.organizationId)
											)
										)
								: tx.select({ id: job.id }).from(job)
							)
								.where(where)
								.orderBy(...orderBy)
								.limit(query.pageSize)
								.offset(offset)
						)
					)
				)
				.orderBy(...orderBy)
		: await selectJobs(tx)
				.where(where)
				.orderBy(...orderBy)
				.limit(query.pageSize);
	// Every job has its store's customer (`job_customer_same_store_fk`): counted from `job` alone,
	// and only as far as `upTo`: an exact count of 100,000 jobs reads 100,000 index entries.
	const upTo = offset + COUNT_CAP;
	// Nothing but the search narrows the list: what it found says how many, without a count.
	if (search && !narrowed) {
		if (search.many && searchCap >= upTo) return { rows, total: upTo, totalCapped: true };
		if (search.matches !== undefined) {
			return {
				rows,
				total: Math.min(search.matches, upTo),
				totalCapped: search.matches > upTo
			};
		}
	}
	const counted = tx
		.select({ one: sql`1`.as('one') })
		.from(job)
		.where(where)
		.limit(upTo + 1)
		.as('counted');
	const [{ n }] = await tx.select({ n: count() }).from(counted);
	return { rows, total: Math.min(n, upTo), totalCapped: n > upTo };
}

export type JobRow = Awaited<ReturnType<typeof list>>['rows'][number];

/** One job with its people as the viewer may see it: undefined when not the store's or not theirs. */
export async function readForViewer(tx: StoreTx, id: string, viewer: JobViewer) {
	const [row] = await selectJobs(tx).where(
		and(eq(job.organizationId, tx.storeId), eq(job.id, id), viewerFilter(viewer))
	);
	return row;
}

/**
 * One job of the store with its people, whoever asks: for workflows and the customer's link,
 * which are not a member looking. Undefined when it is not the store's.
 */
export async function readForStore(tx: StoreTx, id: string) {
	const [row] = await selectJobs(tx).where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)));
	return row;
}

/** The version the job's customer links are signed with (see `job.link_version`). */
export async function linkVersion(tx: StoreTx, id: string): Promise<number | undefined> {
	const [row] = await tx
		.select({ v: job.linkVersion })
		.from(job)
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)));
	return row?.v;
}

/** Raises the job's link version: every customer link made before stops working. */
export async function raiseLinkVersion(tx: StoreWriteTx, id: string): Promise<number | undefined> {
	const [row] = await tx
		.update(job)
		.set({ linkVersion: sql`${job.linkVersion} + 1`, updatedAt: new Date() })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.returning({ v: job.linkVersion });
	return row?.v;
}

/** Whether the job has a live (not cancelled) booking on the schedule. */
export async function isBooked(tx: StoreTx, id: string): Promise<boolean> {
	const [row] = await tx
		.select({ id: booking.id })
		.from(booking)
		.where(
			and(
				eq(booking.organizationId, tx.storeId),
				eq(booking.jobId, id),
				sql`${booking.cancelledAt} is null`
			)
		)
		.limit(1);
	return Boolean(row);
}

/** Counts of the viewer's jobs per status. */
export async function countByStatus(tx: StoreTx, viewer: JobViewer) {
	const rows = await tx
		.select({ status: job.status, n: count() })
		.from(job)
		.where(and(eq(job.organizationId, tx.storeId), viewerFilter(viewer)))
		.groupBy(job.status);
	return Object.fromEntries(rows.map((r) => [r.status, r.n])) as Partial<Record<JobStatus, number>>;
}

/** The first number a store gives (shown as J-1001). */
const FIRST_JOB_NUMBER = 1001;

/**
 * Creates a draft job for a customer of the same store. Returns undefined when the customer is
 * not the store's. Numbers are per store and never given twice (see `jobNumberCounter`).
 */
export async function create(
	tx: StoreWriteTx,
	input: { customerId: string; title: string; notes?: string },
	actorId: string
): Promise<Job | undefined> {
	const [owner] = await tx
		.select({ id: customer.id })
		.from(customer)
		.where(and(eq(customer.organizationId, tx.storeId), eq(customer.id, input.customerId)));
	if (!owner) return undefined;
	// The store's counter row, locked by the upsert until this transaction ends: never a number
	// given before, even to a job since deleted.
	const [{ number }] = await tx
		.insert(jobNumberCounter)
		.values({ organizationId: tx.storeId, lastNumber: FIRST_JOB_NUMBER })
		.onConflictDoUpdate({
			target: jobNumberCounter.organizationId,
			set: { lastNumber: sql`${jobNumberCounter.lastNumber} + 1` }
		})
		.returning({ number: jobNumberCounter.lastNumber });
	const [row] = await tx
		.insert(job)
		.values({
			organizationId: tx.storeId,
			number,
			customerId: input.customerId,
			title: input.title,
			notes: input.notes ?? '',
			salespersonId: actorId
		})
		.returning();
	await tx.insert(jobEvent).values({
		organizationId: tx.storeId,
		jobId: row.id,
		kind: 'created',
		toStatus: row.status,
		actorId
	});
	return row;
}

export async function update(
	tx: StoreWriteTx,
	id: string,
	input: { title?: string; notes?: string }
): Promise<Job | undefined> {
	const [row] = await tx
		.update(job)
		.set({ ...input, updatedAt: new Date() })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.returning();
	return row;
}

/** A job's status, its row locked until the transaction ends; undefined when not the store's. */
export async function lockStatus(tx: StoreWriteTx, id: string) {
	const [row] = await tx
		.select({ status: job.status })
		.from(job)
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.for('update');
	return row?.status;
}

export type MoveResult =
	| { ok: true; job: Job }
	| { ok: false; reason: 'not_found' }
	| { ok: false; reason: 'not_allowed'; from: JobStatus };

/**
 * Moves a job to another status when the state machine allows it, recording who and why. The
 * row is locked for the check, so two people moving the same job cannot both succeed.
 */
export async function move(
	tx: StoreWriteTx,
	id: string,
	to: JobStatus,
	actorId: string | null,
	note = ''
): Promise<MoveResult> {
	const from = await lockStatus(tx, id);
	if (!from) return { ok: false, reason: 'not_found' };
	if (!canMove(from, to)) return { ok: false, reason: 'not_allowed', from };
	const now = new Date();
	const [row] = await tx
		.update(job)
		.set({ status: to, statusChangedAt: now, updatedAt: now })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.returning();
	await tx.insert(jobEvent).values({
		organizationId: tx.storeId,
		jobId: id,
		kind: 'status',
		fromStatus: from,
		toStatus: to,
		actorId,
		note
	});
	return { ok: true, job: row };
}

/** The store's members with the installer role, for assigning jobs. */
export async function listInstallers(tx: StoreTx) {
	return tx
		.select({ id: user.id, name: user.name, email: user.email })
		.from(member)
		.innerJoin(user, eq(user.id, member.userId))
		.where(and(eq(member.organizationId, tx.storeId), assignable()))
		.orderBy(asc(user.name));
}

export type AssignResult = 'assigned' | 'not_found' | 'not_an_installer';

/** Assigns (or, with null, unassigns) an installer who is a member of the same store. */
export async function assign(
	tx: StoreWriteTx,
	id: string,
	installerId: string | null,
	actorId: string
): Promise<AssignResult> {
	if (installerId) {
		const [m] = await tx
			.select({ id: member.id })
			.from(member)
			.where(
				and(eq(member.organizationId, tx.storeId), eq(member.userId, installerId), assignable())
			);
		if (!m) return 'not_an_installer';
	}
	const updated = await tx
		.update(job)
		.set({ installerId, updatedAt: new Date() })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.returning({ id: job.id });
	if (!updated.length) return 'not_found';
	await tx.insert(jobEvent).values({
		organizationId: tx.storeId,
		jobId: id,
		kind: 'assigned',
		actorId,
		note: installerId ?? ''
	});
	return 'assigned';
}

/**
 * Deletes a job that may still be deleted (see `canDelete`) and has no quote and no money on it;
 * others are kept for their history and are cancelled instead (sent quotes are kept for good).
 */
export async function remove(
	tx: StoreWriteTx,
	id: string
): Promise<'deleted' | 'not_found' | 'not_draft'> {
	const status = await lockStatus(tx, id);
	if (!status) return 'not_found';
	if (!canDelete(status)) return 'not_draft';
	const [{ quotes }] = await tx
		.select({ quotes: count() })
		.from(quote)
		.where(and(eq(quote.organizationId, tx.storeId), eq(quote.jobId, id)));
	const [{ payments }] = await tx
		.select({ payments: count() })
		.from(payment)
		.where(and(eq(payment.organizationId, tx.storeId), eq(payment.jobId, id)));
	if (quotes > 0 || payments > 0) return 'not_draft';
	await tx.delete(job).where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)));
	return 'deleted';
}

/** A job's history, newest first, with who did each step. */
export async function events(tx: StoreTx, jobId: string) {
	return tx
		.select({
			id: jobEvent.id,
			kind: jobEvent.kind,
			fromStatus: jobEvent.fromStatus,
			toStatus: jobEvent.toStatus,
			note: jobEvent.note,
			createdAt: jobEvent.createdAt,
			actorName: user.name
		})
		.from(jobEvent)
		.leftJoin(user, eq(user.id, jobEvent.actorId))
		.where(and(eq(jobEvent.organizationId, tx.storeId), eq(jobEvent.jobId, jobId)))
		.orderBy(desc(jobEvent.createdAt), desc(sql`${jobEvent.id}`));
}
