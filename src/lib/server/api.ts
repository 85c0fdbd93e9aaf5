import { isHttpError, json, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { readJsonText } from '$lib/input';

/** An API refusal carrying field issues, thrown by `readJson` and turned into 400 by `endpoint`. */
class BadRequest extends Error {
	constructor(
		message: string,
		readonly issues: { path: string; message: string }[] = [],
		readonly status = 400
	) {
		super(message);
	}
}

/**
 * Wraps a JSON endpoint so every refusal is JSON with a status code: guards' 401/403/404 from
 * `error()`, invalid bodies as 400 with the path of each bad field, and anything unexpected 500.
 */
export function endpoint<E extends RequestEvent>(handler: (event: E) => Promise<Response>) {
	return async (event: E): Promise<Response> => {
		try {
			return await handler(event);
		} catch (e) {
			if (e instanceof BadRequest) {
				return json({ message: e.message, issues: e.issues }, { status: e.status });
			}
			if (isHttpError(e)) return json(e.body, { status: e.status });
			throw e;
		}
	};
}

function issuesOf(error: z.ZodError) {
	return error.issues.map((i) => ({ path: i.path.join('.') || '(body)', message: i.message }));
}

/** The request's JSON body parsed with a schema, or a 400/415 naming what is wrong. */
export async function readJson<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<z.output<S>> {
	if (!request.headers.get('content-type')?.includes('application/json')) {
		throw new BadRequest('Send the body as JSON (Content-Type: application/json)', [], 415);
	}
	const text = await request.text().catch(() => undefined);
	if (text === undefined) throw new BadRequest('The body could not be read');
	// Keys that would reach a prototype (`__proto__`, `constructor`) are refused at any depth.
	const body = readJsonText(text);
	if (!body.ok) {
		const issues = body.path ? [{ path: body.path, message: body.message }] : [];
		throw new BadRequest(body.message, issues);
	}
	const result = schema.safeParse(body.value);
	if (!result.success) throw new BadRequest('Some fields are not valid', issuesOf(result.error));
	return result.data;
}

/** Query parameters parsed with a schema, or a 400 naming the bad ones. */
export function readQuery<S extends z.ZodType>(url: URL, schema: S): z.output<S> {
	const result = schema.safeParse(Object.fromEntries(url.searchParams));
	if (!result.success)
		throw new BadRequest('Some query parameters are not valid', issuesOf(result.error));
	return result.data;
}
