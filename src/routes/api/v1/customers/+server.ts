import { endpoint, readJson, readQuery } from '$lib/server/api';
import { create, list } from '$lib/server/db/queries/customers';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { customerListSchema, customerSchema } from '$lib/schemas/customer';
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = endpoint(async ({ url }) => {
	const { store } = requirePermission({ customer: ['read'] });
	const query = readQuery(url, customerListSchema);
	const { rows, total } = await readInStore(store.id, (tx) => list(tx, query));
	return json({ rows, total, page: query.page, pageSize: query.pageSize });
});

export const POST: RequestHandler = endpoint(async ({ request }) => {
	const { store } = requirePermission({ customer: ['create'] });
	const input = await readJson(request, customerSchema);
	return json(await inStore(store.id, (tx) => create(tx, input)), { status: 201 });
});
