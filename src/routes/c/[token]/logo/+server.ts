import { resolveLink } from '$lib/server/customer-page';
import { readLogo } from '$lib/server/logo';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The store's logo for its customer's page (only to a valid link). */
export const GET: RequestHandler = async ({ params }) => {
	const { store } = await resolveLink(params.token);
	const logo = await readLogo(store.id);
	if (!logo) error(404, 'No logo');
	return new Response(new Uint8Array(logo.bytes), {
		headers: { 'content-type': logo.type, 'cache-control': 'private, max-age=300' }
	});
};
