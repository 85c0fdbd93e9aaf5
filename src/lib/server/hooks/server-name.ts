import type { Handle } from '@sveltejs/kit';

/** A name fit for a header: letters, digits, dots, dashes and underscores, at most 64. */
const NAME = /^[A-Za-z0-9._-]{1,64}$/;

/**
 * Names the server that answered (`X-Served-By`) when `FLUSHLINE_SERVER_NAME` is set, so that
 * behind a load balancer a person (or the several-servers test) can tell the app servers apart.
 * Unset, or not shaped like a name, nothing is added.
 */
export function handleServerName(name: string | undefined): Handle {
	const header = name && NAME.test(name) ? name : null;
	return async ({ event, resolve }) => {
		const response = await resolve(event);
		if (!header) return response;
		try {
			response.headers.set('x-served-by', header);
			return response;
		} catch {
			// immutable headers (a fetched answer passed through): copy them
			const copy = new Response(response.body, response);
			copy.headers.set('x-served-by', header);
			return copy;
		}
	};
}
