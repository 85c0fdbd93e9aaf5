import { endpoint, readJson, readQuery } from '$lib/server/api';
import { list, listPlans } from '$lib/server/db/queries/jobs';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { createJob } from '$lib/server/jobs/create';
import { jobCreateSchema, jobListSchema } from '$lib/schemas/job';
import { error, json, text } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/**
 * Staff see the store's jobs; installers only those assigned to them. Each row comes as the JSON
 * text PostgreSQL writes for it (`RowForm`), the same as the row read into an object would be
 * written here, so the answer is put together around them rather than read and written again.
 */
export const GET: RequestHandler = endpoint(async ({ url }) => {
	const { store, scope } = requirePermission({ job: ['read'] }, { assignedJob: ['read'] });
	const query = readQuery(url, jobListSchema);
	const { rows, total, totalCapped } = await readInStore(
		store.id,
		(tx) => list(tx, query, scope, 'json'),
		{ plans: listPlans(query, scope) }
	);
	const rest = JSON.stringify({ total, totalCapped, page: query.page, pageSize: query.pageSize });
	return text(`{"rows":[${rows.join(',')}],${rest.slice(1)}`, {
		headers: { 'content-type': 'application/json' }
	});
});

export const POST: RequestHandler = endpoint(async ({ request }) => {
	const { store, user } = requirePermission({ job: ['create'] });
	const input = await readJson(request, jobCreateSchema);
	const made = await inStore(store.id, (tx) => createJob(tx, input, { kind: 'none' }, user.id));
	// Another store's customer id is as unknown here as a made-up one.
	if (!made.ok) error(404, 'Customer not found');
	return json(made.job, { status: 201 });
});
