// Benchmark: the time from a fresh clone to a server that answers. Clones this repository's
// HEAD into a temporary folder and runs `npm start` there (install, PostgreSQL, migrations, the
// demo seed, the production build, the server) on ports of its own, timing each step until the
// sign-in page answers 200. Run: npm run bench:clone (also the last part of `npm run bench`).
// The npm cache is the machine's, as a developer's second clone would find it.
import { spawn, spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { stripVTControlCharacters } from 'node:util';

const root = path.resolve(import.meta.dirname, '..');
const port = Number(process.env.FLUSHLINE_CLONE_PORT ?? 4281);
const pgPort = Number(process.env.FLUSHLINE_CLONE_PG_PORT ?? 54381);
const dir = mkdtempSync(path.join(tmpdir(), 'flushline-clone-'));
// PostgreSQL runs as its own user and must enter the clone (mkdtemp makes it 0700).
chmodSync(dir, 0o755);
const origin = `http://127.0.0.1:${port}`;

const t0 = performance.now();
const seconds = () => ((performance.now() - t0) / 1000).toFixed(1);
const cloned = spawnSync('git', ['clone', '--quiet', root, dir], { stdio: 'inherit' });
if (cloned.status !== 0) process.exit(1);
console.log(`clone: ${seconds()} s`);

const marks = [];
const child = spawn('npm', ['start'], {
	cwd: dir,
	env: {
		...process.env,
		PORT: String(port),
		ORIGIN: origin,
		FLUSHLINE_PG_PORT: String(pgPort),
		FLUSHLINE_DATA_DIR: path.join(dir, '.data/app')
	},
	stdio: ['ignore', 'pipe', 'pipe'],
	detached: true
});
let out = '';
const note = (d) => {
	out += d;
	for (const line of String(d).split('\n')) {
		const step = /^\s*›\s*(.+)$/.exec(stripVTControlCharacters(line));
		if (step) marks.push([step[1].trim(), seconds()]);
	}
};
child.stdout.on('data', note);
child.stderr.on('data', note);
let exited = false;
child.on('exit', () => (exited = true));

let ok = false;
for (let i = 0; i < 1800 && !exited; i++) {
	try {
		const r = await fetch(`${origin}/sign-in`);
		if (r.status === 200) {
			ok = true;
			break;
		}
	} catch {
		/* not yet */
	}
	await new Promise((r) => setTimeout(r, 500));
}
const total = seconds();
for (const [name, at] of marks) console.log(`  ${at.padStart(6)} s  ${name}`);
if (ok) console.log(`fresh clone to serving: ${total} s`);
else console.log(`the clone never served (after ${total} s):\n${out.slice(-3000)}`);

// Stop npm start (it stops its server and PostgreSQL on SIGTERM), then remove the clone.
try {
	process.kill(-child.pid, 'SIGTERM');
} catch {
	/* gone already */
}
for (let i = 0; i < 60 && !exited; i++) await new Promise((r) => setTimeout(r, 500));
spawnSync('node', ['scripts/db.js', 'stop'], {
	cwd: dir,
	env: { ...process.env, FLUSHLINE_PG_PORT: String(pgPort) },
	stdio: 'ignore'
});
rmSync(dir, { recursive: true, force: true });
process.exit(ok ? 0 : 1);
