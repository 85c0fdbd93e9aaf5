import type { Handle, RequestEvent } from '@sveltejs/kit';
import { refuseRequest } from './refuse';

/**
 * The edge check on what arrives, before any route, form action or better-auth sees it: no
 * control characters (PostgreSQL refuses NUL in text and `\u0000` in jsonb, and other controls
 * are never typed by a person), a body that says it is JSON is JSON, and route ids have our ids'
 * shape. Tab, CR and LF are kept in form and JSON values (text areas send CR LF; notes and
 * addresses have line breaks); they are refused in field names, in the address and its query.
 */

// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
// eslint-disable-next-line no-control-regex
const CONTROL_BUT_BREAKS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

/** Limits on what one request may carry, far above any form or body of ours. */
export const INPUT_LIMITS = {
	queryParams: 100,
	formFields: 5000,
	jsonNodes: 200_000,
	jsonDepth: 64
};

const RESERVED = new Set(['__proto__', 'prototype', 'constructor']);
/** Our ids (UUIDs, better-auth's ids, Stripe's `cs_…`), version numbers and signed link tokens. */
const PARAM_SHAPE = /^[A-Za-z0-9_.-]{1,512}$/;

export type Problem = { path: string; message: string };

const named = (where: string) =>
	`${where} contains a control character (such as NUL); remove it and try again`;

/** Whether a text has a control character; `breaks` allows tab, CR and LF. */
export function hasControl(text: string, breaks = false): boolean {
	return (breaks ? CONTROL_BUT_BREAKS : CONTROL).test(text);
}

/** The first problem in the address: its path segments and query parameters. */
export function problemInUrl(url: URL): Problem | null {
	for (const segment of url.pathname.split('/')) {
		let decoded: string;
		try {
			decoded = decodeURIComponent(segment);
		} catch {
			return { path: '(address)', message: 'The address has a broken %-escape' };
		}
		if (hasControl(decoded)) return { path: '(address)', message: named('The address') };
	}
	let count = 0;
	for (const [key, value] of url.searchParams) {
		count += 1;
		if (count > INPUT_LIMITS.queryParams) {
			return { path: '(query)', message: `Send at most ${INPUT_LIMITS.queryParams} parameters` };
		}
		if (hasControl(key) || hasControl(value)) {
			return { path: hasControl(key) ? '(query)' : key, message: named('This parameter') };
		}
	}
	return null;
}

/** The first problem in a form's fields (names, text values, file names). */
export function problemInForm(form: FormData): Problem | null {
	let count = 0;
	for (const [key, value] of form) {
		count += 1;
		if (count > INPUT_LIMITS.formFields) {
			return { path: '(form)', message: `Send at most ${INPUT_LIMITS.formFields} fields` };
		}
		if (hasControl(key)) return { path: '(form)', message: named('A field name') };
		if (typeof value === 'string') {
			if (hasControl(value, true)) return { path: key, message: named('This field') };
		} else if (hasControl(value.name)) {
			return { path: key, message: named('The file name') };
		}
	}
	return null;
}

/**
 * The first problem in a parsed JSON body: a control character in a key or a string value, or
 * a body too deep or too large to walk. Walked with an explicit stack, bounded by the limits.
 */
export function problemInJson(body: unknown): Problem | null {
	const stack: { value: unknown; path: string; depth: number }[] = [
		{ value: body, path: '', depth: 0 }
	];
	let nodes = 0;
	while (stack.length) {
		const { value, path, depth } = stack.pop()!;
		nodes += 1;
		if (nodes > INPUT_LIMITS.jsonNodes) {
			return { path: '(body)', message: 'The body has too many values' };
		}
		if (depth > INPUT_LIMITS.jsonDepth) {
			return { path: path || '(body)', message: 'The body is nested too deeply' };
		}
		if (typeof value === 'string') {
			if (hasControl(value, true)) return { path: path || '(body)', message: named('This value') };
		} else if (Array.isArray(value)) {
			value.forEach((item, i) =>
				stack.push({ value: item, path: join(path, i), depth: depth + 1 })
			);
		} else if (value && typeof value === 'object') {
			for (const [key, item] of Object.entries(value)) {
				if (hasControl(key)) return { path: path || '(body)', message: named('A field name') };
				stack.push({ value: item, path: join(path, key), depth: depth + 1 });
			}
		}
	}
	return null;
}

function join(path: string, key: string | number) {
	return path ? `${path}.${key}` : String(key);
}

/** Route parameters that are not shaped like our ids, or are the names of object internals. */
export function badParam(params: Partial<Record<string, string>>): boolean {
	return Object.values(params).some(
		(value) => value !== undefined && (RESERVED.has(value) || !PARAM_SHAPE.test(value))
	);
}

/** Bodies checked: those that carry fields. Stripe's signed webhook is read as it came. */
const UNCHECKED_BODIES = new Set(['/api/webhooks/stripe']);

async function problemInBody(event: RequestEvent): Promise<Problem | null> {
	const { request, url } = event;
	if (request.method === 'GET' || request.method === 'HEAD' || !request.body) return null;
	if (UNCHECKED_BODIES.has(url.pathname)) return null;
	const type = (request.headers.get('content-type') ?? '').toLowerCase();
	if (
		type.startsWith('application/x-www-form-urlencoded') ||
		type.startsWith('multipart/form-data')
	) {
		let form: FormData;
		try {
			form = await request.clone().formData();
		} catch {
			return { path: '(form)', message: 'The form could not be read; send it again' };
		}
		return problemInForm(form);
	}
	if (/^application\/([\w.-]+\+)?json/.test(type)) {
		const text = await request.clone().text();
		if (!text.trim()) return null;
		let body: unknown;
		try {
			body = JSON.parse(text);
		} catch {
			return { path: '(body)', message: 'The body is not valid JSON' };
		}
		return problemInJson(body);
	}
	return null;
}

/** Refuses control characters, unreadable bodies and ill-shaped ids before anything else runs. */
export const handleInput: Handle = async ({ event, resolve }) => {
	const problem = problemInUrl(event.url) ?? (await problemInBody(event));
	if (problem) return refuseRequest(event, 400, problem.message, { path: problem.path });
	if (badParam(event.params)) {
		return refuseRequest(event, 404, 'Not found');
	}
	return resolve(event);
};
