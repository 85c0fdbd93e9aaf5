import { endpoint, readJson } from '$lib/server/api';
import { readForViewer, remove, update } from '$lib/server/db/queries/jobs';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { jobUpdateSchema } from '$lib/schemas/job';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ params }) => {
	const { store, scope } = requirePermission({ job: ['read'] }, { assignedJob: ['read'] });
	const row = await readInStore(store.id, (tx) => readForViewer(tx, params.id, scope));
	if (!row) error(404, 'Not found');
	return json(row);
});

export const PATCH: RequestHandler = endpoint(async ({ params, request }) => {
	const member = requirePermission({ job: ['update'] });
	await requireJob(member, params.id);
	const { store } = member;
	const input = await readJson(request, jobUpdateSchema);
	const row = await inStore(store.id, (tx) => update(tx, params.id, input));
	if (!row) error(404, 'Not found');
	return json(row);
});

export const DELETE: RequestHandler = endpoint(async ({ params }) => {
	const member = requirePermission({ job: ['delete'] });
	await requireJob(member, params.id);
	const { store } = member;
	const result = await inStore(store.id, (tx) => remove(tx, params.id));
	if (result === 'not_found') error(404, 'Not found');
	if (result === 'not_draft')
		error(
			409,
			'Only a draft or cancelled job with no quote and no payment can be deleted; cancel it instead'
		);
	return new Response(null, { status: 204 });
});
