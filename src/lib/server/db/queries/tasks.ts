import { and, desc, eq, inArray, isNotNull, or, sql, type SQL } from 'drizzle-orm';
import { job, task, user } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';

export type TaskRow = typeof task.$inferSelect;
export type TaskState = TaskRow['state'];

export async function insert(
	tx: StoreWriteTx,
	values: Pick<TaskRow, 'kind' | 'payload' | 'summary'> &
		Partial<Pick<TaskRow, 'jobId' | 'createdBy'>>
): Promise<TaskRow> {
	const [row] = await tx
		.insert(task)
		.values({ ...values, organizationId: tx.storeId })
		.returning();
	return row;
}

export async function read(tx: StoreTx, id: string): Promise<TaskRow | undefined> {
	const [row] = await tx
		.select()
		.from(task)
		.where(and(eq(task.organizationId, tx.storeId), eq(task.id, id)));
	return row;
}

/**
 * A task of the store still queued, in the round it was queued in (`round`: how many times it
 * was sent again). A task sent again is a new round: what is left of the old one (a retry, its
 * dead letter) no longer touches it.
 */
const queuedIn = (tx: StoreTx, id: string, round: number) =>
	and(
		eq(task.organizationId, tx.storeId),
		eq(task.id, id),
		eq(task.round, round),
		eq(task.state, 'queued')
	);

/**
 * Counts a new attempt of a task still queued in this round: undefined when the task is gone,
 * ended, or in another round (nothing more to do then).
 */
export async function startAttempt(
	tx: StoreWriteTx,
	id: string,
	round: number
): Promise<TaskRow | undefined> {
	const [row] = await tx
		.update(task)
		.set({ attempts: sql`${task.attempts} + 1`, updatedAt: new Date() })
		.where(queuedIn(tx, id, round))
		.returning();
	return row;
}

/**
 * Ends a task of this round: done, failed (retries spent) or dropped, unless it already ended.
 * `error` is why; as a `fallback` it is kept only when no attempt noted an error of its own.
 */
export async function finish(
	tx: StoreWriteTx,
	id: string,
	round: number,
	state: Exclude<TaskState, 'queued'>,
	error: string | null = null,
	fallback = false
): Promise<boolean> {
	const ended = await tx
		.update(task)
		.set({
			state,
			...(error === null
				? {}
				: { lastError: fallback ? sql`coalesce(${task.lastError}, ${error})` : error }),
			finishedAt: new Date(),
			updatedAt: new Date()
		})
		.where(queuedIn(tx, id, round))
		.returning({ id: task.id });
	return ended.length > 0;
}

/** Notes why an attempt failed; the task stays queued for its next attempt. */
export async function noteError(tx: StoreWriteTx, id: string, round: number, lastError: string) {
	await tx
		.update(task)
		.set({ lastError, updatedAt: new Date() })
		.where(queuedIn(tx, id, round));
}

/** Puts a failed task back in the queue as a new round: its attempts start again. */
export async function requeue(tx: StoreWriteTx, id: string): Promise<TaskRow | undefined> {
	const [row] = await tx
		.update(task)
		.set({
			state: 'queued',
			round: sql`${task.round} + 1`,
			attempts: 0,
			finishedAt: null,
			updatedAt: new Date()
		})
		.where(and(eq(task.organizationId, tx.storeId), eq(task.id, id), eq(task.state, 'failed')))
		.returning();
	return row;
}

function listWhere(tx: StoreTx, where: SQL | undefined, limit: number) {
	return tx
		.select({
			id: task.id,
			kind: task.kind,
			summary: task.summary,
			state: task.state,
			attempts: task.attempts,
			lastError: task.lastError,
			jobId: task.jobId,
			jobNumber: job.number,
			createdAt: task.createdAt,
			updatedAt: task.updatedAt,
			finishedAt: task.finishedAt,
			createdByName: user.name
		})
		.from(task)
		.leftJoin(job, and(eq(job.id, task.jobId), eq(job.organizationId, task.organizationId)))
		.leftJoin(user, eq(user.id, task.createdBy))
		.where(and(eq(task.organizationId, tx.storeId), where))
		.orderBy(desc(task.createdAt))
		.limit(Math.min(limit, 200));
}

/** The store's tasks in these states, newest first, with their job's number (at most `limit`). */
export async function list(tx: StoreTx, states: TaskState[], limit = 50) {
	return listWhere(tx, inArray(task.state, states), limit);
}

/** Tasks a manager should know of: those that failed, and those being retried after an error. */
export async function needingAttention(tx: StoreTx, limit = 20) {
	return listWhere(
		tx,
		or(eq(task.state, 'failed'), and(eq(task.state, 'queued'), isNotNull(task.lastError))),
		limit
	);
}

/** How many of the store's tasks are in each state. */
export async function countByState(tx: StoreTx): Promise<Partial<Record<TaskState, number>>> {
	const rows = await tx
		.select({ state: task.state, n: sql<number>`count(*)::int` })
		.from(task)
		.where(eq(task.organizationId, tx.storeId))
		.groupBy(task.state);
	return Object.fromEntries(rows.map((r) => [r.state, r.n]));
}
