/**
 * JSON from outside (API bodies, a draft sent back by a form). `JSON.parse` itself keeps a
 * `__proto__` key as an ordinary own property, but any later merge, `Object.assign` or nested
 * write would follow it to the prototype; so a document with a `__proto__`, `prototype` or
 * `constructor` key at any depth is refused here, as is one nested deeper than any of ours.
 * Browser-safe.
 */
import { isSafeKey } from './fields';

export type JsonRead =
	| { ok: true; value: unknown }
	| {
			ok: false;
			message: string;
			/** Dotted path of the key refused, when there is one. */ path?: string;
	  };

/** How deep our own documents go (a measure draft is about 7 levels); anything deeper is refused. */
export const MAX_JSON_DEPTH = 32;

/** Parses JSON text and checks every key and the depth, without recursion. */
export function readJsonText(text: string, maxDepth = MAX_JSON_DEPTH): JsonRead {
	let value: unknown;
	try {
		value = JSON.parse(text);
	} catch {
		return { ok: false, message: 'The body is not valid JSON' };
	}
	const stack: { node: unknown; path: string[] }[] = [{ node: value, path: [] }];
	while (stack.length) {
		const { node, path } = stack.pop()!;
		if (node === null || typeof node !== 'object') continue;
		if (path.length >= maxDepth)
			return { ok: false, message: `The body is nested more than ${maxDepth} levels deep` };
		if (Array.isArray(node)) {
			node.forEach((item, i) => stack.push({ node: item, path: [...path, String(i)] }));
			continue;
		}
		for (const [key, item] of Object.entries(node)) {
			const at = [...path, key];
			if (!isSafeKey(key))
				return { ok: false, message: `The key "${key}" is not allowed`, path: at.join('.') };
			stack.push({ node: item, path: at });
		}
	}
	return { ok: true, value };
}
