// The hostile corpus: what an attacker sends a form action, a JSON route or a page. Each
// variant is built from a realistic request (the page's own form, the OpenAPI example) so it
// reaches past the first check.

export interface Variant {
	/** What the variant tries, for the failure messages and the counts. */
	name: string;
	/**
	 * Sent as every role and as nobody; the rest of the corpus goes as the owner, who reaches the
	 * deepest code (the other roles are refused at the guard, after the same edge checks).
	 */
	everyone?: boolean;
	contentType?: string;
	body?: string | Uint8Array;
	/** Route parameters replaced (the other store's rows, odd ids). */
	params?: 'other' | string;
	/** A query string appended. */
	query?: string;
}

export const MANY = 100_000;
export const FIVE_MB = 5 * 1024 * 1024;

/** Values every field gets in turn. */
export const HOSTILE_VALUES: [string, string][] = [
	['a word where a number goes', 'abc'],
	['NaN', 'NaN'],
	['Infinity', 'Infinity'],
	['1e308', '1e308'],
	['a negative', '-1'],
	['NUL', 'a\u0000b'],
	['control characters', 'a\u0007\u001b[2Jb'],
	['SQL', "' OR '1'='1'; DROP TABLE job; --"],
	['script', '"><script>alert(1)</script>'],
	['__proto__ as a value', '__proto__'],
	['a long string', 'x'.repeat(20_000)]
];

/** Route parameters that are not ids of ours. */
export const HOSTILE_PARAMS: [string, string][] = [
	['__proto__ as an id', '__proto__'],
	['SQL as an id', "1' OR '1'='1"],
	['NUL in an id', '%00'],
	['a long id', 'a'.repeat(3000)]
];

/** Query strings for lists and pages. */
export const HOSTILE_QUERIES: [string, string][] = [
	['huge numbers in the query', 'page=1e308&pageSize=1e308&status=draft'],
	['negative and NaN paging', 'page=-1&pageSize=NaN&sort=__proto__&dir=constructor'],
	['SQL and script in the query', `q=${encodeURIComponent("%' OR 1=1 --<script>")}&sort=name`],
	['NUL in the query', 'q=%00&redirectTo=%00'],
	['__proto__ keys in the query', '__proto__[polluted]=yes&constructor[prototype][polluted]=yes'],
	['redirect elsewhere', 'redirectTo=%2F%09%2Fevil.example&room=__proto__'],
	['repeated keys', Array.from({ length: 2000 }, () => 'q=a').join('&')]
];

const PROTO_FIELDS: [string, string][] = [
	['__proto__.polluted', 'yes'],
	['constructor.prototype.polluted', 'yes'],
	['__proto__[polluted]', 'yes'],
	['prototype.polluted', 'yes'],
	['rooms.0.__proto__.polluted', 'yes'],
	['taxes.0.constructor.prototype.polluted', 'yes'],
	['toString.polluted', 'yes']
];

const PROTO_JSON =
	'{"__proto__":{"polluted":"yes"},"constructor":{"prototype":{"polluted":"yes"}},"rooms":[{"__proto__":{"polluted":"yes"}}]}';

const form = (fields: [string, string][]) => new URLSearchParams(fields).toString();
const FORM = 'application/x-www-form-urlencoded';
const JSON_TYPE = 'application/json';

