import { log } from '../log';
import type pg from 'pg';
import type PgBoss from 'pg-boss';
import type Stripe from 'stripe';
import { pool as appPool } from '../db';
import * as tasks from '../db/queries/tasks';
import { inStore } from '../db/tenant';
import type { SendMail } from '../mail/send';
import { appBoss } from './boss';
import { handlers, type TaskDeps } from './handlers';
import { onTaskQueued } from './index';
import { DEAD_QUEUE, TASK_KINDS, TASK_QUEUE, isTaskKind, type TaskData } from './kinds';

export interface WorkerOptions {
	sendMail: SendMail;
	stripe: Stripe;
	/** The pg-boss to work with (the app's own by default). */
	boss?: PgBoss;
	/** The pool the worker's store transactions use (the app's by default). */
	pool?: pg.Pool;
	/** Tasks run at once. */
	concurrency?: number;
	pollingIntervalSeconds?: number;
	/** Asks for the periodic work every half hour (the server does; tests do not). */
	schedule?: boolean;
}

export interface TaskWorker {
	/** Finishes what is running (up to `timeoutMs`), then stops; what is left is retried later. */
	stop(timeoutMs?: number): Promise<void>;
}

const errorText = (e: unknown) => (e instanceof Error ? e.message : String(e)).slice(0, 2000);

/**
 * Runs one task. A kind this code does not know, or a payload its kind refuses, is logged and
 * dropped: never retried. A recorded task counts the attempt before it runs (a worker that dies
 * mid-task still leaves the attempt counted), is skipped when it already ended, and is marked
 * done after. A failure is noted on the record and thrown, so pg-boss retries it with backoff.
 */
async function runTask(job: PgBoss.JobWithMetadata<TaskData>, deps: TaskDeps, pool: pg.Pool) {
	const { kind, storeId, taskId, payload, round = 0 } = job.data ?? ({} as TaskData);
	// The store's record of the task: recorded kinds of a store have one (a password reset has none).
	const record = storeId && taskId ? { storeId, taskId } : null;
	const drop = async (why: string) => {
		log.error({ queueId: job.id, kind: String(kind), why }, 'Task dropped');
		if (record) {
			await inStore(storeId!, (tx) => tasks.finish(tx, taskId!, round, 'dropped', why), pool);
		}
	};
	if (!isTaskKind(kind)) return drop(`no task is called “${String(kind)}”`);
	const def = TASK_KINDS[kind];
	const parsed = def.payload.safeParse(payload);
	if (!parsed.success) return drop(`its data is not a ${kind} task's: ${parsed.error.message}`);
	if (def.recorded && storeId && !taskId) return drop('a store’s task came without its record');
	if (record) {
		const started = await inStore(storeId!, (tx) => tasks.startAttempt(tx, taskId!, round), pool);
		if (!started) return;
	}
	const ctx = { storeId, taskId, queueId: job.id, attempt: job.retryCount + 1 };
	try {
		await (handlers[kind] as (p: unknown, c: typeof ctx, d: TaskDeps) => Promise<void>)(
			parsed.data,
			ctx,
			deps
		);
	} catch (e) {
		const message = errorText(e);
		const last = job.retryCount >= job.retryLimit;
		log.warn(
			{ kind, taskId: taskId ?? job.id, attempt: ctx.attempt, of: job.retryLimit + 1, message },
			'Task failed'
		);
		if (record) {
			await inStore(
				record.storeId,
				async (tx) => {
					if (last) await tasks.finish(tx, record.taskId, round, 'failed', message);
					else await tasks.noteError(tx, record.taskId, round, message);
				},
				pool
			);
		}
		throw e;
	}
	if (record) {
		await inStore(record.storeId, (tx) => tasks.finish(tx, record.taskId, round, 'done'), pool);
	}
}

/**
 * A task pg-boss gave up on: its retries were spent, or its last attempt never finished (the
 * server stopped in the middle). Its record shows it failed, for a manager to send again.
 */
async function buried(job: PgBoss.Job<TaskData>, pool: pg.Pool) {
	const { kind, storeId, taskId, round = 0 } = job.data ?? ({} as TaskData);
	log.error(
		{ kind: String(kind), taskId: taskId ?? job.id },
		'Task gave up after its last attempt'
	);
	if (!storeId || !taskId) return;
	await inStore(
		storeId,
		(tx) =>
			tasks.finish(
				tx,
				taskId,
				round,
				'failed',
				'Its last attempt did not finish: the server stopped, or it took too long',
				true
			),
		pool
	);
}

/**
 * Starts working the task queue in this process: with the server (hooks `init`) and in the
 * integration tests. Tasks are fetched every few seconds, and at once when this process queued
 * one; stopping lets running tasks finish, and whatever does not finish is retried later.
 */
export async function startTaskWorker(options: WorkerOptions): Promise<TaskWorker> {
	const boss = options.boss ?? appBoss();
	const pool = options.pool ?? appPool;
	const deps: TaskDeps = { sendMail: options.sendMail, stripe: options.stripe, boss };
	const onError = (e: unknown) => log.error({ err: e }, 'Task queue');
	boss.on('error', onError);
	await boss.start();
	const work = { batchSize: 1, includeMetadata: true as const };
	const polling = { pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2 };
	const workers: string[] = [];
	for (let i = 0; i < (options.concurrency ?? 2); i++) {
		workers.push(
			await boss.work<TaskData>(TASK_QUEUE, { ...work, ...polling }, async ([job]) =>
				runTask(job, deps, pool)
			)
		);
	}
	await boss.work<TaskData>(DEAD_QUEUE, { ...work, pollingIntervalSeconds: 5 }, async ([job]) =>
		buried(job, pool)
	);
	if (options.schedule) {
		const periodic: TaskData = { kind: 'periodic', storeId: null, taskId: null, payload: {} };
		await boss.schedule(TASK_QUEUE, '*/30 * * * *', periodic as unknown as object, {
			retryLimit: 0
		});
	}
	const forget = onTaskQueued(() => {
		for (const id of workers) boss.notifyWorker(id);
	});
	return {
		async stop(timeoutMs = 10_000) {
			forget();
			await boss.stop({ graceful: true, timeout: timeoutMs });
			boss.off('error', onError);
		}
	};
}
