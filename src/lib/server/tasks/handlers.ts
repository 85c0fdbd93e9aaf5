import type PgBoss from 'pg-boss';
import type Stripe from 'stripe';
import type { z } from 'zod';
import { mendTally } from '../db/queries/jobs';
import { stripeAccount } from '../db/queries/settings';
import { listStoreIds } from '../db/queries/stores';
import { inStore } from '../db/tenant';
import { checkPhotoFiles } from '../field/photos';
import type { SendMail } from '../mail/send';
import { syncStripeActivity } from '../payments/stripe-activity';
import { log } from '../log';
import { enqueue } from './index';
import { TASK_KINDS, type TaskKind } from './kinds';

/** What handlers use from outside: given by the worker, so tests can give their own. */
export interface TaskDeps {
	sendMail: SendMail;
	stripe: Stripe;
	boss: PgBoss;
}

/** One run of a task. */
export interface TaskContext {
	storeId: string | null;
	/** The store's record of it, for recorded kinds. */
	taskId: string | null;
	/** pg-boss's id of it: the same through every retry. */
	queueId: string;
	/** 1 for the first try. */
	attempt: number;
}

type Handlers = {
	[K in TaskKind]: (
		payload: z.output<(typeof TASK_KINDS)[K]['payload']>,
		ctx: TaskContext,
		deps: TaskDeps
	) => Promise<void>;
};

/** A store's Stripe sync runs at most once in this many seconds, however often it is asked for. */
const STRIPE_SYNC_EVERY_SECONDS = 600;

function storeOf(ctx: TaskContext): string {
	if (!ctx.storeId) throw new Error('This kind of task needs a store');
	return ctx.storeId;
}

export const handlers: Handlers = {
	mail: async ({ mail }, ctx, deps) => {
		// The same key on every attempt: if a worker died after the provider took the e-mail but
		// before the task was marked done, the retry does not send it a second time.
		await deps.sendMail(mail, { idempotencyKey: `task-${ctx.taskId ?? ctx.queueId}` });
	},
	'stripe.sync': async (_payload, ctx, deps) => {
		await syncStripeActivity(storeOf(ctx), {}, deps.stripe);
	},
	'photo.files': async (files, ctx) => {
		await checkPhotoFiles(storeOf(ctx), files);
	},
	periodic: async (_payload, _ctx, deps) => {
		for (const storeId of await listStoreIds()) {
			// The job list's totals (migration 0020), checked against counting the store's jobs.
			if (await inStore(storeId, mendTally))
				log.warn({ storeId }, "The store's tally of jobs differed from its jobs: mended");
			await inStore(storeId, async (tx) => {
				if (!(await stripeAccount(tx))) return;
				await enqueue(
					tx,
					'stripe.sync',
					{},
					{},
					{
						boss: deps.boss,
						singleton: { key: `stripe.sync:${storeId}`, seconds: STRIPE_SYNC_EVERY_SECONDS }
					}
				);
			});
		}
	}
};
