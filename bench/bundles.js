/**
 * First-load JavaScript of each main page, from the last build, against issue 13's targets
 * (staff pages ≤ 150 KB, installer pages ≤ 100 KB of gzip JavaScript).
 *
 *   npm run bench:bundles                     every page: KB gzip -9 vs its target
 *   npm run bench:bundles -- --chunks         and each page's chunks, largest first
 *   npx vite build --sourcemap hidden && npm run bench:bundles -- --sources
 *                                             and what each chunk holds (by package or folder)
 *
 * A page's first load is what SvelteKit preloads for it: the client entries (`start`, `app`) and
 * the page's nodes (its layouts and its page), each with its static imports, followed through
 * Vite's manifest (`.svelte-kit/output/client/.vite/manifest.json`); the route → nodes table is
 * read from the server's manifest. A page whose universal load imports a module at once (the
 * open calculator) lists that module under `also`. Chromium's figure (`npm run bench`) also
 * counts what loads after hydration; this one needs no server and no database.
 */
import fs from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { fileURLToPath } from 'node:url';
import { TraceMap, eachMapping } from '@jridgewell/trace-mapping';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const out = path.join(root, '.svelte-kit/output');
const client = path.join(out, 'client');
const manifestFile = path.join(client, '.vite/manifest.json');
const serverManifest = path.join(out, 'server/manifest-full.js');
const showChunks = process.argv.includes('--chunks') || process.argv.includes('--sources');
const showSources = process.argv.includes('--sources');

if (!fs.existsSync(manifestFile) || !fs.existsSync(serverManifest)) {
	console.error('No build: run `npx vite build` first.');
	process.exit(1);
}

const STAFF = 150;
const INSTALLER = 100;
const calculatorView = 'src/lib/components/calculators/CalculatorView.svelte';
/** @type {{ route: string; label?: string; target: number; also?: string[] }[]} */
const pages = [
	{ route: '/app', target: STAFF },
	{ route: '/app/jobs', target: STAFF },
	{ route: '/app/jobs/[id]', target: STAFF },
	{ route: '/app/jobs/[id]/measure', target: STAFF },
	{ route: '/app/jobs/[id]/quote', target: STAFF },
	{ route: '/app/jobs/[id]/payments', target: STAFF },
	{ route: '/app/customers', target: STAFF },
	{ route: '/app/schedule', target: STAFF },
	{ route: '/app/calculators', target: STAFF },
	{
		route: '/app/calculators',
		label: '/app/calculators?c=joists',
		target: STAFF,
		also: [calculatorView]
	},
	{ route: '/field', target: INSTALLER },
	{ route: '/field/calculators', target: INSTALLER },
	{
		route: '/field/calculators',
		label: '/field/calculators?c=joists',
		target: INSTALLER,
		also: [calculatorView]
	},
	{ route: '/field/jobs/[id]', target: INSTALLER },
	{ route: '/field/profile', target: INSTALLER },
	{ route: '/field/statements', target: INSTALLER }
];

/** @type {Record<string, { file: string; name?: string; src?: string; imports?: string[]; isEntry?: boolean }>} */
const manifest = JSON.parse(fs.readFileSync(manifestFile, 'utf8'));

// The route table: `id: "/app/jobs/[id]"` … `page: { layouts: [0,3,], errors: [...], leaf: 17 }`.
const routes = new Map();
const serverText = fs.readFileSync(serverManifest, 'utf8');
for (const m of serverText.matchAll(
	/id: "([^"]+)",[\s\S]*?page: (?:\{ layouts: \[([^\]]*)\], errors: \[[^\]]*\], leaf: (\d+) \}|null)/g
)) {
	if (m[3] === undefined) continue;
	const layouts = m[2]
		.split(',')
		.filter((n) => n.trim() !== '')
		.map(Number);
	routes.set(m[1], [...layouts, Number(m[3])]);
}

const entries = Object.keys(manifest).filter(
	(k) => manifest[k].isEntry && /(client-optimized\/app\.js|runtime\/client\/entry\.js)$/.test(k)
);
if (entries.length !== 2) throw new Error(`expected the start and app entries, found ${entries}`);

