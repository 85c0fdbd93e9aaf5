import { endpoint, readJson } from '$lib/server/api';
import * as sites from '$lib/server/db/queries/sites';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { sitePatchSchema } from '$lib/schemas/site';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ params }) => {
	const { store } = requirePermission({ customer: ['read'] });
	const row = await readInStore(store.id, (tx) => sites.read(tx, params.id));
	if (!row) error(404, 'Not found');
	return json(row);
});

export const PATCH: RequestHandler = endpoint(async ({ params, request }) => {
	const { store } = requirePermission({ customer: ['update'] });
	const input = await readJson(request, sitePatchSchema);
	const row = await inStore(store.id, (tx) => sites.update(tx, params.id, input));
	if (!row) error(404, 'Not found');
	return json(row);
});

/** 204; 409 when jobs are at the site (it stays for their history). */
export const DELETE: RequestHandler = endpoint(async ({ params }) => {
	const { store } = requirePermission({ customer: ['update'] });
	const result = await inStore(store.id, (tx) => sites.remove(tx, params.id));
	if (result === 'not_found') error(404, 'Not found');
	if (result === 'has_jobs') error(409, 'Jobs are at this site, so it is kept');
	return new Response(null, { status: 204 });
});
