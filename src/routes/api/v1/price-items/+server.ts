import { endpoint, readJson, readQuery } from '$lib/server/api';
import * as priceBook from '$lib/server/db/queries/price-book';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { visiblePriceItem } from '$lib/server/figures';
import { requirePermission } from '$lib/server/guards';
import { priceItemCreateSchema, PRICE_SECTIONS } from '$lib/schemas/price-book';
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { priceItemRefusal } from './refusal.server';

const listQuery = z.object({ section: z.enum(PRICE_SECTIONS).optional() });

/** The price book's lines: sell prices to every reader, costs and pay to those who see costs. */
export const GET: RequestHandler = endpoint(async ({ url }) => {
	const { store, grants } = requirePermission({ priceBook: ['read'] });
	const { section } = readQuery(url, listQuery);
	const rows = await readInStore(store.id, (tx) => priceBook.list(tx, section));
	return json({ rows: rows.map((r) => visiblePriceItem(grants, r)) });
});

/** A line in the engine's shape for its section: 400 naming each bad field, 409 for a second line of a kind. */
export const POST: RequestHandler = endpoint(async ({ request }) => {
	const { store } = requirePermission({ priceBook: ['update'] });
	const input = await readJson(request, priceItemCreateSchema);
	try {
		return json(await inStore(store.id, (tx) => priceBook.create(tx, input)), { status: 201 });
	} catch (e) {
		return priceItemRefusal(e);
	}
});
