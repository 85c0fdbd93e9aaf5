import { endpoint, readJson } from '$lib/server/api';
import { read, remove, update } from '$lib/server/db/queries/customers';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { customerPatchSchema } from '$lib/schemas/customer';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ params }) => {
	const { store } = requirePermission({ customer: ['read'] });
	const row = await readInStore(store.id, (tx) => read(tx, params.id));
	if (!row) error(404, 'Not found');
	return json(row);
});

export const PATCH: RequestHandler = endpoint(async ({ params, request }) => {
	const { store } = requirePermission({ customer: ['update'] });
	const input = await readJson(request, customerPatchSchema);
	const row = await inStore(store.id, (tx) => update(tx, params.id, input));
	if (!row) error(404, 'Not found');
	return json(row);
});

export const DELETE: RequestHandler = endpoint(async ({ params }) => {
	const { store } = requirePermission({ customer: ['delete'] });
	const result = await inStore(store.id, (tx) => remove(tx, params.id));
	if (result === 'not_found') error(404, 'Not found');
	if (result === 'has_jobs') error(409, 'This customer has jobs and is kept');
	return new Response(null, { status: 204 });
});
