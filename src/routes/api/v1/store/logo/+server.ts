import { requireMember } from '$lib/server/guards';
import { readInStore } from '$lib/server/db/tenant';
import { readLogo } from '$lib/server/logo';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The active store's logo, to its members only (the store comes from the session, never the URL). */
export const GET: RequestHandler = async () => {
	const { store } = requireMember();
	const logo = await readInStore(store.id, (tx) => readLogo(tx));
	if (!logo) error(404, 'Not found');
	return new Response(new Uint8Array(logo.bytes), {
		headers: {
			'content-type': logo.type,
			'cache-control': 'private, no-cache',
			'x-content-type-options': 'nosniff'
		}
	});
};
