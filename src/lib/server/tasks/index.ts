import type PgBoss from 'pg-boss';
import { pool } from '../db';
import * as tasks from '../db/queries/tasks';
import { afterCommit, clientOf, type StoreWriteTx } from '../db/tenant';
import { appBoss } from './boss';
import { TASK_KINDS, TASK_QUEUE, type TaskData, type TaskKind, type TaskPayload } from './kinds';
import { taskTiming } from './timing';

export { MAIL_PURPOSES, type MailPurpose, type TaskKind } from './kinds';

/** What a task is about, for the store's record of it. */
export interface TaskAbout {
	/** In words, for the people of the store ("Quote to greta@…"). */
	summary?: string;
	/** The job it concerns, to link to. */
	jobId?: string | null;
	createdBy?: string | null;
}

/** How a task is queued; each kind has its own defaults (./kinds.ts). */
export interface QueueOptions {
	retryLimit?: number;
	retryDelaySeconds?: number;
	expireInSeconds?: number;
	/** Not before this many seconds from now. */
	startAfterSeconds?: number;
	/** At most one task of this key in this many seconds (pg-boss's throttle). */
	singleton?: { key: string; seconds: number };
	boss?: PgBoss;
}

// Workers of this process, woken when a task they may run has just been committed, so it does not
// wait for their next poll.
const localWorkers = new Set<() => void>();

/** Registers a way to wake a worker of this process; returns how to forget it. */
export function onTaskQueued(wake: () => void): () => void {
	localWorkers.add(wake);
	return () => localWorkers.delete(wake);
}

function wakeWorkers() {
	for (const wake of localWorkers) wake();
}

function sendOptions<K extends TaskKind>(kind: K, options: QueueOptions): PgBoss.SendOptions {
	const def = TASK_KINDS[kind];
	const timing = taskTiming();
	return {
		retryLimit: options.retryLimit ?? def.retry.limit,
		retryDelay:
			options.retryDelaySeconds ??
			(def.retry.delaySeconds ? (timing.retryDelaySeconds ?? def.retry.delaySeconds) : 0),
		retryBackoff: true,
		expireInSeconds: options.expireInSeconds ?? timing.expireSeconds ?? def.expireInSeconds,
		...(options.startAfterSeconds ? { startAfter: options.startAfterSeconds } : {}),
		...(options.singleton
			? { singletonKey: options.singleton.key, singletonSeconds: options.singleton.seconds }
			: {})
	};
}

/**
 * Queues a task in the caller's transaction: the store's record of it (for recorded kinds) and
 * pg-boss's own row are written on the transaction's connection, so they commit with the change
 * that causes the task, or roll back with it and nothing is ever sent. Returns the task's id (the
 * record's, or pg-boss's), or null when a throttled task of the same key is already queued.
 */
export async function enqueue<K extends TaskKind>(
	tx: StoreWriteTx,
	kind: K,
	payload: TaskPayload<K>,
	about: TaskAbout = {},
	options: QueueOptions = {}
): Promise<string | null> {
	const def = TASK_KINDS[kind];
	const checked = def.payload.parse(payload) as Record<string, unknown>;
	const record = def.recorded
		? await tasks.insert(tx, {
				kind,
				payload: checked,
				summary: about.summary ?? '',
				jobId: about.jobId ?? null,
				createdBy: about.createdBy ?? null
			})
		: undefined;
	const id = await send(
		{ kind, storeId: tx.storeId, taskId: record?.id ?? null, round: 0, payload: checked },
		{ ...sendOptions(kind, options), db: txDb(tx) },
		options.boss
	);
	if (!id && !options.singleton) throw new Error(`The ${kind} task was not queued`);
	afterCommit(tx, wakeWorkers);
	return record?.id ?? id;
}

/**
 * Queues a task that belongs to no store (a password reset), in a transaction of its own: there is
 * no store record of it, so its failures are logged, not shown to a store.
 */
export async function enqueueOutsideStore<K extends TaskKind>(
	kind: K,
	payload: TaskPayload<K>,
	options: QueueOptions = {}
): Promise<string> {
	const checked = TASK_KINDS[kind].payload.parse(payload);
	const id = await send(
		{ kind, storeId: null, taskId: null, payload: checked },
		{ ...sendOptions(kind, options), db: poolDb },
		options.boss
	);
	if (!id) throw new Error(`The ${kind} task was not queued`);
	wakeWorkers();
	return id;
}

/**
 * Sends a failed task again, as new, in the caller's transaction; undefined when it is not the
 * store's or has not failed.
 */
export async function resend(
	tx: StoreWriteTx,
	taskId: string,
	options: QueueOptions = {}
): Promise<tasks.TaskRow | undefined> {
	const row = await tasks.requeue(tx, taskId);
	if (!row || !Object.hasOwn(TASK_KINDS, row.kind)) return undefined;
	const kind = row.kind as TaskKind;
	await send(
		{ kind, storeId: tx.storeId, taskId: row.id, round: row.round, payload: row.payload },
		{ ...sendOptions(kind, options), db: txDb(tx) },
		options.boss
	);
	afterCommit(tx, wakeWorkers);
	return row;
}

/** pg-boss's SQL run on the app's pool, whether or not this process's pg-boss has started. */
const poolDb: PgBoss.Db = { executeSql: (text, values) => pool.query(text, values) };

/** pg-boss's SQL run on the transaction's own connection. */
function txDb(tx: StoreWriteTx): PgBoss.Db {
	const client = clientOf(tx);
	return { executeSql: (text, values) => client.query(text, values) };
}

function send(data: TaskData, options: PgBoss.SendOptions, boss = appBoss()) {
	return boss.send(TASK_QUEUE, data as unknown as object, options);
}
