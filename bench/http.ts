/**
 * `npm run bench`: the production build against the scale database (`npm run seed:scale` first),
 * on 127.0.0.1 only, measured with autocannon. Never run by `npm test`. See bench/README.md.
 *
 * For each route: requests/s, p50 and p99 at 10 connections, and p99 at a steady 50 requests/s,
 * each beside the baseline (`/api/v1/health/session`: the session and `SELECT 1`). Then the
 * server's peak memory (VmHWM) and the gzip JavaScript and CSS each main page loads in Chromium.
 *
 *   FLUSHLINE_BENCH_PG_PORT (54322)  the bench cluster    FLUSHLINE_BENCH_PORT (4271)  the server
 *   BENCH_STORE (1)  the seeded store to sign in to (1000: the big one)
 *   FLUSHLINE_BENCH_DB (flushline_bench)  the database   BENCH_SECONDS (10)  length of each run            BENCH_SKIP_BROWSER=1  no Chromium figures
 *   BENCH_ONLY  a comma-separated list of parts of route names to run (with the baseline)
 *   BENCH_NODE_ARGS  extra flags for the server's node (a CPU profile: `--cpu-prof --cpu-prof-dir=…`)
 */
import { spawn, spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { connect } from 'node:net';
import { gzipSync } from 'node:zlib';
import autocannon from 'autocannon';
import pg from 'pg';
import { chromium } from '@playwright/test';
import demo from '../scripts/demo-people.json' with { type: 'json' };
import { defaultSettings } from '../src/lib/estimating/index';
import { samplePriceBook, sampleJob } from '../src/lib/estimating/sample';
import { signatureHeader } from '../mocks/stripe/webhooks';
import sharp from 'sharp';
import { ensureChromium } from '../scripts/lib/system.js';

/** The fake's signing secret (`LOCAL_STRIPE_WEBHOOK_SECRET` in src/lib/server/config.ts, which needs SvelteKit). */
const LOCAL_STRIPE_WEBHOOK_SECRET = 'whsec_flushline_local_fake_not_a_real_secret';

const root = path.resolve(import.meta.dirname, '..');
const port = Number(process.env.FLUSHLINE_BENCH_PORT ?? 4271);
const origin = `http://127.0.0.1:${port}`;
const store = Number(process.env.BENCH_STORE ?? 1);
const seconds = Number(process.env.BENCH_SECONDS ?? 10);
/** `× near`'s turns: how many pairs of slices, and each slice's seconds (`paired`). */
const NEAR_PAIRS = 5;
const NEAR_SECONDS = 2;

const { clusterAt, startCluster, databaseUrl, migrate, OWNER_ROLE } =
	await import('../scripts/lib/postgres.js');
const { serverMemoryEnv, serverNodeArgs } = await import('../scripts/lib/system.js');
const cluster = clusterAt('postgres-bench', Number(process.env.FLUSHLINE_BENCH_PG_PORT ?? 54322));
startCluster(cluster);
const database = process.env.FLUSHLINE_BENCH_DB ?? 'flushline_bench';
const appUrl = databaseUrl(cluster, 'flushline_app', database);
const superUrl = databaseUrl(cluster, 'postgres', database);
// A database seeded before the latest migrations gets them first (as a release step would).
await migrate(databaseUrl(cluster, OWNER_ROLE, database));

if (!existsSync(path.join(root, 'build/index.js')) || process.env.BENCH_BUILD === '1') {
	console.log('Building…');
	const built = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], {
		cwd: root,
		stdio: 'inherit'
	});
	if (built.status !== 0) process.exit(1);
}

// Another server on the port would be measured instead of this build's (and one left running
// from before a rebuild answers 500s): refuse to start.
const taken = await new Promise<boolean>((resolve) => {
	const probe = connect({ host: '127.0.0.1', port }, () => {
		probe.destroy();
		resolve(true);
	});
	probe.on('error', () => resolve(false));
});
if (taken) {
	console.error(
		`Something already listens on 127.0.0.1:${port}: stop it, or set FLUSHLINE_BENCH_PORT.`
	);
	process.exit(1);
}

