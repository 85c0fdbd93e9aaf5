// Issue 13.3: two production servers behind a real load balancer (Debian's HAProxy, running the
// committed deploy/haproxy.cfg), sharing one PostgreSQL and one S3-compatible bucket (s3rver).
// Signed in through the balancer, the session works on either server; a logo stored through one
// is read through the other; a Stripe webhook delivered to one shows on the other; mail tasks
// queued through both are each sent once by the two servers' workers; sign-in limits count the
// client's address (as HAProxy saw it) across both servers; and two migration runs at once take
// turns, while the servers themselves never migrate.
//
// Ports: the servers on slots 10 and 11 (tests/server/serve.ts); the balancer and s3rver at
// FLUSHLINE_TEST_PORT + 30 and + 31. Each server keeps its own data folder: with the object store
// in S3 nothing of the app's is in it, only the local fakes' (the e-mail fake's outbox, the Stripe
// fake's objects), which stand in for services every server shares in production.
// First: the app's modules below must read this file's own database address.
import { prepareBalancedDatabase } from './balanced-db';
import {
	CreateBucketCommand,
	GetObjectCommand,
	ListObjectsV2Command,
	S3Client
} from '@aws-sdk/client-s3';
import { spawn, type ChildProcess } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import S3rver from 's3rver';
import sharp from 'sharp';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signLink } from '../../src/lib/server/customer-link';
import { auth } from '../e2e/support/auth';
import * as q from '../e2e/support/queries';
import { portFor, serve, type Served } from './serve';

const BASE = Number(process.env.FLUSHLINE_TEST_PORT ?? 4173) + 30;
const BALANCER_PORT = BASE;
const S3_PORT = BASE + 1;
const ORIGIN = `http://127.0.0.1:${BALANCER_PORT}`;
const HAPROXY = process.env.HAPROXY_PATH || '/usr/sbin/haproxy';
const BUCKET = 'flushline-balanced';
const S3_KEYS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }; // s3rver's own local pair
const SECRET = process.env.BETTER_AUTH_SECRET || 'balanced-tests-secret-balanced-tests-secret';
const WEBHOOK_SECRET = 'whsec_balanced_test_endpoint_secret';
const ADDRESS_LIMIT = 6;
const PASSWORD = 'balanced-password-1';

// The test process makes logins and stores through better-auth's API with the servers' secret.
process.env.BETTER_AUTH_SECRET = SECRET;

let s3: S3rver | undefined;
let s3Client: S3Client;
let balancer: ChildProcess | undefined;
let balancerOutput = '';
const servers: Served[] = [];
const dataDirs: string[] = [];
let scratch: string;
let migrationsBefore = 0;

const ownerUrl = () => process.env.DATABASE_OWNER_URL ?? process.env.DATABASE_URL!;

async function ownerQuery<T extends pg.QueryResultRow>(sql: string, params: unknown[] = []) {
	const client = new pg.Client({ connectionString: ownerUrl() });
	await client.connect();
	try {
		return (await client.query<T>(sql, params)).rows;
	} finally {
		await client.end();
	}
}

const appliedMigrations = async (url: string) => {
	const client = new pg.Client({ connectionString: url });
	await client.connect();
	try {
		const { rows } = await client.query<{ n: number }>(
			'select count(*)::int as n from drizzle.__drizzle_migrations'
		);
		return rows[0].n;
	} finally {
		await client.end();
	}
};

interface Answer {
	status: number;
	headers: http.IncomingHttpHeaders;
	body: Buffer;
	servedBy: string;
	text(): string;
	json(): Record<string, unknown>;
}

interface Call {
	method?: string;
	headers?: Record<string, string>;
	body?: string | Buffer;
	/** The client's own address (any of 127.0.0.0/8): another client, as the balancer sees it. */
	from?: string;
}