function isJsonText(value: string) {
	if (!/^[[{]/.test(value)) return false;
	try {
		JSON.parse(value);
		return true;
	} catch {
		return false;
	}
}

/** A form's fields, every one swapped in turn by the corpus. */
export function formVariants(
	base: [string, string][],
	swapIds: (fields: [string, string][]) => [string, string][],
	hasParams: boolean
): Variant[] {
	const out: Variant[] = [
		{ name: 'the form as drawn', contentType: FORM, body: form(base), everyone: true },
		{ name: 'no fields', contentType: FORM, body: '' },
		{
			name: 'unknown fields',
			contentType: FORM,
			body: form([...base, ['zzUnknown', '1'], ['deep.unknown.0.field', '1']])
		}
	];
	for (const [name, value] of HOSTILE_VALUES)
		out.push({
			name: `every field ${name}`,
			contentType: FORM,
			body: form(base.map(([k]) => [k, value]))
		});
	out.push({
		name: '__proto__ and constructor field names',
		everyone: true,
		contentType: FORM,
		body: form([
			...base,
			...PROTO_FIELDS,
			...base.map(([k, v]): [string, string] => [`__proto__.${k}`, v])
		])
	});
	const jsonFields = base.filter(([, v]) => isJsonText(v));
	if (jsonFields.length) {
		const swap = (value: string): [string, string][] =>
			base.map(([k, v]) => [k, isJsonText(v) ? value : v]);
		out.push(
			{ name: 'JSON fields with __proto__ keys', contentType: FORM, body: form(swap(PROTO_JSON)) },
			{ name: 'JSON fields malformed', contentType: FORM, body: form(swap('{"rooms":[')) },
			{
				name: 'JSON fields of the wrong type',
				contentType: FORM,
				body: form(swap('[1,"x",null]'))
			},
			{
				name: 'JSON fields with 100,000 items',
				contentType: FORM,
				body: form(swap(`{"rooms":[${Array(MANY).fill('{}').join(',')}]}`))
			}
		);
	}
	const indexed = base.find(([k]) => /\.\d+(\.|$)/.test(k));
	const many: [string, string][] = indexed
		? Array.from({ length: MANY }, (_, i) => [indexed[0].replace(/\.\d+(\.|$)/, `.${i}$1`), '1'])
		: Array.from({ length: MANY }, (_, i) => [`items.${i}.qty`, '1']);
	out.push(
		{
			name: 'a list of 100,000 items',
			contentType: FORM,
			body: form([...base, ...many])
		},
		{
			name: 'one field 100,000 times',
			contentType: FORM,
			body: form([
				...base,
				...Array.from({ length: MANY }, (): [string, string] => [base[0]?.[0] ?? 'name', '1'])
			])
		},
		{
			name: 'a 5 MB body',
			contentType: FORM,
			body: form([...base, [base[0]?.[0] ?? 'name', 'a'.repeat(FIVE_MB)]])
		},
		{
			name: 'malformed form encoding',
			contentType: FORM,
			body: '%%%&&==%E0%A4%A&' + form(base)
		},
		{
			name: 'bytes that are not UTF-8',
			contentType: FORM,
			body: new Uint8Array([0x6e, 0x3d, 0xff, 0xfe, 0xc3])
		},
		{ name: 'multipart without a boundary', contentType: 'multipart/form-data', body: 'x' },
		{ name: 'JSON to a form action', contentType: JSON_TYPE, body: '{"name":' },
		{
			name: "another store's ids",
			everyone: true,
			contentType: FORM,
			body: form(swapIds(base)),
			params: 'other'
		}
	);
	if (hasParams)
		for (const [name, value] of HOSTILE_PARAMS)
			out.push({ name, contentType: FORM, body: form(base), params: value });
	return out;
}

type Json = unknown;

/** A copy of a JSON value with every leaf that `pick` accepts replaced. */
function mapLeaves(value: Json, pick: (v: Json) => boolean, to: (v: Json) => Json): Json {
	if (Array.isArray(value)) return value.map((v) => mapLeaves(v, pick, to));
	if (value && typeof value === 'object')
		return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, mapLeaves(v, pick, to)]));
	return pick(value) ? to(value) : value;
}

/**
 * A copy with each outermost list made 100,000 items long (inner lists left as they are). An
 * item too large to repeat 100,000 times in a test body becomes a 0.
 */
function longLists(value: Json): Json {
	if (Array.isArray(value)) {
		const first = value[0] ?? 0;
		return Array(MANY).fill(JSON.stringify(first).length > 64 ? 0 : first);
	}
	if (value && typeof value === 'object')
		return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, longLists(v)]));
	return value;
}

function mapObjects(value: Json, to: (o: Record<string, Json>) => Record<string, Json>): Json {
	if (Array.isArray(value)) return value.map((v) => mapObjects(v, to));
	if (value && typeof value === 'object')
		return to(Object.fromEntries(Object.entries(value).map(([k, v]) => [k, mapObjects(v, to)])));
	return value;
}

const isNumber = (v: Json) => typeof v === 'number';
const isString = (v: Json) => typeof v === 'string';

/** Wrong types for each top-level member. */
function wrongTypes(value: Json): Json {
	if (!value || typeof value !== 'object' || Array.isArray(value)) return { value };
	return Object.fromEntries(
		Object.entries(value).map(([k, v]) => [
			k,
			typeof v === 'string' ? 123 : typeof v === 'number' ? 'abc' : Array.isArray(v) ? {} : 'x'
		])
	);
}