// From here, not from the script's start: a build (BENCH_BUILD=1) is not the server's start-up.
const started = performance.now();
// BENCH_NODE_ARGS: extra flags for the server's node, after the ones `npm start` gives it, e.g.
// `--cpu-prof --cpu-prof-dir=/tmp/prof`, or `--no-single-threaded-gc` to compare.
const nodeArgs = process.env.BENCH_NODE_ARGS?.split(' ').filter(Boolean) ?? [];
const server = spawn(process.execPath, [...serverNodeArgs(), ...nodeArgs, 'build'], {
	cwd: root,
	env: {
		...process.env,
		DATABASE_URL: appUrl,
		BETTER_AUTH_SECRET: 'bench-only-secret-bench-only-secret-0123',
		FLUSHLINE_DATA_DIR: path.join(root, '.data/bench-app'),
		FLUSHLINE_FAKES: '1',
		FLUSHLINE_AUTH_LIMIT_ADDRESS: '5000',
		ORIGIN: origin,
		HOST: '127.0.0.1',
		PORT: String(port),
		BODY_SIZE_LIMIT: '3M',
		LOG_LEVEL: 'warn',
		// As `npm start` and the README's deployment settings run it (glibc arenas, V8's heap cap).
		...serverMemoryEnv()
	},
	stdio: ['ignore', 'ignore', 'inherit']
});
const stop = () => server.kill('SIGTERM');
process.on('exit', stop);
/** When the server first answered: unset until then. */
const up: { at?: number } = {};
server.on('exit', (code) => {
	if (up.at === undefined) {
		console.error(`The server exited (${code}) before it answered.`);
		process.exit(1);
	}
});

