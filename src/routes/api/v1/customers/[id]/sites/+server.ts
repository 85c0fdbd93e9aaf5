import { endpoint, readJson } from '$lib/server/api';
import * as customers from '$lib/server/db/queries/customers';
import * as sites from '$lib/server/db/queries/sites';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { siteSchema } from '$lib/schemas/site';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The customer's sites, each with how many jobs are at it. */
export const GET: RequestHandler = endpoint(async ({ params }) => {
	const { store } = requirePermission({ customer: ['read'] });
	const rows = await readInStore(store.id, async (tx) =>
		(await customers.read(tx, params.id)) ? sites.listWithJobCounts(tx, params.id) : null
	);
	if (!rows) error(404, 'Not found');
	return json({ rows });
});

export const POST: RequestHandler = endpoint(async ({ params, request }) => {
	const { store } = requirePermission({ customer: ['update'] });
	const input = await readJson(request, siteSchema);
	const row = await inStore(store.id, (tx) => sites.create(tx, params.id, input));
	if (!row) error(404, 'Not found');
	return json(row, { status: 201 });
});
