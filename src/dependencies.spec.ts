// Every dependency in package.json is used: imported by the code, tests, scripts or configs, or
// run by a script. A package nothing uses is removed (issue 8, "Tidy"), not kept for later.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '..');
const pkg = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8'));

/** Used without being named in a file: the compiler behind svelte-check and the type checker. */
const IMPLICIT: Record<string, string> = {
	typescript: 'svelte-check and typescript-eslint compile with it',
	'@types/node': 'types of node: imports'
};

const SCANNED = /\.(ts|js|svelte|css|json|cjs|mjs)$|^\.prettierrc$|^run$/;

function files(dir: string, out: string[] = []): string[] {
	for (const name of readdirSync(dir)) {
		if (['node_modules', 'build', '.svelte-kit', '.data', '.git', 'drizzle'].includes(name))
			continue;
		if (name === 'package-lock.json' || name === 'package.json') continue;
		const full = path.join(dir, name);
		if (statSync(full).isDirectory()) files(full, out);
		else if (SCANNED.test(name)) out.push(full);
	}
	return out;
}

describe('dependencies', () => {
	it('are each used somewhere', () => {
		const text =
			files(root)
				.map((f) => readFileSync(f, 'utf8'))
				.join('\n') + Object.values(pkg.scripts as Record<string, string>).join('\n');
		const names = Object.keys({ ...pkg.dependencies, ...pkg.devDependencies });
		const used = (name: string): boolean => {
			if (IMPLICIT[name]) return true;
			if (name.startsWith('@types/')) return used(name.slice('@types/'.length));
			const quoted = new RegExp(
				`['"\`]${name.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}(/[^'"\`]*)?['"\`]`
			);
			const run = new RegExp(`(npx|\\[)\\s*['"]?${name}\\b|^\\s*${name} `, 'm');
			return quoted.test(text) || run.test(text);
		};
		expect(names.filter((n) => !used(n))).toEqual([]);
		expect(names.length).toBeGreaterThan(10);
	});
});
