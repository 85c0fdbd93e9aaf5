/**
 * Form fields named by their path (`taxes.0.rate`, `waste.straight`), read into nested objects
 * and arrays, and the one guard every key chosen by a user passes before it is written into or
 * looked up in an object.
 *
 * A path segment `__proto__`, `prototype` or `constructor` is refused: written through, it
 * would change `Object.prototype` for the whole process (prototype pollution). Beyond that,
 * nodes are only ever followed through their own properties, an array only takes indices (so
 * `taxes.length` cannot stretch one), indices and depth are bounded, and a name that is both a
 * value and a group (`a=1` and `a.b=2`) is refused instead of crashing. Browser-safe.
 */
import type { Read } from './number';

/** Keys that reach an object's prototype when written or read through. */
export const FORBIDDEN_KEYS: ReadonlySet<string> = new Set([
	'__proto__',
	'prototype',
	'constructor'
]);

/** Whether a key chosen by a user may be used as an object key at all. */
export function isSafeKey(key: string): boolean {
	return !FORBIDDEN_KEYS.has(key);
}

/** The value of an own property of `table` (never an inherited one such as `constructor`). */
export function own<T>(table: Readonly<Record<string, T>>, key: string): T | undefined {
	return Object.hasOwn(table, key) ? table[key] : undefined;
}

export interface PathLimits {
	/** The most segments a name may have (default 8). */
	maxDepth?: number;
	/** The largest list index a name may use (default 999). */
	maxIndex?: number;
}

const INDEX = /^(0|[1-9]\d*)$/;

export const isIndex = (segment: string) => INDEX.test(segment);

/** A refusal that names the field it came from. */
export type FieldsRead<T> = { ok: true; value: T } | { ok: false; field: string; message: string };

/** The segments of a dotted field name, or why it cannot be used. */
export function fieldPath(name: string, limits: PathLimits = {}): Read<string[]> {
	const { maxDepth = 8, maxIndex = 999 } = limits;
	const segments = name.split('.');
	if (segments.length > maxDepth)
		return { ok: false, message: `The field name "${clip(name)}" is nested too deeply` };
	for (const segment of segments) {
		if (segment === '')
			return { ok: false, message: `The field name "${clip(name)}" is not valid` };
		if (!isSafeKey(segment))
			return { ok: false, message: `The field name "${clip(name)}" is not allowed` };
		if (/^\d+$/.test(segment) && (!isIndex(segment) || Number(segment) > maxIndex))
			return {
				ok: false,
				message: `The field name "${clip(name)}" has a list index over ${maxIndex}`
			};
	}
	return { ok: true, value: segments };
}

function clip(name: string) {
	return name.length > 60 ? `${name.slice(0, 57)}...` : name;
}

type Node = Record<string, unknown> | unknown[];

/**
 * Writes `value` at `segments` below `root`, making objects and arrays on the way (an array
 * where the next segment is an index). Refuses a path that runs through a value, or an object
 * used as a list or a list as an object.
 */
function writePath(root: Node, segments: string[], value: unknown): string | undefined {
	let node: Node = root;
	for (let i = 0; i < segments.length; i++) {
		const key = segments[i];
		if (!isSafeKey(key)) return 'is not allowed';
		if (Array.isArray(node) !== isIndex(key)) return 'mixes a list and named fields';
		const holder = node as Record<string, unknown>;
		const last = i === segments.length - 1;
		const existing = Object.hasOwn(holder, key) ? holder[key] : undefined;
		if (last) {
			if (existing !== undefined && typeof existing === 'object' && existing !== null)
				return 'is also a group of fields';
			holder[key] = value;
			return undefined;
		}
		if (existing === undefined) {
			const made: Node = isIndex(segments[i + 1]) ? [] : {};
			holder[key] = made;
			node = made;
		} else if (typeof existing === 'object' && existing !== null) {
			node = existing as Node;
		} else return 'is also a single field';
	}
	return undefined;
}

/**
 * Sets a value at a dotted path in an object the caller owns (the calculators' input), with the
 * same guards as `readFields`. Throws on a path that cannot be written: such a path comes from
 * our own code, never straight from a user.
 */
export function setPath(target: Record<string, unknown>, path: string, value: unknown): void {
	const segments = fieldPath(path);
	if (!segments.ok) throw new Error(segments.message);
	const problem = writePath(target, segments.value, value);
	if (problem) throw new Error(`The path "${path}" ${problem}`);
}

/**
 * Reads form fields named by path into nested objects and arrays (`taxes.0.rate` →
 * `{ taxes: [{ rate }] }`). Files are left out. The last of a repeated name wins. A name that
 * cannot be used (a forbidden segment, too deep, an index over the limit, a clash with another
 * field) refuses the whole form, naming it.
 */
export function readFields(
	entries: Iterable<[string, FormDataEntryValue | string]>,
	limits: PathLimits = {}
): FieldsRead<Record<string, unknown>> {
	const root: Record<string, unknown> = {};
	for (const [name, value] of entries) {
		if (typeof value !== 'string') continue;
		const path = fieldPath(name, limits);
		if (!path.ok) return { ok: false, field: name, message: path.message };
		const problem = writePath(root, path.value, value);
		if (problem)
			return { ok: false, field: name, message: `The field name "${clip(name)}" ${problem}` };
	}
	return { ok: true, value: root };
}

/**
 * A form's text fields by name, flat (`rooms.0.width` stays one key), for forms read by a flat
 * schema or kept as typed. The last of a repeated name wins; a name no form of ours has (one
 * `fieldPath` refuses, such as `__proto__`) is left out.
 */
export function formFields(
	entries: Iterable<[string, FormDataEntryValue | string]>
): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [name, value] of entries) {
		if (typeof value === 'string' && fieldPath(name, { maxDepth: 16 }).ok) values[name] = value;
	}
	return values;
}
