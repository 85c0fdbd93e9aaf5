// Runs a benchmark from bench/ as the server ships the code: bundled by esbuild (as Vite's build
// does), not through tsx, whose esbuild options (`keepNames`) wrap every inner function in a
// naming call that production code never makes. Usage: node bench/run.js estimate
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const name = process.argv[2] ?? 'estimate';
if (!/^[a-z-]+$/.test(name)) {
	console.error('Name a benchmark in bench/, e.g. estimate');
	process.exit(2);
}
const dir = mkdtempSync(path.join(tmpdir(), 'flushline-bench-'));
const outfile = path.join(dir, `${name}.mjs`);
try {
	await build({
		entryPoints: [path.join(import.meta.dirname, `${name}.ts`)],
		bundle: true,
		platform: 'node',
		format: 'esm',
		target: 'node20',
		outfile,
		logLevel: 'warning'
	});
	const run = spawnSync(process.execPath, [outfile], { stdio: 'inherit' });
	process.exitCode = run.status ?? 1;
} finally {
	rmSync(dir, { recursive: true, force: true });
}
