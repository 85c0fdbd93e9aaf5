import { endpoint, readJson, readQuery } from '$lib/server/api';
import { create, list } from '$lib/server/db/queries/jobs';
import { requireMember, requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { jobCreateSchema, jobListSchema } from '$lib/schemas/job';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** Staff see the store's jobs; installers only those assigned to them. */
export const GET: RequestHandler = endpoint(async ({ url }) => {
	const { store, user, role } = requireMember();
	if (!can(role, { job: ['read'] }) && !can(role, { assignedJob: ['read'] })) {
		error(403, 'Your role in this store does not allow this');
	}
	const query = readQuery(url, jobListSchema);
	const { rows, total } = await list(store.id, query, { userId: user.id, role });
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
