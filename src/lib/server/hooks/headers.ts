import { isRedirect, type Handle } from '@sveltejs/kit';

/**
 * Headers every answer carries (the Content-Security-Policy of pages comes from `kit.csp` in
 * svelte.config.js, with a nonce per page). Camera stays allowed for our own pages: installers
 * photograph the subfloor. A route may set its own Referrer-Policy (the customer's page does).
 */
// Only features Chromium knows: an unknown one is logged as an error on every page.
export const PERMISSIONS_POLICY =
	'camera=(self), microphone=(), geolocation=(), payment=(), usb=(), serial=()';

/** HSTS for a year once the origin is https (never on plain http, where browsers ignore it). */
export const HSTS = 'max-age=31536000; includeSubDomains';

export function securityHeaders(headers: Headers, https: boolean) {
	headers.set('x-content-type-options', 'nosniff');
	headers.set('x-frame-options', 'DENY');
	headers.set('permissions-policy', PERMISSIONS_POLICY);
	if (!headers.has('referrer-policy')) headers.set('referrer-policy', 'same-origin');
	// Pages get theirs from kit.csp; files, JSON and redirects may not be framed either.
	if (!headers.has('content-security-policy')) {
		headers.set('content-security-policy', "frame-ancestors 'none'");
	}
	if (https) headers.set('strict-transport-security', HSTS);
}

/**
 * Puts the security headers on every answer, including a page redirect that a later hook throws
 * (SvelteKit would otherwise answer it outside this hook). Data requests and form actions get
 * their redirects and errors from SvelteKit, in the JSON its client reads.
 */
export function handleHeaders(origin: string): Handle {
	const https = origin.startsWith('https://');
	return async ({ event, resolve }) => {
		let response: Response;
		try {
			response = await resolve(event);
		} catch (e) {
			const plainPage = event.request.method === 'GET' && !event.isDataRequest;
			if (!isRedirect(e) || !plainPage) throw e;
			response = new Response(null, { status: e.status, headers: { location: e.location } });
		}
		try {
			securityHeaders(response.headers, https);
		} catch {
			// A response with immutable headers (a fetched one passed through): copy it.
			response = new Response(response.body, response);
			securityHeaders(response.headers, https);
		}
		return response;
	};
}
