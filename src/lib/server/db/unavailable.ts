import { error } from '@sveltejs/kit';

/**
 * Errors that mean "the database cannot be reached right now" (restarting, failing over, out of
 * connections), as opposed to a fault in the query or the code. Those are answered 503 with a
 * "try again" (`databaseUnavailable()`), never 500: nothing was written (a transaction that lost
 * its connection is rolled back by PostgreSQL), so a retry is safe.
 */
const CONNECTION_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'EPIPE',
	'ETIMEDOUT',
	'EHOSTUNREACH',
	'ENETUNREACH',
	'EAI_AGAIN',
	// PostgreSQL: admin_shutdown, crash_shutdown, cannot_connect_now, too_many_connections
	'57P01',
	'57P02',
	'57P03',
	'53300'
]);

/** pg's own words for a connection that ended or never came (it sets no code for these). */
const CONNECTION_MESSAGES =
	/Connection terminated|connection error and is not queryable|timeout exceeded when trying to connect|Client was closed and is not queryable|Connection ended unexpectedly/i;

/** Whether `e` (or what it wraps: drizzle and better-auth keep the driver's error as `cause`). */
export function isDatabaseUnavailable(e: unknown): boolean {
	let current: unknown = e;
	for (let depth = 0; depth < 5 && current && typeof current === 'object'; depth++) {
		const { code, message, cause } = current as {
			code?: unknown;
			message?: unknown;
			cause?: unknown;
		};
		if (typeof code === 'string' && (CONNECTION_CODES.has(code) || /^08/.test(code))) return true;
		if (typeof message === 'string' && CONNECTION_MESSAGES.test(message)) return true;
		current = cause;
	}
	return false;
}

export const UNAVAILABLE_MESSAGE =
	'The database is not answering for a moment. Nothing was saved: please try again.';

/** SvelteKit's 503 for a database that cannot be reached (a page, a form or JSON alike). */
export function databaseUnavailable(): never {
	error(503, { message: UNAVAILABLE_MESSAGE });
}
