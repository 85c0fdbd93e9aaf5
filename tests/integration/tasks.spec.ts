// The task queue against the real database, pg-boss and the Resend SDK with its local fake: a task
// enqueued in a transaction that rolls back is never sent; a worker that dies mid-send leaves the
// task to another, which sends it once; a provider that stays down ends in a failure a manager
// sees and sends again; an unknown kind is dropped; the sign-in's e-mails go through the queue.
import { log } from '$lib/server/log';
import { grantsOf } from '$lib/server/permissions';
import { pool } from '$lib/server/db';
import * as tasks from '$lib/server/db/queries/tasks';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { queueAuthMail, queueMail } from '$lib/server/mail/queue';
import { createAuth } from '$lib/server/create-auth';
import { db } from '$lib/server/db';
import { enqueue } from '$lib/server/tasks';
import { appBoss } from '$lib/server/tasks/boss';
import { TASK_QUEUE } from '$lib/server/tasks/kinds';
import { startTaskWorker, type TaskWorker } from '$lib/server/tasks/worker';
import type { Mail } from '$lib/server/mail/templates';
import { readOutbox } from '$mocks/outbox';
import { resendHandlers } from '$mocks/resend';
import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import { http, HttpResponse } from 'msw';
import { setupServer } from 'msw/node';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import PgBoss from 'pg-boss';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { addMember, makeStore, makeUser, TEST_ORIGIN, unique, type TestStore } from './factories';
import { eventually, startTestWorker, testMailer } from './task-worker';

let current: Partial<RequestEvent> | undefined;
vi.mock('$app/server', () => ({ getRequestEvent: () => current }));
const desk = await import('../../src/routes/app/+page.server');

const outbox = mkdtempSync(path.join(tmpdir(), 'tasks-outbox-'));
/** Addresses the provider refuses while they are in here (the provider is down for them). */
const refused = new Set<string>();
const server = setupServer(
	http.post('https://api.resend.com/emails', async ({ request }) => {
		const body = (await request.clone().json()) as { to: string | string[] };
		const to = [body.to].flat()[0];
		if (refused.has(to)) {
			return HttpResponse.json(
				{ statusCode: 500, name: 'application_error', message: 'The provider is down' },
				{ status: 500 }
			);
		}
		return undefined;
	}),
	...resendHandlers(outbox)
);
const stripe = new Stripe('sk_test_tasks', { maxNetworkRetries: 0 });

let worker: TaskWorker;
let store: TestStore;

beforeAll(async () => {
	server.listen({ onUnhandledRequest: 'error' });
	worker = await startTestWorker(stripe);
	store = await makeStore('Task Floors');
});

afterAll(async () => {
	await worker.stop();
	server.close();
});

const mailTo = (to: string, subject = `Hello ${to}`): Mail => ({
	to,
	subject,
	html: `<p>${subject}</p>`,
	text: subject,
	fromName: 'Task Floors'
});
const sentTo = (to: string) => readOutbox(outbox).filter((m) => m.to.includes(to));
const taskOf = (id: string) => readInStore(store.id, (tx) => tasks.read(tx, id));

/** pg-boss's rows for a task of the store (as the app's role sees the queue). */
async function queueRowsOf(taskId: string) {
	const { rows } = await pool.query<{ state: string; retry_count: number }>(
		`select state, retry_count from pgboss.job where name = $1 and data->>'taskId' = $2`,
		[TASK_QUEUE, taskId]
	);
	return rows;
}

describe('a task enqueued in a transaction', () => {
	it('that rolls back leaves nothing queued and sends nothing; one that commits is sent', async () => {
		const gone = `${unique('gone')}@test.example`;
		let queuedId: string | null = null;
		await expect(
			inStore(store.id, async (tx) => {
				queuedId = await queueMail(tx, 'quote', mailTo(gone));
				throw new Error('the change failed');
			})
		).rejects.toThrow('the change failed');
		expect(queuedId).toBeTruthy();
		expect(await taskOf(queuedId!)).toBeUndefined();
		expect(await queueRowsOf(queuedId!)).toEqual([]);

		const kept = `${unique('kept')}@test.example`;
		const keptId = await inStore(store.id, (tx) => queueMail(tx, 'quote', mailTo(kept)));
		await eventually(async () => (await taskOf(keptId!))?.state === 'done');
		expect(sentTo(kept)).toHaveLength(1);
		// Long after, the rolled-back one has still not gone anywhere.
		expect(sentTo(gone)).toEqual([]);
	});
});

