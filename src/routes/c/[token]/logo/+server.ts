import { linkedJob, openLink } from '$lib/server/customer-page';
import { readInStore } from '$lib/server/db/tenant';
import { readLogo } from '$lib/server/logo';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The store's logo for its customer's page (only to a valid link). */
export const GET: RequestHandler = async ({ params }) => {
	const link = openLink(params.token);
	const logo = await readInStore(link.storeId, async (tx) => {
		await linkedJob(tx, link);
		return readLogo(tx);
	});
	if (!logo) error(404, 'No logo');
	return new Response(new Uint8Array(logo.bytes), {
		headers: { 'content-type': logo.type, 'cache-control': 'private, max-age=300' }
	});
};
