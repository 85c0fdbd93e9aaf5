// Issue 13.5: faults lose nothing. The production build against a PostgreSQL cluster of this file's
// own (restarting the shared test cluster would break the files running beside it), with real
// faults: PostgreSQL restarted in the middle of a stream of writes, a server killed in the middle
// of a photo upload, the e-mail fake down for a while, and a server killed while a task runs.
// Everything is counted in the database and in the e-mail fake's outbox afterwards.
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import pg from 'pg';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readOutbox } from '../../mocks/outbox';
import {
	form,
	jsonBody,
	loadPostgres,
	POSTGRES_MODULE,
	serve,
	type Postgres,
	type Served
} from './serve';

type Factories = typeof import('../integration/factories');
type BookedJob = Awaited<ReturnType<typeof import('../integration/field-jobs').makeBookedJob>>;

const PG_PORT = Number(process.env.FLUSHLINE_TEST_PG_PORT ?? 54321) + 7;
const DATABASE = 'flushline_faults';
const SECRET = 'faults-spec-secret-faults-spec-secret-0123';
const CLUSTER = 'postgres-faults';
const dataDir = mkdtempSync(path.join(tmpdir(), 'flushline-faults-'));

let postgres: Postgres;
let appUrl = '';
let admin: pg.Pool;
let factories: Factories;
let closeTestPool: (() => Promise<void>) | undefined;

/** Runs a function of scripts/lib/postgres.js in a child process, so this one keeps serving. */
function clusterCommand(what: 'startCluster' | 'stopCluster'): Promise<void> {
	const script = `const m = await import(${JSON.stringify(pathToFileURL(POSTGRES_MODULE).href)});
m.${what}(m.clusterAt(${JSON.stringify(CLUSTER)}, ${PG_PORT}, true));`;
	return new Promise((resolve, reject) => {
		const child = spawn(process.execPath, ['--input-type=module', '-e', script], {
			stdio: ['ignore', 'pipe', 'pipe']
		});
		let out = '';
		child.stdout.on('data', (d) => (out += d));
		child.stderr.on('data', (d) => (out += d));
		child.on('exit', (code) =>
			code === 0 ? resolve() : reject(new Error(`${what} failed (${code}):\n${out}`))
		);
	});
}

// ---------------------------------------------------------------------------------------------
// The built server, started and stopped (or killed) by this file

/** A server of this file: its fetches give up after 20 s, and afterAll kills what is left. */
type Server = Served;

const servers = new Set<Server>();

async function startServer(slot: number): Promise<Server> {
	const served = await serve(slot, {
		DATABASE_URL: appUrl,
		BETTER_AUTH_SECRET: SECRET,
		// One folder across restarts: the e-mail fake's outbox and switches live there.
		FLUSHLINE_DATA_DIR: dataDir,
		// As deployed (README, "Environment"): photos and logos of a few MB.
		BODY_SIZE_LIMIT: '3M',
		RESEND_API_KEY: '',
		STRIPE_SECRET_KEY: '',
		// A task's attempt counts as dead after 5 s (not a minute), pg-boss looks for such every
		// second, and the first retry comes after about a second.
		FLUSHLINE_TASK_EXPIRE_SECONDS: '5',
		FLUSHLINE_TASK_RETRY_DELAY_SECONDS: '1',
		FLUSHLINE_TASK_MAINTENANCE_SECONDS: '1',
		LOG_LEVEL: 'warn'
	});
	if (!served.alive()) throw new Error(`The server did not start:\n${served.output()}`);
	const server: Server = {
		...served,
		fetch: (pathname, init = {}) =>
			served.fetch(pathname, { signal: AbortSignal.timeout(20_000), ...init }),
		stop: async () => {
			await served.stop();
			servers.delete(server);
		},
		kill: async () => {
			await served.kill();
			servers.delete(server);
		}
	};
	servers.add(server);
	return server;
}

/** A session cookie of a login, signed in through the server as a browser would. */
async function signIn(server: Server, email: string) {
	const answer = await server.fetch(
		'/api/auth/sign-in/email',
		jsonBody({ email, password: factories.TEST_PASSWORD })
	);
	expect(answer.status, await answer.clone().text()).toBe(200);
	return answer.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.join('; ');
}

const withCookie = (init: RequestInit, cookie: string): RequestInit => ({
	...init,
	headers: { ...(init.headers as Record<string, string>), cookie }
});

