import { endpoint, readJson } from '$lib/server/api';
import * as priceBook from '$lib/server/db/queries/price-book';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { visiblePriceItem } from '$lib/server/figures';
import { requirePermission } from '$lib/server/guards';
import { priceItemPatchSchema } from '$lib/schemas/price-book';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { priceItemRefusal } from '../refusal.server';

export const GET: RequestHandler = endpoint(async ({ params }) => {
	const { store, grants } = requirePermission({ priceBook: ['read'] });
	const row = await readInStore(store.id, (tx) => priceBook.read(tx, params.id));
	if (!row) error(404, 'Not found');
	return json(visiblePriceItem(grants, row));
});

/** Changes the name, the active flag or the whole data of a line; sent quotes keep their copy. */
export const PATCH: RequestHandler = endpoint(async ({ params, request }) => {
	const { store } = requirePermission({ priceBook: ['update'] });
	const input = await readJson(request, priceItemPatchSchema);
	let row;
	try {
		row = await inStore(store.id, (tx) => priceBook.update(tx, params.id, input));
	} catch (e) {
		return priceItemRefusal(e);
	}
	if (!row) error(404, 'Not found');
	return json(row);
});

export const DELETE: RequestHandler = endpoint(async ({ params }) => {
	const { store } = requirePermission({ priceBook: ['update'] });
	if (!(await inStore(store.id, (tx) => priceBook.remove(tx, params.id)))) error(404, 'Not found');
	return new Response(null, { status: 204 });
});
