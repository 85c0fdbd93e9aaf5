import * as priceBook from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { error, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { formValues, saveLine } from '../lines.server';

export const load: PageServerLoad = async ({ params }) => {
	const { store } = requirePermission({ priceBook: ['update'] });
	return readInStore(store.id, async (tx) => {
		const item = await priceBook.read(tx, params.id);
		if (!item) error(404, 'Not found');
		const supplies = await priceBook.list(tx, 'supply');
		const { currency } = await tradeSettings.termsOf(tx);
		return {
			item,
			values: formValues(item, currency),
			currency,
			supplies: supplies.map((s) => ({ kind: s.code, name: s.name, active: s.active }))
		};
	});
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		return saveLine(store.id, request, { id: params.id });
	},
	toggle: async ({ params }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		const changed = await inStore(store.id, async (tx) => {
			const item = await priceBook.read(tx, params.id);
			return item && priceBook.update(tx, item.id, { active: !item.active });
		});
		if (!changed) error(404, 'Not found');
		return { toggled: true };
	},
	/** Removes the line; quotes already built keep their own copy of its prices. */
	delete: async ({ params }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		const removed = await inStore(store.id, async (tx) => {
			const item = await priceBook.read(tx, params.id);
			return item && (await priceBook.remove(tx, item.id)) ? item : undefined;
		});
		if (!removed) error(404, 'Not found');
		redirect(303, `/app/price-book#${removed.section}`);
	}
};
