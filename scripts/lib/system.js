// Machine setup shared by `npm start` and `npm test`: npm packages, Debian packages, and running
// commands as the `postgres` user. Uses only Node's standard library, so it runs before `npm ci`.
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

/**
 * V8's cap on the server's old space, in MB. The cap also sets how far V8 lets the heap grow past
 * what survived the last full collection before it collects again: up to 4× when the cap is 2 GB
 * or more (Node's default on a machine with 16 GB or more), 1.3–2× when it is smaller, scaled
 * between 256 MB and 2 GB (V8, src/heap/heap-controller.cc, `MaxGrowingFactor`). The server keeps
 * 40–65 MB alive under the bench's load; with the default cap the old space grew to 140–200 MB of
 * mostly garbage, so the process held 250–360 MB; with 384 MB it stays near 50–60 MB.
 */
export const SERVER_HEAP_MB = 384;

/**
 * The memory settings `node build` runs with (`npm start`, `npm run bench`, the server tests):
 * glibc's arenas and V8's old-space cap, unless the environment already sets them.
 */
export function serverMemoryEnv(env = process.env) {
	const options = env.NODE_OPTIONS ?? '';
	return {
		// glibc gives each thread its own malloc arena; sharp's decoding threads then leave
		// hundreds of MB of fragments. Two arenas keep a photo-heavy server near its real use.
		MALLOC_ARENA_MAX: env.MALLOC_ARENA_MAX ?? '2',
		NODE_OPTIONS: /--max-old-space-size\b/.test(options)
			? options
			: `${options} --max-old-space-size=${SERVER_HEAP_MB}`.trim()
	};
}

/**
 * The flags `node build` runs with (`npm start`, `npm run bench`, the server tests), before the
 * entry point: V8 refuses its garbage collector's threading flags in NODE_OPTIONS.
 *
 * On a machine of two cores or fewer, `--single-threaded-gc`: V8 then collects on the main thread
 * alone, without helper threads for the young generation's scavenges and the old generation's
 * marking. With two cores shared by the server, PostgreSQL and the clients, a helper thread waits
 * for a core while the main thread waits for the helper, and a 3–5 ms scavenge or a 10 ms marking
 * step stretched that way is most of the tail: at a steady 50 requests/s on this kind of machine
 * the job list's p99 went from 25–29 ms to 14–18 ms, and the CPU a request costs did not grow
 * (bench/README.md, "The tail is the collector's"). Collecting on one thread, V8 held 10–15 MB
 * more at the peak; a young generation of 8 MB semi-spaces instead of 16 gives that back, unless
 * NODE_OPTIONS sets its own size. With more cores the helpers have cores of their own, and V8's
 * defaults stay.
 * @param {number} [cores] the cores this process may use (Node's `availableParallelism()`)
 * @param {Record<string, string | undefined>} [env] the environment the server gets
 */
export function serverNodeArgs(cores = availableParallelism(), env = process.env) {
	if (cores > 2) return [];
	const semiSpaceSet = /--max-semi-space-size\b/.test(env.NODE_OPTIONS ?? '');
	return ['--single-threaded-gc', ...(semiSpaceSet ? [] : ['--max-semi-space-size=8'])];
}

/** Prints a step the way both commands do. */
export function step(message) {
	console.log(`\x1b[1m›\x1b[0m ${message}`);
}

/**
 * Runs a command to completion, inheriting the terminal, and throws on a non-zero exit.
 * @param {string} command
 * @param {string[]} args
 * @param {import('node:child_process').SpawnSyncOptions} [options]
 */
export function run(command, args, options = {}) {
	const result = spawnSync(command, args, { stdio: 'inherit', cwd: root, ...options });
	if (result.error) throw result.error;
	if (result.status !== 0) {
		throw new Error(`${command} ${args.join(' ')} exited with ${result.status ?? result.signal}`);
	}
	return result;
}

/** Runs a command and returns its trimmed stdout, or null when it fails. */
export function capture(command, args, options = {}) {
	const result = spawnSync(command, args, { cwd: root, encoding: 'utf8', ...options });
	if (result.error || result.status !== 0) return null;
	return String(result.stdout).trim();
}

/** `npm ci` when node_modules is missing or older than the lock file. */
export function ensurePackages() {
	const marker = path.join(root, 'node_modules', '.package-lock.json');
	const lock = path.join(root, 'package-lock.json');
	if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
	step('Installing npm packages (npm ci)');
	run('npm', ['ci', '--no-audit', '--no-fund']);
}

/**
 * Installs Debian packages with apt-get. As root it runs apt-get directly; otherwise through
 * sudo when sudo is there, and else stops with the command to run.
 * @param {string[]} packages
 */
export function aptInstall(packages) {
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	if (!isRoot && !capture('sh', ['-c', 'command -v sudo'])) {
		throw new Error(
			`Missing Debian packages: ${packages.join(' ')}. Run as root: apt-get install -y ${packages.join(' ')}`
		);
	}
	step(`Installing ${packages.join(', ')} from Debian's packages`);
	const [cmd, ...head] = isRoot ? ['apt-get'] : ['sudo', '-E', 'apt-get'];
	run(cmd, [...head, 'update'], { env });
	run(cmd, [...head, 'install', '-y', '--no-install-recommends', ...packages], { env });
}

/**
 * Runs a command as the `postgres` user when we are root (PostgreSQL refuses to run as root),
 * and as ourselves otherwise.
 * @param {string} command
 * @param {string[]} args
 * @param {import('node:child_process').SpawnSyncOptions & { quiet?: boolean }} [options]
 */
export function runAsPostgres(command, args, options = {}) {
	const { quiet, ...rest } = options;
	const full = isRoot ? ['runuser', ['-u', 'postgres', '--', command, ...args]] : [command, args];
	return run(full[0], /** @type {string[]} */ (full[1]), {
		...rest,
		stdio: quiet ? ['ignore', 'pipe', 'pipe'] : 'inherit'
	});
}

/** The Chromium that Playwright drives: Debian's, installed with apt-get when missing. */
export function ensureChromium() {
	const executable = process.env.CHROMIUM_PATH || '/usr/bin/chromium';
	if (existsSync(executable)) return executable;
	aptInstall(['chromium']);
	return executable;
}

/**
 * HAProxy, the load balancer the several-servers test puts in front of two app servers:
 * Debian's `haproxy`, installed with apt-get when missing. Only the binary is used; the test runs
 * it as its own child process with its own configuration (never as the system service).
 */
export function ensureHaproxy() {
	const found = capture('sh', ['-c', 'command -v haproxy || ls /usr/sbin/haproxy']);
	if (found) return found.split('\n')[0];
	aptInstall(['haproxy']);
	const installed = capture('sh', ['-c', 'command -v haproxy || ls /usr/sbin/haproxy']);
	if (!installed) throw new Error('haproxy was installed but is not on PATH or in /usr/sbin');
	return installed.split('\n')[0];
}