describe('a worker killed mid-task', () => {
	it('leaves the task to another worker, which retries it once and sends it once', async () => {
		// Worker A runs on a connection that can be cut: once killed, it never reaches the
		// database again, as when its process dies. Its e-mail reaches the provider, then A freezes
		// before it can say so.
		let killed = false;
		const dead = new Promise<never>(() => {});
		const killable: PgBoss.Db = {
			executeSql: (text, values) => (killed ? dead : pool.query(text, values))
		};
		const bossA = new PgBoss({ db: killable, migrate: false, schedule: false, supervise: false });
		let inFlight: () => void = () => {};
		const reached = new Promise<void>((resolve) => (inFlight = resolve));
		const to = `${unique('killed')}@test.example`;
		await worker.stop();
		const workerA = await startTaskWorker({
			boss: bossA,
			stripe,
			concurrency: 1,
			pollingIntervalSeconds: 0.5,
			sendMail: async (mail, options) => {
				const sent = await testMailer(mail, options);
				if (mail.to === to) {
					inFlight();
					return dead;
				}
				return sent;
			}
		});
		const id = await inStore(store.id, (tx) =>
			enqueue(
				tx,
				'mail',
				{ purpose: 'quote', mail: mailTo(to) },
				{ summary: `Quote to ${to}` },
				{
					expireInSeconds: 2,
					retryDelaySeconds: 1
				}
			)
		);
		await reached;
		killed = true;
		expect(sentTo(to)).toHaveLength(1);
		void workerA;

		// Worker B, with the queue's upkeep every second, finds the task's attempt expired.
		const bossB = new PgBoss({
			connectionString: process.env.DATABASE_URL,
			migrate: false,
			schedule: false,
			maintenanceIntervalSeconds: 1
		});
		const workerB = await startTaskWorker({
			boss: bossB,
			stripe,
			sendMail: testMailer,
			pollingIntervalSeconds: 0.5
		});
		// B is this file's worker from now on.
		worker = workerB;
		const done = await eventually(async () => {
			const row = await taskOf(id!);
			return row?.state === 'done' ? row : undefined;
		}, 20_000);
		expect(done.attempts).toBe(2);
		expect(await queueRowsOf(id!)).toEqual([{ state: 'completed', retry_count: 1 }]);
		// The provider kept the first send's idempotency key: one e-mail, not two.
		expect(sentTo(to)).toHaveLength(1);
	}, 40_000);
});

describe('a task whose provider stays down', () => {
	it('is retried, then shown as failed to managers, who send it again', async () => {
		const to = `${unique('down')}@test.example`;
		refused.add(to);
		const id = await inStore(store.id, (tx) =>
			enqueue(
				tx,
				'mail',
				{ purpose: 'receipt', mail: mailTo(to) },
				{ summary: `Receipt to ${to}` },
				{ retryLimit: 1, retryDelaySeconds: 1 }
			)
		);
		const failed = await eventually(async () => {
			const row = await taskOf(id!);
			return row?.state === 'failed' ? row : undefined;
		});
		expect(failed.attempts).toBe(2);
		expect(failed.lastError).toMatch(/provider is down/);
		expect(sentTo(to)).toEqual([]);

		const manager = await addMember(store.id, 'manager', 'Mo Manager');
		const sales = await addMember(store.id, 'sales', 'Sam Sales');
		const on = (
			who: typeof manager,
			role: 'manager' | 'sales',
			body?: FormData,
			where: TestStore = store
		) => {
			const url = new URL(`${TEST_ORIGIN}/app?/resend`);
			current = {
				url,
				params: {},
				request: new Request(url, { method: 'POST', body }),
				locals: {
					user: who as App.Locals['user'],
					session: { id: `session-${who.id}` } as App.Locals['session'],
					store: { id: where.id, name: where.name, slug: 'test', logo: null, timeZone: 'UTC' },
					role,
					grants: grantsOf(role),
					denied: null
				}
			} as unknown as RequestEvent;
			return current as RequestEvent;
		};
		// The Desk shows it to the manager, with why; a salesperson is not shown it.
		const seen = (await desk.load(on(manager, 'manager') as never)) as {
			outbox: { id: string; state: string; lastError: string | null }[] | null;
		};
		expect(seen.outbox).toEqual([
			expect.objectContaining({ id, state: 'failed', lastError: failed.lastError })
		]);
		expect(
			((await desk.load(on(sales, 'sales') as never)) as { outbox: unknown }).outbox
		).toBeNull();
		const form = () => {
			const f = new FormData();
			f.set('taskId', id!);
			return f;
		};
		let refusal: unknown;
		try {
			await desk.actions.resend(on(sales, 'sales', form()) as never);
		} catch (e) {
			refusal = e;
		}
		expect(isHttpError(refusal) && refusal.status).toBe(403);

		refused.delete(to);
		expect(await desk.actions.resend(on(manager, 'manager', form()) as never)).toEqual({
			resent: `Receipt to ${to}`
		});
		const done = await eventually(async () => {
			const row = await taskOf(id!);
			return row?.state === 'done' ? row : undefined;
		});
		expect(done.attempts).toBe(1);
		expect(sentTo(to)).toHaveLength(1);
		// Another store's task is not this store's to send again.
		const other = await makeStore('Other Task Floors');
		let notFound: unknown;
		try {
			await desk.actions.resend(on(manager, 'manager', form(), other) as never);
		} catch (e) {
			notFound = e;
		}
		expect(isHttpError(notFound) && notFound.status).toBe(404);
	}, 40_000);
});

