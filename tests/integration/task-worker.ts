// The task worker for integration tests: the app's own worker and handlers, its e-mail through the
// real Resend SDK (which the test file's msw fake answers), its Stripe the test's client.
import { createMailer } from '$lib/server/mail/send';
import { appBoss } from '$lib/server/tasks/boss';
import { TASK_QUEUE } from '$lib/server/tasks/kinds';
import { startTaskWorker, type WorkerOptions } from '$lib/server/tasks/worker';
import type Stripe from 'stripe';

export const testMailer = createMailer({ from: 'Flushline <desk@flushline.local>' });

/**
 * Starts the worker, after dropping what earlier test files queued and never worked (they run no
 * worker), so this file's tasks are the only ones.
 */
export async function startTestWorker(stripe: Stripe, options: Partial<WorkerOptions> = {}) {
	const boss = options.boss ?? appBoss();
	await boss.start();
	await boss.purgeQueue(TASK_QUEUE);
	return startTaskWorker({
		sendMail: testMailer,
		stripe,
		pollingIntervalSeconds: 0.5,
		...options,
		boss
	});
}

/** Waits until `check` gives something (polling), or fails after `ms`. */
export async function eventually<T>(
	check: () => Promise<T> | T,
	ms = 15_000
): Promise<NonNullable<T>> {
	const until = Date.now() + ms;
	for (;;) {
		const found = await check();
		if (found) return found as NonNullable<T>;
		if (Date.now() > until) throw new Error(`Nothing came within ${ms} ms`);
		await new Promise((resolve) => setTimeout(resolve, 100));
	}
}
