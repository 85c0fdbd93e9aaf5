// The app's own guard for keys a caller chose (relative: the fakes load without SvelteKit's aliases).
import { isSafeKey } from '../../src/lib/input/fields';
import { invalid } from './errors';

/** A parsed Stripe form body or query: nested objects, arrays and string leaves. */
export type Params = { [key: string]: Param };
export type Param = string | Params | Param[];

/** The deepest a parameter name goes (`line_items[0][price_data][product_data][metadata][k]`). */
const MAX_PARAM_DEPTH = 8;

/**
 * Parses `a[b][0][c]=v` pairs (the SDK's form encoding, and its query strings) into nested
 * objects; keys made only of digits become arrays. A name that would write through a prototype
 * (`metadata[__proto__][x]`, `constructor[prototype][x]`) or nests deeper than any of Stripe's
 * parameters is refused as Stripe refuses a bad parameter name; nodes are followed through their
 * own properties only.
 */
export function parseParams(search: URLSearchParams): Params {
	const root: Params = {};
	for (const [rawKey, value] of search) {
		const match = /^([^[\]]+)((?:\[[^[\]]*\])*)$/.exec(rawKey);
		if (!match) throw invalid(`Invalid parameter name: ${rawKey}`, rawKey);
		const path = [match[1], ...[...match[2].matchAll(/\[([^[\]]*)\]/g)].map((m) => m[1])];
		if (path.length > MAX_PARAM_DEPTH || !path.every(isSafeKey))
			throw invalid(`Invalid parameter name: ${rawKey}`, rawKey);
		let node: Params = root;
		for (let i = 0; i < path.length - 1; i++) {
			const key = path[i] === '' ? String(Object.keys(node).length) : path[i];
			const existing = Object.hasOwn(node, key) ? node[key] : undefined;
			if (existing === undefined || typeof existing === 'string') node[key] = {};
			node = node[key] as Params;
		}
		const last = path[path.length - 1];
		node[last === '' ? String(Object.keys(node).length) : last] = value;
	}
	return arrays(root) as Params;
}

/** Objects whose keys are all indices (0, 1, 2…) become arrays, in index order. */
function arrays(node: Param): Param {
	if (typeof node === 'string' || Array.isArray(node)) return node;
	const keys = Object.keys(node);
	for (const k of keys) node[k] = arrays(node[k]);
	if (keys.length && keys.every((k) => /^\d+$/.test(k))) {
		return keys
			.map(Number)
			.sort((a, b) => a - b)
			.map((i) => node[String(i)]);
	}
	return node;
}

/** Params with sorted keys, as one string: what the idempotency layer compares. */
export function canonical(params: Param): string {
	if (typeof params === 'string') return JSON.stringify(params);
	if (Array.isArray(params)) return `[${params.map(canonical).join(',')}]`;
	const keys = Object.keys(params).sort();
	return `{${keys.map((k) => `${JSON.stringify(k)}:${canonical(params[k])}`).join(',')}}`;
}

/** Reads typed values from one level of params, naming each parameter's full path in refusals. */
export class Reader {
	constructor(
		readonly params: Params,
		readonly prefix = ''
	) {}

	name(key: string) {
		return this.prefix ? `${this.prefix}[${key}]` : key;
	}

	/** Refuses parameters the endpoint does not take, as Stripe does. */
	only(...allowed: string[]) {
		for (const key of Object.keys(this.params)) {
			if (!allowed.includes(key)) {
				throw invalid(
					`Received unknown parameter: ${this.name(key)}`,
					this.name(key),
					'parameter_unknown'
				);
			}
		}
		return this;
	}

	has(key: string) {
		return this.value(key) !== undefined;
	}

	/** A parameter's value: own properties only, so `constructor` is never an inherited one. */
	private value(key: string): Param | undefined {
		return Object.hasOwn(this.params, key) ? this.params[key] : undefined;
	}

	string(key: string, options: { required?: boolean; max?: number } = {}): string | undefined {
		const value = this.value(key);
		if (value === undefined || value === '') {
			if (options.required) throw this.missing(key);
			return undefined;
		}
		if (typeof value !== 'string')
			throw invalid(`Invalid string: ${JSON.stringify(value)}`, this.name(key));
		if (options.max && value.length > options.max) {
			throw invalid(
				`Invalid ${this.name(key)}: must be at most ${options.max} characters`,
				this.name(key),
				'parameter_invalid_string'
			);
		}
		return value;
	}

