import type { Handle } from '@sveltejs/kit';
import { isDatabaseUnavailable, UNAVAILABLE_MESSAGE } from '../db/unavailable';
import { log, safePath } from '../log';
import { refuseRequest } from './refuse';

/**
 * The database out of reach while the hooks read the session or the member (PostgreSQL
 * restarting): a 503 "try again" in the form the caller reads, with `Retry-After`, never a 500.
 * Routes' own transactions answer the same way (`$lib/server/db/tenant`).
 */
export const handleUnavailable: Handle = async ({ event, resolve }) => {
	try {
		return await resolve(event);
	} catch (e) {
		if (!isDatabaseUnavailable(e)) throw e;
		log.warn(
			{ err: e instanceof Error ? e.message : String(e), path: safePath(event.url) },
			'Database unavailable'
		);
		return refuseRequest(event, 503, UNAVAILABLE_MESSAGE, { headers: { 'retry-after': '2' } });
	}
};