/** One HTTP request, on a connection of its own, from the address asked for. */
function call(port: number, pathname: string, options: Call = {}): Promise<Answer> {
	return new Promise((resolve, reject) => {
		const request = http.request(
			{
				host: '127.0.0.1',
				port,
				path: pathname,
				method: options.method ?? 'GET',
				headers: { origin: ORIGIN, ...options.headers },
				localAddress: options.from,
				agent: false
			},
			(response) => {
				const chunks: Buffer[] = [];
				response.on('data', (c: Buffer) => chunks.push(c));
				response.on('end', () => {
					const body = Buffer.concat(chunks);
					resolve({
						status: response.statusCode ?? 0,
						headers: response.headers,
						body,
						servedBy: String(response.headers['x-served-by'] ?? ''),
						text: () => body.toString('utf8'),
						json: () => JSON.parse(body.toString('utf8'))
					});
				});
				response.on('error', reject);
			}
		);
		request.on('error', reject);
		if (options.body) request.write(options.body);
		request.end();
	});
}

/** Through the balancer. */
const viaBalancer = (pathname: string, options?: Call) => call(BALANCER_PORT, pathname, options);
/**
 * Straight to one server, as the balancer would send it (with the client's address in
 * X-Forwarded-For): to prove which server did what.
 */
const direct = (server: 'a' | 'b', pathname: string, options: Call = {}) =>
	call(portFor(server === 'a' ? 10 : 11), pathname, {
		...options,
		headers: { 'x-forwarded-for': '127.0.0.1', ...options.headers }
	});

const json = (body: unknown, headers: Record<string, string> = {}): Call => ({
	method: 'POST',
	headers: { 'content-type': 'application/json', ...headers },
	body: JSON.stringify(body)
});

