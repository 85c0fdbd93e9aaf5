import { endpoint, readJson, readQuery } from '$lib/server/api';
import { list, listPlans } from '$lib/server/db/queries/jobs';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { createJob } from '$lib/server/jobs/create';
import { jobCreateSchema, jobListSchema } from '$lib/schemas/job';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** Staff see the store's jobs; installers only those assigned to them. */
export const GET: RequestHandler = endpoint(async ({ url }) => {
	const { store, scope } = requirePermission({ job: ['read'] }, { assignedJob: ['read'] });
	const query = readQuery(url, jobListSchema);
	const { rows, total, totalCapped } = await readInStore(store.id, (tx) => list(tx, query, scope), {
		plans: listPlans(query, scope)
	});
	return json({ rows, total, totalCapped, page: query.page, pageSize: query.pageSize });
});

export const POST: RequestHandler = endpoint(async ({ request }) => {
	const { store, user } = requirePermission({ job: ['create'] });
	const input = await readJson(request, jobCreateSchema);
	const made = await inStore(store.id, (tx) => createJob(tx, input, { kind: 'none' }, user.id));
	// Another store's customer id is as unknown here as a made-up one.
	if (!made.ok) error(404, 'Customer not found');
	return json(made.job, { status: 201 });
});
