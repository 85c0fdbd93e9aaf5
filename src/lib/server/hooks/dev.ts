import type { Handle } from '@sveltejs/kit';
import { refuseRequest } from './refuse';

/**
 * `/dev/*` (the fake outbox, the Stripe fake's checkout and controls) exists only while the local
 * fakes are on on purpose; otherwise every address under it is 404, whatever the page does.
 */
export function handleDevRoutes(fakesOn: () => boolean): Handle {
	return async ({ event, resolve }) => {
		const { pathname } = event.url;
		if ((pathname === '/dev' || pathname.startsWith('/dev/')) && !fakesOn()) {
			return refuseRequest(event, 404, 'Not found');
		}
		return resolve(event);
	};
}
