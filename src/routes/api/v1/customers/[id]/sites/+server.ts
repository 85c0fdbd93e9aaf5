import { endpoint, readJson } from '$lib/server/api';
import * as customers from '$lib/server/db/queries/customers';
import * as sites from '$lib/server/db/queries/sites';
import { requirePermission } from '$lib/server/guards';
import { siteSchema } from '$lib/schemas/site';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The customer's sites, each with how many jobs are at it. */
export const GET: RequestHandler = endpoint(async ({ params }) => {
	const { store } = requirePermission({ customer: ['read'] });
	if (!(await customers.read(store.id, params.id))) error(404, 'Not found');
	return json({ rows: await sites.listWithJobCounts(store.id, params.id) });
});

export const POST: RequestHandler = endpoint(async ({ params, request }) => {
	const { store } = requirePermission({ customer: ['update'] });
	const input = await readJson(request, siteSchema);
	const row = await sites.create(store.id, params.id, input);
	if (!row) error(404, 'Not found');
	return json(row, { status: 201 });
});