/** A JSON body, every part of it swapped in turn by the corpus. */
export function jsonVariants(
	base: Json | undefined,
	swapIds: (body: Json) => Json,
	hasParams: boolean,
	method: string
): Variant[] {
	const send = (name: string, value: Json, extra: Partial<Variant> = {}): Variant => ({
		name,
		contentType: JSON_TYPE,
		body: JSON.stringify(value),
		...extra
	});
	const raw = (
		name: string,
		body: string,
		contentType = JSON_TYPE,
		extra: Partial<Variant> = {}
	) => ({
		name,
		contentType,
		body,
		...extra
	});
	const out: Variant[] = [];
	if (method === 'GET' || method === 'DELETE') {
		out.push(
			{ name: 'as documented', everyone: true },
			{ name: "another store's ids", params: 'other', everyone: true }
		);
		for (const [name, query] of HOSTILE_QUERIES) out.push({ name, query });
		out.push(raw('a body on a GET or DELETE', PROTO_JSON));
	} else {
		const body = base ?? {};
		const baseText = JSON.stringify(body);
		out.push(
			send('as documented', body, { everyone: true }),
			raw('malformed JSON', '{"name":'),
			raw('JSON with trailing garbage', `${baseText}garbage`),
			raw('not JSON at all', 'name=x&<script>'),
			raw('an empty body', ''),
			raw('the JSON literal 1e999', baseText.replace(/:(-?\d+(\.\d+)?)/g, ':1e999')),
			raw('JSON sent as text/plain', baseText, 'text/plain'),
			send('an array instead of an object', [body]),
			send('a string instead of an object', 'body'),
			send('null', null),
			send('wrong types for every member', wrongTypes(body)),
			send(
				'numbers as "NaN"',
				mapLeaves(body, isNumber, () => 'NaN')
			),
			send(
				'numbers as "Infinity"',
				mapLeaves(body, isNumber, () => 'Infinity')
			),
			send(
				'numbers at 1e308',
				mapLeaves(body, isNumber, () => 1e308)
			),
			send(
				'numbers negative',
				mapLeaves(body, isNumber, (v) => -Math.abs(Number(v)) - 1)
			),
			send(
				'numbers fractional',
				mapLeaves(body, isNumber, (v) => Number(v) + 0.5)
			),
			send(
				'strings with NUL',
				mapLeaves(body, isString, (v) => `${v}\u0000`)
			),
			send(
				'strings with control characters',
				mapLeaves(body, isString, (v) => `${v}\u0007\u001b`)
			),
			send(
				'strings as SQL',
				mapLeaves(body, isString, () => "' OR '1'='1'; --")
			),
			send(
				'strings as script',
				mapLeaves(body, isString, () => '<script>alert(1)</script>')
			),
			send(
				'strings as __proto__',
				mapLeaves(body, isString, () => '__proto__')
			),
			send(
				'unknown members everywhere',
				mapObjects(body, (o) => ({ ...o, zzUnknown: 1 }))
			),
			raw('__proto__ and constructor keys', PROTO_JSON, JSON_TYPE, { everyone: true }),
			raw(
				'__proto__ keys beside the members',
				baseText.replace(
					/^\{/,
					'{"__proto__":{"polluted":"yes"},"constructor":{"prototype":{"polluted":"yes"}},'
				)
			),
			send(
				'__proto__ as member names everywhere',
				mapObjects(body, (o) => ({ ...o, prototype: { polluted: 'yes' } }))
			),
			send('every list 100,000 items long', longLists(body), {}),
			send('a 5 MB body', { ...(body as object), padding: 'a'.repeat(FIVE_MB) }),
			send("another store's ids", swapIds(body), { params: 'other', everyone: true })
		);
	}
	if (hasParams)
		for (const [name, value] of HOSTILE_PARAMS)
			out.push({
				name,
				params: value,
				...(method === 'GET' || method === 'DELETE'
					? {}
					: { contentType: JSON_TYPE, body: JSON.stringify(base ?? {}) })
			});
	return out;
}

/** Page loads: the page's data as a browser asks for it, with odd queries and ids. */
export function loadVariants(hasParams: boolean): Variant[] {
	const out: Variant[] = [
		{ name: 'as linked', everyone: true },
		{ name: "another store's ids", params: 'other', everyone: true }
	];
	for (const [name, query] of HOSTILE_QUERIES) out.push({ name, query });
	if (hasParams) for (const [name, value] of HOSTILE_PARAMS) out.push({ name, params: value });
	return out;
}