const form = (fields: Record<string, string>, headers: Record<string, string> = {}): Call => ({
	method: 'POST',
	headers: { 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html', ...headers },
	body: new URLSearchParams(fields).toString()
});

/** The cookie header a browser would send back from an answer's Set-Cookie lines. */
const cookieOf = (answer: Answer) =>
	(answer.headers['set-cookie'] ?? []).map((line) => line.split(';')[0]).join('; ');

const unique = (prefix: string) =>
	`${prefix}-${Date.now().toString(36)}${randomBytes(3).toString('hex')}`;

function startBalancer(dir: string) {
	const child = spawn(HAPROXY, ['-f', path.resolve('deploy/haproxy.cfg'), '-db'], {
		cwd: dir,
		env: {
			PATH: process.env.PATH,
			FLUSHLINE_LB_BIND: `127.0.0.1:${BALANCER_PORT}`,
			FLUSHLINE_APP_1: `127.0.0.1:${portFor(10)}`,
			FLUSHLINE_APP_2: `127.0.0.1:${portFor(11)}`
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	child.stdout!.on('data', (d) => (balancerOutput += d));
	child.stderr!.on('data', (d) => (balancerOutput += d));
	child.on('error', (e) => (balancerOutput += `${HAPROXY}: ${e.message} (npm test installs it)`));
	return child;
}

/** Waits until the balancer answers from both servers (their health checks have passed). */
async function bothBehindBalancer() {
	const seen = new Set<string>();
	for (let i = 0; i < 100 && seen.size < 2; i++) {
		if (!balancer?.pid || balancer.exitCode !== null) break; // it did not start, or it stopped
		try {
			const answer = await viaBalancer('/health');
			if (answer.status === 200) seen.add(answer.servedBy);
		} catch {
			// not listening yet
		}
		if (seen.size < 2) await new Promise((r) => setTimeout(r, 100));
	}
	if (seen.size < 2) throw new Error(`The balancer did not reach both servers:\n${balancerOutput}`);
}

beforeAll(async () => {
	await prepareBalancedDatabase();
	scratch = mkdtempSync(path.join(tmpdir(), 'flushline-balanced-'));
	s3 = new S3rver({
		port: S3_PORT,
		address: '127.0.0.1',
		silent: true,
		directory: path.join(scratch, 's3')
	});
	await s3.run();
	s3Client = new S3Client({
		region: 'us-east-1',
		endpoint: `http://127.0.0.1:${S3_PORT}`,
		forcePathStyle: true,
		credentials: S3_KEYS
	});
	await s3Client.send(new CreateBucketCommand({ Bucket: BUCKET }));
	// The per-address counts start from none (other files sign in from these addresses too).
	await ownerQuery('delete from auth_limit');
	migrationsBefore = await appliedMigrations(ownerUrl());

	const common = {
		BETTER_AUTH_SECRET: SECRET,
		ORIGIN,
		ADDRESS_HEADER: 'x-forwarded-for',
		XFF_DEPTH: '1',
		KEEP_ALIVE_TIMEOUT: '65',
		BODY_SIZE_LIMIT: '3M',
		FLUSHLINE_STORAGE: 's3',
		S3_BUCKET: BUCKET,
		S3_ENDPOINT: `http://127.0.0.1:${S3_PORT}`,
		S3_ACCESS_KEY_ID: S3_KEYS.accessKeyId,
		S3_SECRET_ACCESS_KEY: S3_KEYS.secretAccessKey,
		S3_PREFIX: 'app/',
		STRIPE_WEBHOOK_SECRET: WEBHOOK_SECRET,
		FLUSHLINE_AUTH_LIMIT_ADDRESS: String(ADDRESS_LIMIT),
		FLUSHLINE_AUTH_LIMIT_WINDOW: '600',
		DATABASE_POOL_MAX: '5',
		LOG_LEVEL: 'warn'
	};
	// Both at once, as a rolling deploy's servers may start.
	const started = await Promise.allSettled(
		(['a', 'b'] as const).map((name, i) => {
			const dataDir = mkdtempSync(path.join(tmpdir(), `flushline-balanced-${name}-`));
			dataDirs.push(dataDir);
			return serve(10 + i, {
				...common,
				FLUSHLINE_SERVER_NAME: name,
				FLUSHLINE_DATA_DIR: dataDir,
				// The Stripe fake stands in for Stripe inside each server; its events go back to the
				// server that made the payment (see the webhook test).
				STRIPE_FAKE_WEBHOOK_URL: `http://127.0.0.1:${portFor(10 + i)}/api/webhooks/stripe`
			});
		})
	);
	// Whatever started is stopped in afterAll, even when the other did not.
	for (const s of started) if (s.status === 'fulfilled') servers.push(s.value);
	for (const s of started) if (s.status === 'rejected') throw s.reason;
	for (const server of servers) {
		if ((await Promise.race([server.exited, Promise.resolve('running')])) !== 'running') {
			throw new Error(`A server did not start:\n${server.output()}`);
		}
	}
	balancer = startBalancer(scratch);
	await bothBehindBalancer();
});

afterAll(async () => {
	if (balancer?.pid && balancer.exitCode === null && balancer.signalCode === null) {
		const ended = new Promise((r) => balancer!.once('exit', r));
		balancer.kill('SIGTERM');
		await ended;
	}
	await Promise.all(servers.map((s) => s.stop()));
	await s3?.close();
	for (const dir of [scratch, ...dataDirs]) if (dir) rmSync(dir, { recursive: true, force: true });
});

/** A store with its owner, made in the test process as a sign-up and a new store would. */
async function ownStore() {
	const email = `${unique('owner')}@balanced.example`;
	const { user } = await auth().api.signUpEmail({
		body: { name: 'Wren Halloway', email, password: PASSWORD }
	});
	const org = await auth().api.createOrganization({
		body: { name: unique('Balanced Floors'), slug: unique('balanced'), userId: user.id }
	});
	if (!org) throw new Error('The store was not made');
	return { id: org.id, ownerId: user.id, email };
}

let store: Awaited<ReturnType<typeof ownStore>>;
let cookie = '';

describe('two servers behind HAProxy', () => {
	it('balances round-robin, and both servers started at once without migrating', async () => {
		const names = [];
		for (let i = 0; i < 4; i++) names.push((await viaBalancer('/health')).servedBy);
		expect(new Set(names)).toEqual(new Set(['a', 'b']));
		// Round-robin: no server answers twice in a row while both are up.
		for (let i = 1; i < names.length; i++) expect(names[i]).not.toBe(names[i - 1]);
		expect(await appliedMigrations(ownerUrl())).toBe(migrationsBefore);
	});

	it('keeps one session across both servers: signed in through the balancer', async () => {
		store = await ownStore();
		const signIn = await viaBalancer(
			'/api/auth/sign-in/email',
			json({ email: store.email, password: PASSWORD })
		);
		expect(signIn.status, signIn.text()).toBe(200);
		cookie = cookieOf(signIn);
		expect(cookie).toContain('session_token=');

		const answeredBy = new Set<string>();
		for (let i = 0; i < 4; i++) {
			const me = await viaBalancer('/api/v1/me', { headers: { cookie } });
			expect(me.status).toBe(200);
			expect(me.json()).toMatchObject({ user: { email: store.email }, role: 'owner' });
			answeredBy.add(me.servedBy);
		}
		expect(answeredBy).toEqual(new Set(['a', 'b']));
		for (const server of ['a', 'b'] as const) {
			const me = await direct(server, '/api/v1/me', { headers: { cookie } });
			expect(me.servedBy).toBe(server);
			expect(me.json()).toMatchObject({ user: { email: store.email }, store: { id: store.id } });
		}
		// A second session, signed out through A, is refused by B: sessions live in PostgreSQL.
		const second = cookieOf(
			await viaBalancer('/api/auth/sign-in/email', json({ email: store.email, password: PASSWORD }))
		);
		expect((await direct('b', '/api/v1/me', { headers: { cookie: second } })).status).toBe(200);
		const out = await direct('a', '/api/auth/sign-out', json({}, { cookie: second }));
		expect(out.status).toBe(200);
		expect((await direct('b', '/api/v1/me', { headers: { cookie: second } })).status).toBe(401);
		expect((await direct('b', '/api/v1/me', { headers: { cookie } })).status).toBe(200);
	});

	it('stores a logo through one server in the bucket and serves it through the other', async () => {
		const png = await sharp({
			create: { width: 64, height: 32, channels: 3, background: { r: 180, g: 120, b: 60 } }
		})
			.png()
			.toBuffer();
		const upload = new FormData();
		upload.set('logo', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'logo.png');
		const encoded = new Request('http://localhost/', { method: 'POST', body: upload });
		const saved = await direct('a', '/app/settings?/logo', {
			method: 'POST',
			headers: {
				cookie,
				accept: 'text/html',
				'content-type': encoded.headers.get('content-type')!
			},
			body: Buffer.from(await encoded.arrayBuffer())
		});
		expect(saved.servedBy).toBe('a');
		expect(saved.status, saved.text().slice(0, 400)).toBe(200);

		const fromB = await direct('b', '/api/v1/store/logo', { headers: { cookie } });
		expect(fromB.servedBy).toBe('b');
		expect(fromB.status).toBe(200);
		expect(fromB.headers['content-type']).toBe('image/png');
		const fromA = await direct('a', '/api/v1/store/logo', { headers: { cookie } });
		expect(fromB.body.equals(fromA.body)).toBe(true);
		expect((await sharp(fromB.body).metadata()).width).toBe(64);

		// It is in the bucket, under the store, and in neither server's own folder.
		const listed = await s3Client.send(
			new ListObjectsV2Command({ Bucket: BUCKET, Prefix: `app/${store.id}/` })
		);
		const keys = (listed.Contents ?? []).map((o) => o.Key!);
		expect(keys).toHaveLength(1);
		const object = await s3Client.send(new GetObjectCommand({ Bucket: BUCKET, Key: keys[0] }));
		expect(Buffer.from(await object.Body!.transformToByteArray()).equals(fromB.body)).toBe(true);
		for (const dir of dataDirs) expect(existsSync(path.join(dir, 'files'))).toBe(false);
		// Never served from the bucket to anyone else: the app's route needs a member.
		expect((await viaBalancer('/api/v1/store/logo')).status).toBe(401);
	});

	it('takes a Stripe webhook on one server while the other shows the payment', async () => {
		const floor = await q.addPriceBook(store.id);
		const account = `acct_bal${randomBytes(6).toString('hex')}`;
		await q.setStripeAccount(store.id, account);
		const customer = await q.addCustomer(store.id, {
			name: 'Oriel Fenwick',
			email: `${unique('oriel')}@customer.example`,
			phone: null,
			notes: ''
		});
		const title = 'Living room oak';
		const job = await q.addJob(
			store.id,
			{ customerId: customer.id, title, measure: q.demoMeasureOf(title, floor) },
			store.ownerId
		);
		await q.moveJob(
			store.id,
			{ id: job.id, title, customer },
			['quoted', 'accepted'],
			{ seller: store.ownerId, manager: store.ownerId },
			job.number
		);
		const jobOn = async (server: 'a' | 'b') => {
			const answer = await direct(server, `/api/v1/jobs/${job.id}`, { headers: { cookie } });
			expect(answer.servedBy).toBe(server);
			return answer.json() as { status: string };
		};
		expect((await jobOn('b')).status).toBe('accepted');

		// The customer pays the deposit on server A's Stripe fake, which holds its events.
		expect((await direct('a', '/dev/stripe/delivery-mode', json({ mode: 'hold' }))).status).toBe(
			200
		);
		const token = signLink(
			{ storeId: store.id, jobId: job.id, expiresAt: new Date(Date.now() + 86_400_000) },
			SECRET
		);
		const started = await direct('a', `/c/${token}?/pay`, form({ purpose: 'deposit' }));
		expect(started.status, started.text().slice(0, 300)).toBe(303);
		const session = /cs_\w+/.exec(String(started.headers.location))?.[0];
		expect(session).toBeTruthy();
		const paid = await direct(
			'a',
			`/dev/checkout/${session}?/pay`,
			form({ card: 'success', email: 'oriel@customer.example' })
		);
		expect(paid.status).toBe(303);
		expect((await jobOn('b')).status).toBe('accepted');

		// Stripe's event, signed with the endpoint's secret, to server A only.
		const events = (await direct('a', '/dev/stripe/events?type=checkout.session.completed')).json()
			.data as { id: string; data: { object: { id: string } } }[];
		const event = events.find((e) => e.data.object.id === session);
		expect(event).toBeTruthy();
		const payload = JSON.stringify(event, null, 2);
		const signature = new Stripe('sk_test_balanced').webhooks.generateTestHeaderString({
			payload,
			secret: WEBHOOK_SECRET
		});
		const delivered = await direct('a', '/api/webhooks/stripe', {
			method: 'POST',
			headers: { 'content-type': 'application/json', 'stripe-signature': signature },
			body: payload
		});
		expect(delivered.servedBy).toBe('a');
		expect(delivered.json()).toMatchObject({ received: true, outcome: 'handled' });

		// Server B shows it: the job is sold, its ledger has the card payment.
		expect((await jobOn('b')).status).toBe('sold');
		const ledger = await direct('b', `/app/jobs/${job.id}/payments/__data.json`, {
			headers: { cookie }
		});
		expect(ledger.status).toBe(200);
		expect(ledger.text()).toContain(String(session));
	});

	it('runs the queue on both servers, each task once', async () => {
		const invited = Array.from(
			{ length: 8 },
			(_, i) => `${unique(`invitee${i}`)}@balanced.example`
		);
		const servedBy: string[] = [];
		for (const email of invited) {
			const answer = await viaBalancer(
				'/app/team?/invite',
				form({ email, role: 'sales' }, { cookie })
			);
			expect(answer.status, answer.text().slice(0, 300)).toBe(200);
			servedBy.push(answer.servedBy);
		}
		expect(new Set(servedBy)).toEqual(new Set(['a', 'b']));

		const outbox = (dir: string) => {
			const file = path.join(dir, 'outbox.jsonl');
			if (!existsSync(file)) return [] as { to: string[] }[];
			return readFileSync(file, 'utf8')
				.split('\n')
				.filter(Boolean)
				.map((l) => JSON.parse(l) as { to: string[] });
		};
		const sentBy = () =>
			dataDirs.map((dir) =>
				outbox(dir)
					.flatMap((m) => m.to)
					.filter((to) => invited.includes(to))
			);
		for (let i = 0; i < 100 && sentBy().flat().length < invited.length; i++) {
			await new Promise((r) => setTimeout(r, 200));
		}
		// A little longer: a second copy would show now.
		await new Promise((r) => setTimeout(r, 1500));
		const [byA, byB] = sentBy();
		expect([...byA, ...byB].sort()).toEqual([...invited].sort());
		// Both servers' workers took a share (each wakes for what it queued itself).
		expect(byA.length).toBeGreaterThan(0);
		expect(byB.length).toBeGreaterThan(0);
		// And the queue's own records agree: one pg-boss task per mail, done at the first attempt
		// (the e-mail fake's idempotency could hide a second run by the same server).
		const jobs = await ownerQuery<{ to: string; state: string; retries: number }>(
			`select data->'payload'->'mail'->>'to' as to, state::text, retry_count as retries
			 from pgboss.job where name = 'tasks' and data->'payload'->'mail'->>'to' = any($1)`,
			[invited]
		);
		expect(jobs.map((j) => j.to).sort()).toEqual([...invited].sort());
		for (const job of jobs) expect(job, job.to).toMatchObject({ state: 'completed', retries: 0 });
	});

	it('counts sign-in attempts per client address, as HAProxy saw it, across both servers', async () => {
		const digest = (address: string) =>
			createHash('sha256').update(address).digest('base64url').slice(0, 32);
		const attempt = (from: string, headers: Record<string, string> = {}) =>
			viaBalancer('/api/auth/sign-in/email', {
				...json({ email: `${unique('nobody')}@balanced.example`, password: 'wrong-1' }, headers),
				from
			});
		const servedBy = new Set<string>();
		for (let i = 0; i < ADDRESS_LIMIT; i++) {
			const answer = await attempt('127.0.0.2');
			expect(answer.status).toBe(401);
			servedBy.add(answer.servedBy);
		}
		expect(servedBy).toEqual(new Set(['a', 'b']));
		// Over the limit on whichever server; a made-up X-Forwarded-For is dropped by HAProxy.
		for (let i = 0; i < 2; i++) {
			const limited = await attempt('127.0.0.2', { 'x-forwarded-for': `198.51.100.${i + 1}` });
			expect(limited.status).toBe(429);
		}
		// Another client has its own count.
		expect((await attempt('127.0.0.3')).status).toBe(401);

		const rows = await ownerQuery<{ key: string; points: number }>(
			'select key, points from auth_limit where key like $1',
			['address:%']
		);
		const count = (address: string) =>
			rows.find((r) => r.key === `address:${digest(address)}`)?.points;
		expect(count('127.0.0.2')).toBeGreaterThanOrEqual(ADDRESS_LIMIT);
		expect(count('127.0.0.3')).toBe(1);
		expect(count('198.51.100.1')).toBeUndefined();
	});
});

describe('a server leaving', () => {
	it('sends every request to the other while one is stopped, and none fails', async () => {
		const stopping = servers[1].stop();
		const answers: Answer[] = [];
		for (let i = 0; i < 8; i++) {
			answers.push(await viaBalancer('/api/v1/me', { headers: { cookie } }));
		}
		await stopping;
		for (const answer of answers) {
			expect(answer.status).toBe(200);
			expect(answer.json()).toMatchObject({ user: { email: store.email } });
		}
		expect(answers.at(-1)!.servedBy).toBe('a');
		// It left cleanly: requests answered, tasks let finish, connections returned, no error.
		expect(await servers[1].exited).toBe(0);
		expect(servers[1].output()).not.toContain('"level":"error"');
		// Taken out by its health check, not only retried around.
		await new Promise((r) => setTimeout(r, 2500));
		const after = await Promise.all([1, 2, 3, 4].map(() => viaBalancer('/health')));
		expect(after.map((a) => a.servedBy)).toEqual(['a', 'a', 'a', 'a']);
	});
});

describe('migrations run once', () => {
	it('two runs at once take turns: every migration applied once, neither fails', async () => {
		const admin = new URL(process.env.DATABASE_URL!);
		admin.username = 'postgres';
		const database = `flushline_migrate_${randomBytes(4).toString('hex')}`;
		admin.pathname = '/postgres';
		const client = new pg.Client({ connectionString: admin.toString() });
		await client.connect();
		try {
			await client.query(`create database ${database} owner flushline_owner`);
			const target = new URL(ownerUrl());
			target.pathname = `/${database}`;
			const run = () =>
				new Promise<{ code: number | null; out: string }>((resolve) => {
					const child = spawn(process.execPath, ['scripts/migrate.js'], {
						env: { PATH: process.env.PATH, DATABASE_OWNER_URL: target.toString() },
						stdio: ['ignore', 'pipe', 'pipe']
					});
					let out = '';
					child.stdout.on('data', (d) => (out += d));
					child.stderr.on('data', (d) => (out += d));
					child.on('exit', (code) => resolve({ code, out }));
				});
			const runs = await Promise.all([run(), run()]);
			for (const r of runs) expect(r.code, r.out).toBe(0);
			const journal = JSON.parse(readFileSync('drizzle/meta/_journal.json', 'utf8')) as {
				entries: unknown[];
			};
			expect(await appliedMigrations(target.toString())).toBe(journal.entries.length);
		} finally {
			await client.query(`drop database if exists ${database} with (force)`);
			await client.end();
		}
	}, 60_000);
});