async function waitForServer() {
	for (let i = 0; i < 100; i++) {
		try {
			const r = await fetch(`${origin}/api/v1/openapi.json`);
			if (r.status < 500) return;
		} catch {
			/* not yet */
		}
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error('The server did not start');
}
await waitForServer();
const ready = (up.at = performance.now());

async function signIn(local: string): Promise<string> {
	const email = `${local}+s${store}@tallowcreek.example`;
	const r = await fetch(`${origin}/api/auth/sign-in/email`, {
		method: 'POST',
		headers: { 'content-type': 'application/json', origin },
		body: JSON.stringify({ email, password: demo.password })
	});
	if (!r.ok) throw new Error(`Sign-in of ${email}: ${r.status} ${await r.text()}`);
	return r.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.join('; ');
}
const owner = await signIn('owner');
const installer = await signIn('installer');

// Ids to aim at, read from the seed.
const db = new pg.Client({ connectionString: superUrl });
await db.connect();
const storeId = (
	await db.query(
		`select o.id from organization o join member m on m.organization_id = o.id
		 join "user" u on u.id = m.user_id where u.email = $1`,
		[`owner+s${store}@tallowcreek.example`]
	)
).rows[0].id as string;
const counts = (
	await db.query(
		`select (select count(*) from job where organization_id = $1) as jobs,
		        (select count(*) from customer where organization_id = $1) as customers`,
		[storeId]
	)
).rows[0];
const someJob = (
	await db.query(`select id from job where organization_id = $1 and status = 'sold' limit 1`, [
		storeId
	])
).rows[0].id as string;
const fieldJob = (
	await db.query(
		`select j.id from job j join "user" u on u.id = j.installer_id
		 where j.organization_id = $1 and j.status = 'in_progress' and u.email = $2 limit 1`,
		[storeId, `installer+s${store}@tallowcreek.example`]
	)
).rows[0]?.id as string | undefined;
await db.end();

// A phone-sized photo (about 1600 × 1200), the same bytes each time with its own client id.
const photo = await sharp({
	create: { width: 1600, height: 1200, channels: 3, background: '#a0785a' }
})
	.composite([
		{
			input: Buffer.from(
				`<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="1200">${Array.from({ length: 12 }, (_, i) => `<rect y="${i * 100}" width="1600" height="94" fill="${i % 2 ? '#8d6e4f' : '#c9a77c'}"/>`).join('')}</svg>`
			)
		}
	])
	.jpeg({ quality: 80 })
	.toBuffer();
function photoBody(clientId = randomUUID()): { body: Buffer; type: string } {
	const boundary = `----bench${randomUUID().replaceAll('-', '')}`;
	const field = (name: string, value: string) =>
		`--${boundary}\r\ncontent-disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`;
	const head =
		field('clientId', clientId) +
		field('purpose', 'report') +
		field('caption', 'Bench photo') +
		`--${boundary}\r\ncontent-disposition: form-data; name="file"; filename="p.jpg"\r\ncontent-type: image/jpeg\r\n\r\n`;
	return {
		body: Buffer.concat([Buffer.from(head), photo, Buffer.from(`\r\n--${boundary}--\r\n`)]),
		type: `multipart/form-data; boundary=${boundary}`
	};
}

/** Where bench/steady.js puts a new UUID in each request's body: as long as one. */
const FRESH = 'FRESH-ID-0000-0000-0000-000000000000';

const webhookPayload = (id = randomUUID()) =>
	JSON.stringify({
		id: `evt_bench_${id}`,
		object: 'event',
		type: 'charge.updated',
		account: `acct_scale${store}`,
		created: Math.floor(Date.now() / 1000),
		data: { object: { id: `ch_bench_${id}`, object: 'charge' } }
	});

interface Target {
	name: string;
	path: string;
	method?: 'GET' | 'POST';
	cookie?: string;
	body?: string;
	contentType?: string;
	/** A fresh request each time (a photo with its own id, a webhook with its own event). */
	fresh?: () => { body: string | Buffer; headers: Record<string, string> };
	/** The same for the steady rate's own process (bench/steady.js): `FRESH` marks the new id. */
	steadyTemplate?: { body: string | Buffer; headers: Record<string, string>; signWith?: string };
	/**
	 * Why the route is not run at the steady 50/s: a route that answers a few times a second would
	 * only fill the server's queue with hundreds of waiting requests, and the peak memory printed
	 * below would be theirs.
	 */
	noSteady?: string;
}

const previewBody = JSON.stringify({
	job: sampleJob(20),
	settings: defaultSettings,
	priceBook: samplePriceBook
});
const targets: Target[] = [
	{ name: 'baseline: session + SELECT 1', path: '/api/v1/health/session', cookie: owner },
	{ name: 'GET /api/v1/me', path: '/api/v1/me', cookie: owner },
	{
		name: 'job list: sold, by updated, 50',
		path: '/api/v1/jobs?status=sold&sort=updated&dir=desc&pageSize=50',
		cookie: owner
	},
	{ name: 'job list: all, by number, 50', path: '/api/v1/jobs?pageSize=50', cookie: owner },
	{
		name: 'job list: search "oak", by customer',
		path: '/api/v1/jobs?q=oak&sort=customer&dir=asc&pageSize=50',
		cookie: owner
	},
	{
		name: 'job list: search "oak", by number',
		path: '/api/v1/jobs?q=oak&pageSize=50',
		cookie: owner
	},
	{
		name: 'job list: search "orwin", by customer',
		path: '/api/v1/jobs?q=orwin&sort=customer&dir=asc&pageSize=50',
		cookie: owner
	},
	{
		name: 'job list: the last page but one, 50',
		path: `/api/v1/jobs?pageSize=50&page=${Math.max(1, Math.floor(Number(counts.jobs) / 50) - 1)}`,
		cookie: owner
	},
	{ name: 'customers: search "ash"', path: '/api/v1/customers?q=ash', cookie: owner },
	{ name: 'job page (SSR)', path: `/app/jobs/${someJob}`, cookie: owner },
	{ name: 'jobs page (SSR)', path: '/app/jobs', cookie: owner },
	{
		name: "desk, the store's day (SSR)",
		path: '/app',
		cookie: owner,
		noSteady: 'not run at 50/s: it answers fewer than 50 a second on the big store'
	},
	{ name: "installer's today (/field)", path: '/field', cookie: installer },
	{
		name: 'estimate preview, 20 rooms',
		path: '/api/v1/estimates/preview',
		method: 'POST',
		cookie: owner,
		body: previewBody,
		contentType: 'application/json'
	},
	...(fieldJob
		? [
				{
					name: 'photo upload (field API)',
					path: `/api/v1/field/jobs/${fieldJob}/photos`,
					method: 'POST' as const,
					cookie: installer,
					fresh: () => {
						const { body, type } = photoBody();
						return { body, headers: { 'content-type': type } };
					},
					steadyTemplate: (() => {
						const { body, type } = photoBody(FRESH);
						return { body, headers: { 'content-type': type } };
					})()
				}
			]
		: []),
	{
		name: 'Stripe webhook (signed)',
		path: '/api/webhooks/stripe',
		method: 'POST',
		fresh: () => {
			const body = webhookPayload();
			return {
				body,
				headers: {
					'content-type': 'application/json',
					'stripe-signature': signatureHeader(body, LOCAL_STRIPE_WEBHOOK_SECRET)
				}
			};
		},
		steadyTemplate: {
			body: webhookPayload(FRESH),
			headers: { 'content-type': 'application/json' },
			signWith: LOCAL_STRIPE_WEBHOOK_SECRET
		}
	}
];

// BENCH_ONLY: a comma-separated list of name parts; the baseline always runs.
const only = process.env.BENCH_ONLY?.split(',').map((p) => p.trim().toLowerCase());
if (only) {
	const kept = targets.filter(
		(t, i) => i === 0 || only.some((p) => t.name.toLowerCase().includes(p))
	);
	targets.splice(0, targets.length, ...kept);
}

interface Figures {
	rps: number;
	p50: number;
	p99: number;
	p99At50: number;
	errors: number;
	statuses: string;
	/** CPU ms per request at 10 connections: the server's process, and PostgreSQL's. */
	serverMs?: number;
	postgresMs?: number;
}

function run(
	t: Target,
	duration = seconds,
	extra: Partial<autocannon.Options> = {}
): autocannon.Instance & PromiseLike<autocannon.Result> {
	const headers: Record<string, string> = { origin };
	if (t.cookie) headers.cookie = t.cookie;
	if (t.contentType) headers['content-type'] = t.contentType;
	return autocannon({
		url: `${origin}${t.path}`,
		method: t.method ?? 'GET',
		connections: 10,
		duration,
		headers,
		body: t.body,
		...extra,
		...(t.fresh
			? {
					requests: [
						{
							setupRequest: (req: Record<string, unknown>) => {
								const f = t.fresh!();
								return {
									...req,
									body: f.body,
									headers: { ...(req.headers as object), ...f.headers }
								};
							}
						}
					]
				}
			: {})
	});
}

// At the steady rate, answers that were not 2xx (a photo queue that is full answers 503) are not
// timed: how many there were.
const steadyText = (s: { count: number; other: number; kinds: Record<string, number> }) =>
	s.other
		? `; at 50/s 2xx:${s.count} other:${s.other} (${Object.entries(s.kinds)
				.map(([kind, n]) => `${kind}:${n}`)
				.join(' ')})`
		: '';

const statusText = (r: autocannon.Result) =>
	(['1xx', '2xx', '3xx', '4xx', '5xx'] as const)
		.filter((k) => r[k] > 0)
		.map((k) => `${k}:${r[k]}`)
		.join(' ');

/**
 * p50 and p99 at a steady `rate` requests per second, sent by bench/steady.js in a process of its
 * own: one request every 1000/rate ms by the clock, each timed from when it was due (so a late
 * send counts against it), on a free keep-alive connection or a new one. Not autocannon here:
 * its `overallRate` sends each connection's share of the second back to back when the second
 * starts and corrects for coordinated omission with a 1 ms interval; and 50 one-connection
 * autocannon clients in this process drifted into bunches and were timed behind this process's
 * own work (a baseline p99 of 21–93 ms, against 9–20 ms from a process of its own). 2xx answers
 * are timed, the rest counted apart.
 */
async function steady(t: Target, rate: number, duration = seconds) {
	const headers: Record<string, string> = { origin };
	if (t.cookie) headers.cookie = t.cookie;
	if (t.contentType) headers['content-type'] = t.contentType;
	const template = t.steadyTemplate;
	const body = template?.body ?? t.body;
	const input = {
		url: `${origin}${t.path}`,
		method: t.method ?? 'GET',
		headers: { ...headers, ...template?.headers },
		body: body === undefined ? undefined : Buffer.from(body).toString('base64'),
		fresh: template ? FRESH : undefined,
		signWith: template?.signWith,
		rate,
		seconds: duration
	};
	// The input on standard input: a photo's body is over the 128 KB an argument may hold.
	const child = spawn(process.execPath, [path.join(import.meta.dirname, 'steady.js')], {
		stdio: ['pipe', 'pipe', 'inherit']
	});
	child.stdin.end(JSON.stringify(input));
	let out = '';
	child.stdout.on('data', (chunk) => (out += chunk));
	const code = await new Promise<number | null>((r) => child.on('close', r));
	if (code !== 0) throw new Error(`bench/steady.js ended with ${code}`);
	const { times, other, kinds } = JSON.parse(out) as {
		times: number[];
		other: number;
		kinds: Record<string, number>;
		late: number;
	};
	times.sort((a, b) => a - b);
	const at = (q: number) => (times.length ? times[Math.ceil(q * times.length) - 1] : NaN);
	return { p50: at(0.5), p99: at(0.99), count: times.length, other, kinds };
}

// Warm-up, not counted: the server's first seconds (JIT, the pool's connections) would otherwise
// fall on whichever route runs first, the baseline.
await run({ ...targets[0] }, 5);
for (const t of targets.slice(1)) await run(t, 1);

/**
 * CPU time (ms) used so far by the server's process and by the cluster's processes (the
 * postmaster's children: the pool's backends among them), from /proc: where a route's time goes.
 * A child that has ended (a backend the pool closed, an autovacuum worker) is counted through the
 * postmaster's own total for its ended children, not dropped from the sum.
 */
function cpuNow(): { server: number; postgres: number } {
	const ticks = (pid: number | string) => {
		try {
			const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
			return {
				ppid: Number(fields[1]),
				cpu: (Number(fields[11]) + Number(fields[12])) * 10,
				ended: (Number(fields[13]) + Number(fields[14])) * 10
			};
		} catch {
			return { ppid: 0, cpu: 0, ended: 0 };
		}
	};
	let postgres = 0;
	try {
		const master = Number(
			readFileSync(path.join(cluster.dataDir, 'postmaster.pid'), 'utf8').split('\n')[0]
		);
		postgres += ticks(master).ended;
		for (const pid of readdirSync('/proc').filter((p) => /^\d+$/.test(p))) {
			const t = ticks(pid);
			if (t.ppid === master) postgres += t.cpu;
		}
	} catch {
		/* no figure */
	}
	return { server: ticks(server.pid!).cpu, postgres };
}

/** The CPU each side spent per request between two readings of `cpuNow()`. */
function cpuPerRequest(
	before: ReturnType<typeof cpuNow>,
	after: ReturnType<typeof cpuNow>,
	requests: number
) {
	return {
		serverMs: (after.server - before.server) / Math.max(1, requests),
		postgresMs: (after.postgres - before.postgres) / Math.max(1, requests)
	};
}

/**
 * A route's rate against the baseline's, the two taken in turns: a baseline slice, then
 * `pairs` times the route's slice and a baseline slice, each `slice` seconds at 10 connections.
 * Each route slice is read against the mean of the baseline slices either side of it, and the
 * median of those ratios kept: the other work of a shared host, which moves the rate of the same
 * route by a third within a run, moves both sides of a pair alike, and a slice it hit hard is the
 * one the median leaves out (bench/README.md, "`× near` in turns").
 */
async function paired(t: Target, pairs = NEAR_PAIRS, slice = NEAR_SECONDS) {
	const baseline = [(await run(targets[0], slice)).requests.total];
	const ratios: number[] = [];
	for (let i = 0; i < pairs; i++) {
		const route = (await run(t, slice)).requests.total;
		baseline.push((await run(targets[0], slice)).requests.total);
		ratios.push(route / Math.max(1, (baseline[i] + baseline[i + 1]) / 2));
	}
	ratios.sort((a, b) => a - b);
	const mid = ratios.length >> 1;
	return ratios.length % 2 ? ratios[mid] : (ratios[mid - 1] + ratios[mid]) / 2;
}

const results = new Map<string, Figures>();
// `× near` of each route but the baseline: `paired`, before the route's own run.
const near = new Map<string, number>();
/** The peak memory before the routes not run at 50/s (the desk): the figure for the rest. */
let peakBeforeSlow: number | null = null;
for (const [i, t] of targets.entries()) {
	if (i > 0) near.set(t.name, await paired(t));
	if (t.noSteady && peakBeforeSlow === null) peakBeforeSlow = peakMemory();
	const before = cpuNow();
	const full = await run(t);
	const after = cpuNow();
	const at50 = t.noSteady ? null : await steady(t, 50);
	results.set(t.name, {
		...cpuPerRequest(before, after, full.requests.total),
		rps: full.requests.average,
		p50: full.latency.p50,
		p99: full.latency.p99,
		p99At50: at50?.p99 ?? NaN,
		errors: full.errors + full.timeouts + full.non2xx,
		statuses: statusText(full) + (at50 ? steadyText(at50) : `; ${t.noSteady}`)
	});
	process.stderr.write('.');
}
// The baseline once more at the end: on a shared machine the load moves during a run, and the
// ratios are read against the mean of the two.
{
	const t = targets[0];
	const before = cpuNow();
	const full = await run(t);
	const after = cpuNow();
	const at50 = await steady(t, 50);
	const first = results.get(t.name)!;
	results.set('baseline, again at the end', {
		...cpuPerRequest(before, after, full.requests.total),
		rps: full.requests.average,
		p50: full.latency.p50,
		p99: full.latency.p99,
		p99At50: at50.p99,
		errors: full.errors + full.timeouts + full.non2xx,
		statuses: statusText(full) + steadyText(at50)
	});
	const again = results.get('baseline, again at the end')!;
	results.set('baseline: mean of the two', {
		serverMs: (first.serverMs! + again.serverMs!) / 2,
		postgresMs: (first.postgresMs! + again.postgresMs!) / 2,
		rps: (first.rps + full.requests.average) / 2,
		p50: (first.p50 + full.latency.p50) / 2,
		p99: (first.p99 + full.latency.p99) / 2,
		p99At50: (first.p99At50 + at50.p99) / 2,
		errors: 0,
		statuses: ''
	});
}
process.stderr.write('\n');

/** The server's peak memory so far (VmHWM, MB). */
function peakMemory() {
	try {
		const status = readFileSync(`/proc/${server.pid}/status`, 'utf8');
		return Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? 0) / 1024;
	} catch {
		return 0;
	}
}
const hwm = peakMemory();

