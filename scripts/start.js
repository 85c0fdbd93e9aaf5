// `npm start`: installs what is missing, starts the project's own PostgreSQL, migrates, seeds the
// demo store when the database is empty, builds, and serves on http://127.0.0.1:3000.
// Ctrl-C stops the server, then PostgreSQL; committed data stays in .data/.
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { ensurePackages, root, run, serverMemoryEnv, serverNodeArgs, step } from './lib/system.js';

const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 3000);
const origin = process.env.ORIGIN ?? `http://${host}:${port}`;
const pgPort = Number(process.env.FLUSHLINE_PG_PORT ?? 54320);
const dataDir = path.resolve(root, process.env.FLUSHLINE_DATA_DIR ?? '.data/app');

/** The auth secret: from the environment, or made once and kept in the data folder. */
function authSecret() {
	if (process.env.BETTER_AUTH_SECRET) return process.env.BETTER_AUTH_SECRET;
	const file = path.join(dataDir, 'auth-secret');
	if (!existsSync(file)) {
		mkdirSync(dataDir, { recursive: true });
		writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 });
	}
	return readFileSync(file, 'utf8').trim();
}

function portFree(p) {
	return new Promise((resolve) => {
		const probe = net.createServer();
		probe.once('error', () => resolve(false));
		probe.once('listening', () => probe.close(() => resolve(true)));
		probe.listen(p, host);
	});
}

async function main() {
	ensurePackages();
	const { clusterAt, prepareDatabase, startCluster, stopCluster } =
		await import('./lib/postgres.js');
	if (!(await portFree(port))) {
		throw new Error(`Port ${port} on ${host} is in use. Stop what uses it, or set PORT.`);
	}

	const cluster = clusterAt('postgres', pgPort);
	const { startedHere } = startCluster(cluster);
	const stopDatabase = () => {
		if (!startedHere) return;
		step('Stopping PostgreSQL');
		stopCluster(cluster);
	};

	let server;
	try {
		const { appUrl, ownerUrl } = await prepareDatabase(cluster, { database: 'flushline' });
		const env = {
			...process.env,
			DATABASE_URL: process.env.DATABASE_URL ?? appUrl,
			DATABASE_OWNER_URL: ownerUrl,
			BETTER_AUTH_SECRET: authSecret(),
			FLUSHLINE_DATA_DIR: dataDir,
			ORIGIN: origin,
			HOST: host,
			PORT: String(port),
			// Logo uploads are up to 2 MB; adapter-node refuses bodies over 512 kB by default.
			BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '3M',
			// The demo runs on the local fakes, on purpose (a real key still switches its fake off).
			FLUSHLINE_FAKES: process.env.FLUSHLINE_FAKES ?? '1'
		};
		// Only the server's: the seed and the build run without the heap cap.
		const serverEnv = { ...env, ...serverMemoryEnv() };
		step('Seeding the demo store when the database is empty');
		run('npx', ['tsx', 'scripts/seed.ts'], { env });
		step('Building');
		run('npx', ['vite', 'build', '--logLevel', 'warn'], { env });

		server = spawn(process.execPath, [...serverNodeArgs(), 'build'], {
			cwd: root,
			env: serverEnv,
			stdio: 'inherit'
		});
		const demo = JSON.parse(readFileSync(path.join(root, 'scripts/demo-people.json'), 'utf8'));
		console.log(`\n  Flushline is on \x1b[1m${origin}\x1b[0m\n`);
		console.log(`  Demo logins of Tallow Creek Floors (password for all: ${demo.password}):`);
		for (const p of demo.people)
			console.log(`    ${p.role.padEnd(10)} ${p.email.padEnd(32)} ${p.name}`);
		console.log(`\n  E-mail sent by the app: ${origin}/dev/outbox`);
		console.log(`  Test card payments (the local Stripe): ${origin}/dev/stripe`);
		console.log('  Ctrl-C stops the server and PostgreSQL.\n');
	} catch (e) {
		stopDatabase();
		throw e;
	}

	let stopping = false;
	const shutdown = () => {
		if (stopping) return;
		stopping = true;
		server.kill('SIGTERM');
	};
	process.on('SIGINT', shutdown);
	process.on('SIGTERM', shutdown);
	server.on('exit', (code) => {
		stopDatabase();
		process.exit(stopping ? 0 : (code ?? 1));
	});
}

main().catch((e) => {
	console.error(`\n\x1b[31mnpm start failed:\x1b[0m ${e.message}`);
	process.exit(1);
});
