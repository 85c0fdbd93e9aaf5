import type { Handle } from '@sveltejs/kit';
import { CLIENT_ADDRESS_HEADER } from '../create-auth';

/**
 * The client's address as the deployment's proxy gave it (adapter-node's `ADDRESS_HEADER` and
 * `XFF_DEPTH`, through `event.getClientAddress()`), written over whatever the client sent in our
 * header, so better-auth and the sign-in limits never read a header the client chose.
 */
export const handleClientAddress: Handle = async ({ event, resolve }) => {
	let address = '';
	try {
		address = event.getClientAddress();
	} catch {
		// no address known (prerendering): limits then count per account only
	}
	if (address) event.request.headers.set(CLIENT_ADDRESS_HEADER, address);
	else event.request.headers.delete(CLIENT_ADDRESS_HEADER);
	return resolve(event);
};

/** better-auth's answers that carry a session token in their JSON body. */
const TOKEN_ANSWERS = new Set(['/api/auth/sign-in/email', '/api/auth/sign-up/email']);

/**
 * The session lives in an HttpOnly cookie: the sign-in and sign-up answers lose the `token` field
 * better-auth puts in their JSON, so no script on the page can read it.
 */
export const handleAuthAnswers: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (!TOKEN_ANSWERS.has(event.url.pathname)) return response;
	if (!response.headers.get('content-type')?.includes('application/json')) return response;
	const text = await response.text();
	const headers = new Headers(response.headers);
	headers.delete('content-length');
	let body: unknown = null;
	try {
		body = JSON.parse(text);
	} catch {
		// not ours to fix: passed on as it came
	}
	if (!body || typeof body !== 'object' || Array.isArray(body)) {
		return new Response(text, { status: response.status, headers });
	}
	const rest = { ...(body as Record<string, unknown>) };
	delete rest.token;
	return new Response(JSON.stringify(rest), { status: response.status, headers });
};