const base = results.get('baseline: mean of the two')!;
console.log(
	`\nFlushline bench: store ${store} (${counts.jobs} jobs, ${counts.customers} customers), ` +
		`${seconds} s per run, 10 connections; p99@50 at a steady 50 requests/s\n`
);
// `p99@50 ×`: the route's p99 at a steady 50 requests/s over the baseline's at the same rate.
// `cpu ×`: the baseline's CPU per request (server and PostgreSQL) over the route's. At 10
// connections on two cores the rate is bound by CPU, so this is the ratio `× base` would show on
// a machine to itself, though the host's other work slows both too. `× near`: the route's rate over
// the baseline's, the two taken in turns of NEAR_SECONDS (`paired`).
const cpuOf = (f: Figures) =>
	f.serverMs === undefined || f.postgresMs === undefined ? undefined : f.serverMs + f.postgresMs;
const baseCpu = cpuOf(base);
console.log(
	`${'route'.padEnd(38)} ${'req/s'.padStart(7)} ${'× base'.padStart(7)} ${'p50 ms'.padStart(7)} ${'p99 ms'.padStart(7)} ${'p99@50'.padStart(7)} ${'p99@50 ×'.padStart(9)} ${'cpu ms: app'.padStart(11)} ${'pg'.padStart(5)} ${'cpu ×'.padStart(6)} ${'× near'.padStart(7)}  statuses`
);
/** A figure at the steady rate, or a dash for a route not run at it. */
const at50Text = (v: number, digits: number) => (Number.isNaN(v) ? '—' : v.toFixed(digits));

