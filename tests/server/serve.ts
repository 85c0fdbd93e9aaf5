// Starts the production build (`node build`) with chosen settings on a port of its own, for tests
// that send it real requests: start-up checks, hooks, headers, limits and logs as deployed.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';

export interface Served {
	origin: string;
	/** Everything the server printed so far (stdout and stderr). */
	output(): string;
	/** Resolves with the exit code once the process ends. */
	exited: Promise<number | null>;
	stop(): Promise<void>;
	/** SIGKILL: no shutdown, no goodbye, as a machine losing power. */
	kill(): Promise<void>;
	/** Whether the process still runs. */
	alive(): boolean;
	/** A request to the server; `origin` set so form posts pass SvelteKit's CSRF check. */
	fetch(pathname: string, init?: RequestInit): Promise<Response>;
}

/** Ports above the browser tests' own, one per server a file starts. */
export function portFor(slot: number) {
	return Number(process.env.FLUSHLINE_TEST_PORT ?? 4173) + 10 + slot;
}

/** What the build needs from `npm test`'s environment, with the fakes on unless overridden. */
function baseEnv(port: number): NodeJS.ProcessEnv {
	if (!process.env.DATABASE_URL)
		throw new Error('Run these through `npm test` (needs the test database)');
	return {
		PATH: process.env.PATH,
		DATABASE_URL: process.env.DATABASE_URL,
		BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET ?? 'server-tests-secret-server-tests-secret',
		HOST: '127.0.0.1',
		PORT: String(port),
		ORIGIN: `http://127.0.0.1:${port}`,
		FLUSHLINE_DATA_DIR: mkdtempSync(path.join(tmpdir(), 'flushline-server-')),
		FLUSHLINE_FAKES: '1',
		LOG_LEVEL: 'info'
	};
}

/**
 * The memory settings and node's flags `npm start` and the bench give `node build`
 * (scripts/lib/system.js).
 */
async function serverSettings(): Promise<{ env: Record<string, string>; args: string[] }> {
	const system = (await import(
		/* @vite-ignore */ pathToFileURL(path.resolve('scripts/lib/system.js')).href
	)) as {
		serverMemoryEnv(env: Record<string, string | undefined>): Record<string, string>;
		serverNodeArgs(cores?: number, env?: Record<string, string | undefined>): string[];
	};
	// Both from an empty environment: a NODE_OPTIONS of the test run's own never reaches the servers.
	return { env: system.serverMemoryEnv({}), args: system.serverNodeArgs(undefined, {}) };
}

/**
 * Starts the build. Resolves once it answers `GET /`, or once it exits (a server that refuses to
 * start): check `exited` and `output()` then.
 */
export async function serve(slot: number, env: Record<string, string | undefined> = {}) {
	const port = portFor(slot);
	const settings = await serverSettings();
	const merged = { ...baseEnv(port), ...settings.env, ...env };
	for (const [k, v] of Object.entries(merged)) if (v === undefined) delete merged[k];
	const child: ChildProcess = spawn(process.execPath, [...settings.args, 'build'], {
		env: merged,
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let out = '';
	child.stdout!.on('data', (d) => (out += d));
	child.stderr!.on('data', (d) => (out += d));
	let done = false;
	const exited = new Promise<number | null>((resolve) =>
		child.on('exit', (code) => {
			done = true;
			resolve(code);
		})
	);
	const url = `http://127.0.0.1:${port}`;
	const served: Served = {
		origin: merged.ORIGIN!,
		output: () => out,
		exited,
		stop: async () => {
			if (!done) child.kill('SIGTERM');
			await exited;
		},
		kill: async () => {
			if (!done) child.kill('SIGKILL');
			await exited;
		},
		alive: () => !done,
		fetch: (pathname, init = {}) => {
			const headers = new Headers(init.headers);
			if (!headers.has('origin')) headers.set('origin', merged.ORIGIN!);
			return fetch(url + pathname, { redirect: 'manual', ...init, headers });
		}
	};
	for (let i = 0; i < 200 && !done; i++) {
		try {
			await fetch(`${url}/`);
			return served;
		} catch {
			await new Promise((r) => setTimeout(r, 150));
		}
	}
	if (!done) {
		await served.stop();
		throw new Error(`The server did not start:\n${out}`);
	}
	return served;
}

/** A form body as a browser without JavaScript sends it. */
export function form(fields: Record<string, string>) {
	return {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' },
		body: new URLSearchParams(fields).toString()
	} satisfies RequestInit;
}

/** A JSON body. */
export function jsonBody(body: unknown, method = 'POST') {
	return {
		method,
		headers: { 'content-type': 'application/json' },
		body: typeof body === 'string' ? body : JSON.stringify(body)
	} satisfies RequestInit;
}

/** scripts/lib/postgres.js, where the server tests run it in this process. */
export const POSTGRES_MODULE = path.resolve('scripts/lib/postgres.js');

/** What the server tests use of scripts/lib/postgres.js (loaded by path: it is checked as a script). */
export interface Postgres {
	clusterAt(name: string, port: number, fast?: boolean): object;
	startCluster(cluster: object): unknown;
	stopCluster(cluster: object): void;
	prepareDatabase(
		cluster: object,
		options: { database: string; fresh?: boolean }
	): Promise<{ appUrl: string; ownerUrl: string }>;
	databaseUrl(cluster: object, user: string, database: string): string;
}

/** Loads scripts/lib/postgres.js. */
export async function loadPostgres(): Promise<Postgres> {
	return (await import(/* @vite-ignore */ pathToFileURL(POSTGRES_MODULE).href)) as Postgres;
}