	required(key: string, max?: number): string {
		return this.string(key, { required: true, max })!;
	}

	oneOf<T extends string>(key: string, values: readonly T[]): T | undefined {
		const value = this.string(key);
		if (value === undefined) return undefined;
		if (!values.includes(value as T)) {
			throw invalid(
				`Invalid ${this.name(key)}: must be one of ${values.join(', ')}`,
				this.name(key)
			);
		}
		return value as T;
	}

	/** An integer parameter; Stripe refuses `12.5` and `12abc` alike. */
	integer(key: string, options: { required?: boolean; min?: number } = {}): number | undefined {
		const value = this.string(key, { required: options.required });
		if (value === undefined) return undefined;
		if (!/^-?\d+$/.test(value) || !Number.isSafeInteger(Number(value))) {
			throw invalid(`Invalid integer: ${value}`, this.name(key), 'parameter_invalid_integer');
		}
		const n = Number(value);
		if (options.min !== undefined && n < options.min) {
			throw invalid(
				`This value must be greater than or equal to ${options.min}.`,
				this.name(key),
				'parameter_invalid_integer'
			);
		}
		return n;
	}

	boolean(key: string): boolean | undefined {
		const value = this.string(key);
		if (value === undefined) return undefined;
		if (value !== 'true' && value !== 'false') {
			throw invalid(`Invalid boolean: ${value}`, this.name(key));
		}
		return value === 'true';
	}

	object(key: string, options: { required?: boolean } = {}): Reader | undefined {
		const value = this.value(key);
		if (value === undefined || value === '') {
			if (options.required) throw this.missing(key);
			return undefined;
		}
		if (typeof value === 'string' || Array.isArray(value)) {
			throw invalid(`Invalid object`, this.name(key));
		}
		return new Reader(value, this.name(key));
	}

	array(key: string, options: { required?: boolean } = {}): Reader[] {
		const value = this.value(key);
		if (value === undefined || value === '') {
			if (options.required) throw this.missing(key);
			return [];
		}
		if (!Array.isArray(value)) throw invalid(`Invalid array`, this.name(key));
		return value.map((item, i) => {
			if (typeof item === 'string' || Array.isArray(item)) {
				throw invalid(`Invalid object`, `${this.name(key)}[${i}]`);
			}
			return new Reader(item, `${this.name(key)}[${i}]`);
		});
	}

	strings(key: string): string[] {
		const value = this.value(key);
		if (value === undefined || value === '') return [];
		const list = Array.isArray(value) ? value : [value];
		return list.map((v, i) => {
			if (typeof v !== 'string') throw invalid('Invalid string', `${this.name(key)}[${i}]`);
			return v;
		});
	}

	/**
	 * Metadata as Stripe limits it: up to 50 keys, keys up to 40 characters, values up to 500.
	 * An empty value removes a key when updating.
	 */
	metadata(key = 'metadata', base: Record<string, string> = {}): Record<string, string> {
		const value = this.value(key);
		if (value === undefined) return { ...base };
		if (value === '') return {};
		if (typeof value === 'string' || Array.isArray(value))
			throw invalid('Invalid hash', this.name(key));
		const out = { ...base };
		for (const [k, v] of Object.entries(value)) {
			if (typeof v !== 'string') throw invalid('Invalid hash', `${this.name(key)}[${k}]`);
			if (k.length > 40) {
				throw invalid(
					`Metadata keys can have up to 40 characters; '${k}' has ${k.length}.`,
					`${this.name(key)}[${k}]`
				);
			}
			if (v.length > 500) {
				throw invalid(
					`Metadata values can have up to 500 characters, but you passed in a value that is ${v.length} characters.`,
					`${this.name(key)}[${k}]`
				);
			}
			if (v === '') delete out[k];
			else out[k] = v;
		}
		if (Object.keys(out).length > 50) {
			throw invalid('You can specify up to 50 keys in metadata.', this.name(key));
		}
		return out;
	}

	private missing(key: string) {
		return invalid(
			`Missing required param: ${this.name(key)}.`,
			this.name(key),
			'parameter_missing'
		);
	}
}