/** The manifest keys a set of keys loads at once (static imports, followed). */
function closure(keys) {
	const seen = new Set();
	const stack = [...keys];
	while (stack.length) {
		const k = stack.pop();
		if (seen.has(k)) continue;
		if (!manifest[k]) throw new Error(`not in the manifest: ${k}`);
		seen.add(k);
		stack.push(...(manifest[k].imports ?? []));
	}
	return seen;
}

const gzCache = new Map();
function gz(file) {
	if (!gzCache.has(file)) {
		gzCache.set(file, gzipSync(fs.readFileSync(path.join(client, file)), { level: 9 }).length);
	}
	return gzCache.get(file);
}

/** What a chunk holds: its bytes attributed to packages and source folders through its map. */
const sourcesCache = new Map();
function sources(file) {
	if (sourcesCache.has(file)) return sourcesCache.get(file);
	const mapFile = path.join(client, file + '.map');
	let result = null;
	if (fs.existsSync(mapFile)) {
		const code = fs.readFileSync(path.join(client, file), 'utf8').split('\n');
		const map = new TraceMap(fs.readFileSync(mapFile, 'utf8'));
		const bytes = new Map();
		let last = null;
		const flush = (line, column) => {
			if (!last) return;
			const end = line === last.line ? column : code[last.line - 1].length;
			const owner = group(last.source);
			bytes.set(owner, (bytes.get(owner) ?? 0) + Math.max(0, end - last.column));
		};
		eachMapping(map, (m) => {
			flush(m.generatedLine, m.generatedColumn);
			last = { line: m.generatedLine, column: m.generatedColumn, source: m.source ?? '(none)' };
		});
		if (last) flush(last.line + 1, 0);
		result = [...bytes].sort((a, b) => b[1] - a[1]);
	}
	sourcesCache.set(file, result);
	return result;
}

/** A package (`zod`, `@tanstack/table-core`) or a source folder (`src/lib/estimating`). */
function group(source) {
	const nm = source.lastIndexOf('node_modules/');
	if (nm >= 0) {
		const rest = source.slice(nm + 'node_modules/'.length).split('/');
		const pkg = rest[0].startsWith('@') ? `${rest[0]}/${rest[1]}` : rest[0];
		if (pkg === 'zod') return `zod/${rest.slice(1, 4).join('/')}`.replace(/\/[^/]*\.js$/, '');
		return pkg;
	}
	const src = source.indexOf('src/');
	if (src >= 0) return path.dirname(source.slice(src));
	return source.replace(/^(\.\.\/)+/, '');
}

const kb = (n) => (n / 1024).toFixed(1);
let over = 0;
console.log('first load, gzip -9 JavaScript per page (from the build manifest)\n');
console.log(`${'page'.padEnd(36)} ${'KB'.padStart(6)} ${'target'.padStart(7)}  chunks`);
for (const p of pages) {
	const nodes = routes.get(p.route);
	if (!nodes) throw new Error(`no such page route: ${p.route}`);
	const keys = [
		...entries,
		...nodes.map((n) => `.svelte-kit/generated/client-optimized/nodes/${n}.js`),
		...(p.also ?? [])
	];
	const files = [...closure(keys)].map((k) => manifest[k].file);
	const total = files.reduce((sum, f) => sum + gz(f), 0);
	const fails = total / 1024 > p.target;
	if (fails) over++;
	console.log(
		`${(p.label ?? p.route).padEnd(36)} ${kb(total).padStart(6)} ${String(p.target).padStart(7)}  ${String(files.length).padStart(3)}${fails ? '  OVER' : ''}`
	);
	if (!showChunks) continue;
	for (const f of files.sort((a, b) => gz(b) - gz(a))) {
		const key = Object.keys(manifest).find((k) => manifest[k].file === f);
		console.log(`    ${kb(gz(f)).padStart(6)}  ${f.replace('_app/immutable/', '')}  ${key ?? ''}`);
		const s = showSources ? sources(f) : null;
		if (!s) continue;
		const all = s.reduce((sum, [, n]) => sum + n, 0);
		for (const [owner, n] of s.slice(0, 8)) {
			if (n / all < 0.03) break;
			console.log(`             ${((n / all) * 100).toFixed(0).padStart(3)}%  ${owner}`);
		}
	}
}
console.log(over ? `\n${over} page(s) over target` : '\nevery page within its target');
process.exitCode = over ? 1 : 0;
