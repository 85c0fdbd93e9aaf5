import { endpoint, readJson, readQuery } from '$lib/server/api';
import * as priceBook from '$lib/server/db/queries/price-book';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requireRole } from '$lib/server/guards';
import { priceItemCreateSchema, PRICE_SECTIONS } from '$lib/schemas/price-book';
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { priceItemRefusal } from './refusal.server';

const listQuery = z.object({ section: z.enum(PRICE_SECTIONS).optional() });

/** The price book's lines (store prices and costs: owners and managers only). */
export const GET: RequestHandler = endpoint(async ({ url }) => {
	const { store } = requireRole('owner', 'manager');
	const { section } = readQuery(url, listQuery);
	return json({ rows: await readInStore(store.id, (tx) => priceBook.list(tx, section)) });
});

/** A line in the engine's shape for its section: 400 naming each bad field, 409 for a second line of a kind. */
export const POST: RequestHandler = endpoint(async ({ request }) => {
	const { store } = requireRole('owner', 'manager');
	const input = await readJson(request, priceItemCreateSchema);
	try {
		return json(await inStore(store.id, (tx) => priceBook.create(tx, input)), { status: 201 });
	} catch (e) {
		return priceItemRefusal(e);
	}
});