for (const [name, f] of results) {
	const cpu = cpuOf(f);
	const nearText = near.get(name)?.toFixed(2) ?? '';
	const cpuRatio = cpu && baseCpu ? (baseCpu / cpu).toFixed(2) : '';
	console.log(
		`${name.padEnd(38)} ${f.rps.toFixed(0).padStart(7)} ${(f.rps / base.rps).toFixed(2).padStart(7)} ${String(f.p50).padStart(7)} ${String(f.p99).padStart(7)} ${at50Text(f.p99At50, 1).padStart(7)} ${at50Text(f.p99At50 / base.p99At50, 2).padStart(9)} ${(f.serverMs?.toFixed(2) ?? '').padStart(11)} ${(f.postgresMs?.toFixed(2) ?? '').padStart(5)} ${cpuRatio.padStart(6)} ${nearText.padStart(7)}  ${f.statuses}`
	);
}
console.log(`\nserver peak memory (VmHWM): ${hwm.toFixed(0)} MB`);
if (peakBeforeSlow !== null) {
	console.log(`  before the desk's run at 10 connections: ${peakBeforeSlow.toFixed(0)} MB`);
}
console.log(`server start to answering: ${((ready - started) / 1000).toFixed(1)} s`);

if (process.env.BENCH_SKIP_BROWSER !== '1') {
	// Debian's Chromium, installed as `npm test` installs it when a fresh machine has none.
	const browser = await chromium.launch({ executablePath: ensureChromium() });
	const pages: { who: string; cookie: string; path: string }[] = [
		{ who: 'staff', cookie: owner, path: '/app' },
		{ who: 'staff', cookie: owner, path: '/app/jobs' },
		{ who: 'staff', cookie: owner, path: `/app/jobs/${someJob}` },
		{ who: 'staff', cookie: owner, path: `/app/jobs/${someJob}/measure` },
		{ who: 'staff', cookie: owner, path: `/app/jobs/${someJob}/quote` },
		{ who: 'staff', cookie: owner, path: `/app/jobs/${someJob}/payments` },
		{ who: 'staff', cookie: owner, path: '/app/customers' },
		{ who: 'staff', cookie: owner, path: '/app/schedule' },
		{ who: 'staff', cookie: owner, path: '/app/calculators?c=joists' },
		{ who: 'installer', cookie: installer, path: '/field' },
		{ who: 'installer', cookie: installer, path: '/field/calculators' },
		// An open calculator loads the engine and the schemas (the list does not).
		{ who: 'installer', cookie: installer, path: '/field/calculators?c=joists' },
		{ who: 'installer', cookie: installer, path: '/field/profile' },
		{ who: 'installer', cookie: installer, path: '/field/statements' },
		...(fieldJob ? [{ who: 'installer', cookie: installer, path: `/field/jobs/${fieldJob}` }] : [])
	];
	console.log('\nfirst load, gzip (each JS/CSS response gzip -9 compressed, summed):');
	for (const p of pages) {
		const context = await browser.newContext();
		await context.addCookies(
			p.cookie.split('; ').map((c) => {
				const at = c.indexOf('=');
				return { name: c.slice(0, at), value: c.slice(at + 1), url: origin };
			})
		);
		const page = await context.newPage();
		let js = 0;
		let css = 0;
		const pending: Promise<void>[] = [];
		page.on('response', (response) => {
			const type = response.headers()['content-type'] ?? '';
			const isJs = type.includes('javascript');
			const isCss = type.includes('text/css');
			if (!isJs && !isCss) return;
			pending.push(
				response
					.body()
					.then((b) => {
						const size = gzipSync(b, { level: 9 }).length;
						if (isJs) js += size;
						else css += size;
					})
					.catch(() => {})
			);
		});
		// Not `networkidle`: the installer's pages keep a sync going. Loaded, hydrated, settled.
		await page.goto(`${origin}${p.path}`, { waitUntil: 'load' });
		await page.waitForSelector('html[data-hydrated]', { timeout: 15_000 }).catch(() => {});
		await page.waitForTimeout(1000);
		await Promise.all(pending);
		console.log(
			`  ${p.who.padEnd(10)} ${p.path.replace(/[0-9a-f-]{36}/, '<id>').padEnd(34)} JS ${(js / 1024).toFixed(1).padStart(6)} KB   CSS ${(css / 1024).toFixed(1).padStart(5)} KB`
		);
		await context.close();
	}
	await browser.close();
}
stop();
if (process.env.BENCH_CLONE !== '0') {
	// Last, with this server stopped: a fresh clone's `npm start`, timed (bench/clone-to-serve.js).
	console.log('\nfresh clone to serving (npm start in a new clone; BENCH_CLONE=0 skips it):');
	spawnSync(process.execPath, [path.join(root, 'bench/clone-to-serve.js')], { stdio: 'inherit' });
}
process.exit(0);