describe('a task of a kind this code does not know', () => {
	it('is logged and dropped, never retried', async () => {
		const row = await inStore(store.id, (tx) =>
			tasks.insert(tx, { kind: 'no-such-kind', payload: {}, summary: 'From a newer release' })
		);
		const errors = vi.spyOn(log, 'error').mockImplementation(() => {});
		try {
			// As a newer release (or an older one) might have queued it.
			await appBoss().send(
				TASK_QUEUE,
				{ kind: 'no-such-kind', storeId: store.id, taskId: row.id, payload: {} },
				{ retryLimit: 5, db: { executeSql: (text, values) => pool.query(text, values) } }
			);
			const dropped = await eventually(async () => {
				const found = await taskOf(row.id);
				return found?.state === 'dropped' ? found : undefined;
			});
			expect(dropped.lastError).toMatch(/no-such-kind/);
			expect(await queueRowsOf(row.id)).toEqual([{ state: 'completed', retry_count: 0 }]);
			expect(JSON.stringify(errors.mock.calls)).toMatch(
				/no-such-kind.*dropped|dropped.*no-such-kind/
			);
		} finally {
			errors.mockRestore();
		}
	});
});

describe("the sign-in's e-mails", () => {
	it('go through the queue: an invitation as the store’s task, a password reset as no store’s', async () => {
		const auth = createAuth({
			db,
			baseURL: TEST_ORIGIN,
			secret: 'integration-tests-secret-integration-tests',
			sendMail: queueAuthMail
		});
		const owner = await makeUser('Queue Owner');
		const org = await auth.api.createOrganization({
			body: { name: 'Queued Floors', slug: unique('queued'), userId: owner.id }
		});
		const invited = `${unique('invited')}@test.example`;
		const { headers } = await auth.api.signInEmail({
			body: { email: owner.email, password: 'test-password-1' },
			returnHeaders: true
		});
		const cookie = (headers.getSetCookie?.() ?? []).map((c) => c.split(';')[0]).join('; ');
		await auth.api.createInvitation({
			headers: new Headers({ cookie, origin: TEST_ORIGIN }),
			body: { email: invited, role: 'sales', organizationId: org!.id }
		});
		const invitation = await eventually(() => sentTo(invited)[0]);
		expect(invitation.subject).toMatch(/invited you to Queued Floors/);
		const recorded = await eventually(async () => {
			const done = await readInStore(org!.id, (tx) => tasks.list(tx, ['done']));
			return done.length ? done : undefined;
		});
		expect(recorded.map((t) => t.summary)).toEqual([`Invitation to ${invited}`]);

		await auth.api.requestPasswordReset({
			body: { email: owner.email, redirectTo: `${TEST_ORIGIN}/reset-password` }
		});
		const reset = await eventually(() => sentTo(owner.email)[0]);
		expect(reset.subject).toBe('Reset your password');
	});
});
