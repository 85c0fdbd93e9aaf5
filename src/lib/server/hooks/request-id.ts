import type { Handle } from '@sveltejs/kit';
import { log, safePath, withRequestId } from '../log';

/**
 * Gives each request an id, carried on every log line written while it is handled (through
 * AsyncLocalStorage) and answered as `X-Request-Id`, so a person quoting it finds the lines.
 * An incoming id is never trusted: it could be anything.
 */
export const handleRequestId: Handle = async ({ event, resolve }) => {
	const requestId = crypto.randomUUID();
	event.locals.requestId = requestId;
	return withRequestId(requestId, async () => {
		const started = performance.now();
		let status = 500;
		try {
			const response = await resolve(event);
			status = response.status;
			try {
				response.headers.set('x-request-id', requestId);
			} catch {
				// immutable headers: the id is still on the log lines
			}
			return response;
		} catch (e) {
			// redirects and refusals thrown by later hooks
			status = (e as { status?: number }).status ?? 500;
			throw e;
		} finally {
			log.info(
				{
					method: event.request.method,
					path: safePath(event.url),
					route: event.route.id,
					status,
					ms: Math.round(performance.now() - started)
				},
				'request'
			);
		}
	});
};
