// Idle connections behind the balancer: how many requests end without an answer when HAProxy
// (deploy/haproxy.cfg, as committed) sends them on a connection node's server is closing.
// `http-reuse safe` lets HAProxy send a client's later requests on a server connection an earlier
// request left idle; node's server closes it `keepAliveTimeout` (5 s) and a second of grace after
// its last answer. Each client here sends three requests on one keep-alive connection, spaced
// 5.90–6.15 s apart, through HAProxy to two plain `node:http` servers (the http server
// adapter-node runs; the app itself is not needed for this), once with node's default and once
// with KEEP_ALIVE_TIMEOUT=65 (README, "Deploying on several servers", "Idle connections").
// Run: npm run bench:keep-alive   (about 40 s; KEEP_ALIVE_CLIENTS, default 400)
import { spawn } from 'node:child_process';
import http from 'node:http';
import path from 'node:path';
import { ensureHaproxy } from '../scripts/lib/system.js';

const root = path.resolve(import.meta.dirname, '..');
const base = Number(process.env.FLUSHLINE_KEEP_ALIVE_PORT ?? 4291);
const clients = Math.min(2_000, Math.max(1, Number(process.env.KEEP_ALIVE_CLIENTS ?? 400)));
const requests = 3;

if (process.argv[2] === 'server') {
	const server = http.createServer((req, res) => res.end('ok'));
	if (process.argv[4]) server.keepAliveTimeout = Number(process.argv[4]) * 1000;
	server.listen(Number(process.argv[3]), '127.0.0.1', () => process.send?.('listening'));
} else {
	const haproxy = ensureHaproxy();
	console.log(
		`${clients} clients through deploy/haproxy.cfg to two node servers, ${requests} requests each, 5.90–6.15 s apart\n`
	);
	console.log('server keep-alive            answered   no answer (reset)   other');
	for (const seconds of [undefined, 65]) {
		const counts = await trial(haproxy, seconds);
		const label = seconds ? `KEEP_ALIVE_TIMEOUT=${seconds}` : "node's default (5 s)";
		console.log(
			`${label.padEnd(28)} ${String(counts.ok).padStart(8)}   ${String(counts.reset).padStart(17)}   ${String(counts.other).padStart(5)}`
		);
	}
}

/** One round: two servers, the balancer, and the clients; then everything stopped. */
async function trial(haproxy, seconds) {
	const children = [];
	try {
		for (const port of [base + 1, base + 2]) {
			const args = [
				import.meta.filename,
				'server',
				String(port),
				...(seconds ? [String(seconds)] : [])
			];
			const child = spawn(process.execPath, args, {
				stdio: ['ignore', 'inherit', 'inherit', 'ipc']
			});
			children.push(child);
			await new Promise((resolve, reject) => {
				child.once('message', resolve);
				child.once('exit', () => reject(new Error(`The server on ${port} did not start`)));
			});
		}
		const balancer = spawn(haproxy, ['-f', path.join(root, 'deploy/haproxy.cfg'), '-db'], {
			env: {
				...process.env,
				FLUSHLINE_LB_BIND: `127.0.0.1:${base}`,
				FLUSHLINE_APP_1: `127.0.0.1:${base + 1}`,
				FLUSHLINE_APP_2: `127.0.0.1:${base + 2}`
			},
			stdio: 'ignore'
		});
		children.push(balancer);
		// Until both servers pass the balancer's health check (every second, two in a row).
		await new Promise((r) => setTimeout(r, 3_000));
		return await run();
	} finally {
		for (const child of children) child.kill();
	}
}

async function run() {
	const counts = { ok: 0, reset: 0, other: 0 };
	await Promise.all(
		Array.from({ length: clients }, async (_, i) => {
			const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
			for (let k = 0; k < requests; k++) {
				if (k) await new Promise((r) => setTimeout(r, 5_900 + (i * 250) / clients));
				try {
					const status = await get(agent);
					counts[status === 200 ? 'ok' : 'other']++;
				} catch (e) {
					counts[e.code === 'ECONNRESET' ? 'reset' : 'other']++;
				}
			}
			agent.destroy();
		})
	);
	return counts;
}

function get(agent) {
	return new Promise((resolve, reject) => {
		const req = http.get({ host: '127.0.0.1', port: base, path: '/', agent }, (res) => {
			res.resume();
			res.on('end', () => resolve(res.statusCode));
		});
		req.on('error', reject);
	});
}