async function eventually<T>(
	what: string,
	check: () => Promise<T | undefined | null | false>,
	timeoutMs = 30_000
): Promise<T> {
	const until = Date.now() + timeoutMs;
	for (;;) {
		const value = await check();
		if (value) return value;
		if (Date.now() > until) throw new Error(`Timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 200));
	}
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

// ---------------------------------------------------------------------------------------------
// One store, its owner, an installer with a job under way

let store: Awaited<ReturnType<Factories['makeStore']>>;
let booked: BookedJob;

beforeAll(async () => {
	postgres = await loadPostgres();
	const cluster = postgres.clusterAt(CLUSTER, PG_PORT, true);
	postgres.startCluster(cluster);
	const urls = await postgres.prepareDatabase(cluster, { database: DATABASE, fresh: true });
	appUrl = urls.appUrl;
	admin = new pg.Pool({
		connectionString: postgres.databaseUrl(cluster, 'postgres', DATABASE),
		max: 2
	});
	admin.on('error', () => {});
	// The factories write through the app's own modules, which read DATABASE_URL when loaded.
	process.env.DATABASE_URL = appUrl;
	factories = await import('../integration/factories');
	const { makeBookedJob } = await import('../integration/field-jobs');
	const { pool } = await import('$lib/server/db');
	closeTestPool = () => pool.end();
	store = await factories.makeStore('Larchmere Floors');
	booked = await makeBookedJob(store);
}, 120_000);

afterAll(async () => {
	await Promise.all([...servers].map((s) => s.kill()));
	await closeTestPool?.().catch(() => {});
	await admin?.end().catch(() => {});
	if (postgres) postgres.stopCluster(postgres.clusterAt(CLUSTER, PG_PORT, true));
	rmSync(dataDir, { recursive: true, force: true });
}, 60_000);

async function rows<T = Record<string, unknown>>(sql: string, values: unknown[] = []) {
	return (await admin.query(sql, values)).rows as T[];
}

// ---------------------------------------------------------------------------------------------

describe('faults lose nothing (issue 13.5)', { timeout: 120_000 }, () => {
	// One server at a time (slot 20), killed and started again by the tests in turn.
	let app: Server;
	let ownerCookie = '';

	it('PostgreSQL restarted mid-load: the app reconnects; each write is stored once or refused with a 503', async () => {
		app = await startServer(20);
		ownerCookie = await signIn(app, store.owner.email);
		const customerId = booked.customer.id;

		interface Sent {
			title: string;
			status: number;
			type: string;
			body: string;
			after: boolean;
		}
		const sent: Sent[] = [];
		let running = true;
		let restarted = false;
		const loop = async (n: number) => {
			for (let i = 0; running; i++) {
				const title = `Fault run ${n}-${i}`;
				const after = restarted;
				try {
					const answer = await app.fetch(
						'/api/v1/jobs',
						withCookie(jsonBody({ customerId, title }), ownerCookie)
					);
					sent.push({
						title,
						status: answer.status,
						type: answer.headers.get('content-type') ?? '',
						body: await answer.text(),
						after
					});
				} catch (e) {
					sent.push({ title, status: 0, type: '', body: String(e), after });
				}
			}
		};
		const loops = [0, 1, 2, 3].map(loop);
		const succeeded = (after: boolean) =>
			sent.filter((s) => s.status === 201 && s.after === after).length;
		let api: Response, page: Response;
		let apiBody: string, pageBody: string;
		try {
			await eventually('writes before the restart', async () => succeeded(false) >= 12);

			await clusterCommand('stopCluster');
			await sleep(200);
			expect(app.alive(), app.output().slice(-4000)).toBe(true);
			// While it is down: a clear "try again" for the API and for a page, never a 500.
			api = await app.fetch('/api/v1/me', withCookie({}, ownerCookie));
			page = await app.fetch(
				'/app/jobs',
				withCookie({ headers: { accept: 'text/html' } }, ownerCookie)
			);
			apiBody = await api.text();
			pageBody = await page.text();
			await sleep(800);
			await clusterCommand('startCluster');
			restarted = true;
			await eventually('writes after the restart', async () => succeeded(true) >= 12, 60_000);
		} finally {
			running = false;
			await Promise.all(loops);
		}

		expect(app.alive(), app.output()).toBe(true);
		expect(api.status, apiBody).toBe(503);
		expect(JSON.parse(apiBody).message).toMatch(/try again/i);
		expect(page.status, pageBody).toBe(503);
		expect(page.headers.get('content-type')).toContain('text/html');
		expect(pageBody).toMatch(/try again/i);

		// Every answer was a success or a 503 with a message; no hang, no 500, no stack.
		const statuses = new Set(sent.map((s) => s.status));
		expect([...statuses].sort(), JSON.stringify(sent.filter((s) => s.status !== 201))).toEqual(
			[...statuses].filter((s) => s === 201 || s === 503).sort()
		);
		const refused = sent.filter((s) => s.status === 503);
		expect(refused.length).toBeGreaterThan(0);
		for (const r of refused) {
			expect(r.type).toContain('application/json');
			expect(JSON.parse(r.body).message).toMatch(/try again/i);
			expect(r.body).not.toMatch(/\n\s+at |node_modules|ECONNREFUSED/);
		}

		// Counted in the database: each success once, each refusal at most once (a commit whose
		// answer was lost with the connection), and no job without its "created" event.
		const stored = await rows<{ title: string; n: number }>(
			`select title, count(*)::int as n from job where organization_id = $1 and title like 'Fault run %' group by title`,
			[store.id]
		);
		const count = new Map(stored.map((r) => [r.title, r.n]));
		for (const s of sent.filter((s) => s.status === 201))
			expect(count.get(s.title), s.title).toBe(1);
		for (const r of refused) expect(count.get(r.title) ?? 0, r.title).toBeLessThanOrEqual(1);
		const orphans = await rows(
			`select j.id from job j where j.organization_id = $1 and j.title like 'Fault run %'
			   and not exists (select 1 from job_event e where e.job_id = j.id and e.kind = 'created')`,
			[store.id]
		);
		expect(orphans).toEqual([]);
		const numbers = await rows<{ dup: number }>(
			`select count(*) - count(distinct number) as dup from job where organization_id = $1`,
			[store.id]
		);
		expect(Number(numbers[0].dup)).toBe(0);
	});

	it('a server killed mid photo-upload stores nothing half; the resend is stored once', async () => {
		let field = app;
		const installerCookie = await signIn(field, booked.installer.user.email);
		const checkIn = await field.fetch(
			`/field/jobs/${booked.job.id}?/checkIn`,
			withCookie(form({}), installerCookie)
		);
		expect([200, 303], await checkIn.text()).toContain(checkIn.status);

		const folder = path.join(dataDir, 'files', store.id, 'photos', booked.job.id);
		const filesNow = () => (existsSync(folder) ? readdirSync(folder) : []);
		const photo = await sharp({
			create: {
				width: 1200,
				height: 900,
				channels: 3,
				background: '#7a6a58',
				noise: { type: 'gaussian', mean: 128, sigma: 60 }
			}
		})
			.jpeg({ quality: 95 })
			.toBuffer();
		const clientId = crypto.randomUUID();
		const boundary = `----faults${clientId}`;
		const field_ = (name: string, value: string) =>
			`--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`;
		const head = Buffer.from(
			field_('clientId', clientId) +
				field_('purpose', 'report') +
				field_('caption', 'Subfloor by the door') +
				`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="p.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`
		);
		const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
		const total = head.length + photo.length + tail.length;

		// Half the photo is sent, then the server dies.
		const cut = await new Promise<string>((resolve) => {
			const request = http.request(
				`${field.origin}/api/v1/field/jobs/${booked.job.id}/photos`,
				{
					method: 'POST',
					headers: {
						origin: field.origin,
						cookie: installerCookie,
						accept: 'application/json',
						'content-type': `multipart/form-data; boundary=${boundary}`,
						'content-length': String(total)
					}
				},
				(response) => resolve(`answered ${response.statusCode}`)
			);
			request.on('error', (e) => resolve(`cut: ${e.message}`));
			request.write(head);
			request.write(photo.subarray(0, photo.length >> 1));
			setTimeout(() => void field.kill(), 700);
		});
		expect(cut).toMatch(/^cut/);
		expect(await field.exited).toBeNull(); // ended by the signal, with no exit code

		field = app = await startServer(20);
		// Nothing half stored: no row, and no file (nor a temporary part of one).
		expect(await rows('select id from field_photo where client_id = $1', [clientId])).toEqual([]);
		expect(filesNow()).toEqual([]);

		// The phone still has it and sends it again, twice (an answer lost the first time).
		const send = async () => {
			const body = new FormData();
			body.set('file', new Blob([new Uint8Array(photo)], { type: 'image/jpeg' }), 'p.jpg');
			body.set('clientId', clientId);
			body.set('purpose', 'report');
			body.set('caption', 'Subfloor by the door');
			return field.fetch(
				`/api/v1/field/jobs/${booked.job.id}/photos`,
				withCookie(
					{ method: 'POST', body, headers: { accept: 'application/json' } },
					installerCookie
				)
			);
		};
		const first = await send();
		expect(first.status, await first.clone().text()).toBe(201);
		const again = await send();
		expect(again.status).toBe(200);
		expect((await again.json()).duplicate).toBe(true);
		const stored = await rows<{ file_key: string; thumb_key: string }>(
			'select file_key, thumb_key from field_photo where client_id = $1',
			[clientId]
		);
		expect(stored).toHaveLength(1);
		expect(filesNow().sort()).toEqual(
			[stored[0].file_key, stored[0].thumb_key].map((k) => path.basename(k)).sort()
		);
	});

	const mailTask = async (to: string) =>
		(
			await rows<{ id: string; state: string; attempts: number; last_error: string | null }>(
				`select id, state, attempts, last_error from task where payload->'mail'->>'to' = $1`,
				[to]
			)
		)[0];
	const outboxTo = (to: string) => readOutbox(dataDir).filter((m) => m.to.includes(to));
	const resendQuote = (server: Server, to: string) =>
		server.fetch(
			`/app/jobs/${booked.job.id}/quote?/resend`,
			withCookie(form({ quoteId: booked.quote.id, to }), ownerCookie)
		);

	it('e-mail while the provider is down waits in the queue and goes once when it is back', async () => {
		const down = path.join(dataDir, 'fake-mail-down');
		writeFileSync(down, 'down for the test\n');
		const to = `down-${Date.now()}@customer.example`;
		const queued = await resendQuote(app, to);
		expect([200, 303], await queued.text()).toContain(queued.status);

		const waiting = await eventually('two failed attempts', async () => {
			const t = await mailTask(to);
			return t && t.attempts >= 2 ? t : undefined;
		});
		expect(waiting.state).toBe('queued');
		expect(waiting.last_error).toMatch(/503|unavailable|down/i);
		expect(outboxTo(to)).toEqual([]);

		rmSync(down);
		const done = await eventually('the mail sent', async () => {
			const t = await mailTask(to);
			return t?.state === 'done' ? t : undefined;
		});
		expect(done.attempts).toBeGreaterThanOrEqual(3);
		await sleep(1500);
		expect(outboxTo(to)).toHaveLength(1);
		expect((await mailTask(to)).state).toBe('done');
	});

	it('a server killed while a task runs: the task runs again and its mail goes once', async () => {
		const worker = app;
		expect(worker.alive()).toBe(true);
		// The fake takes the e-mail, then holds its answer: the worker dies before it hears back.
		const hold = path.join(dataDir, 'fake-mail-hold');
		writeFileSync(hold, 'hold\n');
		const to = `killed-${Date.now()}@customer.example`;
		const queued = await resendQuote(worker, to);
		expect([200, 303], await queued.text()).toContain(queued.status);
		await eventually('the provider to take the mail', async () => outboxTo(to).length === 1);
		expect((await mailTask(to)).state).toBe('queued');
		await worker.kill();
		rmSync(hold);

		app = await startServer(20);
		const done = await eventually(
			'the task run again',
			async () => {
				const t = await mailTask(to);
				return t?.state === 'done' ? t : undefined;
			},
			60_000
		);
		expect(done.attempts).toBe(2);
		await sleep(1500);
		expect(outboxTo(to)).toHaveLength(1);
		const [queue] = await rows<{ state: string; retry_count: number }>(
			`select state, retry_count from pgboss.job where data->>'taskId' = $1
			 union all select state, retry_count from pgboss.archive where data->>'taskId' = $1`,
			[done.id]
		);
		expect(queue).toMatchObject({ state: 'completed', retry_count: 1 });
	});
});
