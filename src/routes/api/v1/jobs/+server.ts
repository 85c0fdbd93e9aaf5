import { endpoint, readJson, readQuery } from '$lib/server/api';
import { create, list } from '$lib/server/db/queries/jobs';
import { requirePermission } from '$lib/server/guards';
import { jobCreateSchema, jobListSchema } from '$lib/schemas/job';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** Staff see the store's jobs; installers only those assigned to them. */
export const GET: RequestHandler = endpoint(async ({ url }) => {
	const { store, scope } = requirePermission({ job: ['read'] }, { assignedJob: ['read'] });
	const query = readQuery(url, jobListSchema);
	const { rows, total } = await list(store.id, query, scope);
	return json({ rows, total, page: query.page, pageSize: query.pageSize });
});

export const POST: RequestHandler = endpoint(async ({ request }) => {
	const { store, user } = requirePermission({ job: ['create'] });
	const input = await readJson(request, jobCreateSchema);
	const row = await create(store.id, input, user.id);
	// Another store's customer id is as unknown here as a made-up one.
	if (!row) error(404, 'Customer not found');
	return json(row, { status: 201 });
});
