// The engine's own shape: plain TypeScript with no framework, database, network or Node import
// (it runs in the browser too), and no import cycle, types included (issue 8 item 5).
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = dirname(fileURLToPath(import.meta.url));
const files = readdirSync(root, { recursive: true, encoding: 'utf8' })
	.filter((f) => f.endsWith('.ts') && !f.endsWith('.spec.ts'))
	.map((f) => join(root, f));
const IMPORT = /^\s*(?:import|export)\b[^'"]*?from\s+'([^']+)'/gm;

function importsOf(file: string): string[] {
	return [...readFileSync(file, 'utf8').matchAll(IMPORT)].map((m) => m[1]);
}

describe('the engine modules', () => {
	it('import nothing but each other and polygon-clipping', () => {
		for (const file of files)
			for (const spec of importsOf(file))
				expect(
					spec.startsWith('.') || spec === 'polygon-clipping',
					`${relative(root, file)} imports ${spec}`
				).toBe(true);
	});

	it('form no import cycle, and only the index imports the index', () => {
		const graph = new Map<string, string[]>();
		for (const file of files)
			graph.set(
				file,
				importsOf(file)
					.filter((s) => s.startsWith('.'))
					.map((s) => resolve(dirname(file), s.endsWith('.ts') ? s : `${s}.ts`))
			);
		const index = join(root, 'index.ts');
		for (const [file, deps] of graph)
			if (file !== index) expect(deps, relative(root, file)).not.toContain(index);
		const state = new Map<string, 'open' | 'done'>();
		const cycles: string[] = [];
		const visit = (file: string, path: string[]) => {
			if (state.get(file) === 'done') return;
			if (state.get(file) === 'open') {
				cycles.push(
					[...path.slice(path.indexOf(file)), file].map((f) => relative(root, f)).join(' → ')
				);
				return;
			}
			state.set(file, 'open');
			for (const dep of graph.get(file) ?? []) visit(dep, [...path, file]);
			state.set(file, 'done');
		};
		for (const file of files) visit(file, []);
		expect(cycles).toEqual([]);
		expect(graph.size).toBeGreaterThan(15);
	});
});
