import * as priceBook from '$lib/server/db/queries/price-book';
import { requirePermission } from '$lib/server/guards';
import { error, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { currencyOf, formValues, saveLine } from '../lines.server';

export const load: PageServerLoad = async ({ params }) => {
	const { store } = requirePermission({ priceBook: ['update'] });
	const item = await priceBook.read(store.id, params.id);
	if (!item) error(404, 'Not found');
	const supplies = await priceBook.list(store.id, 'supply');
	const currency = await currencyOf(store.id);
	return {
		item,
		values: formValues(item, currency),
		currency,
		supplies: supplies.map((s) => ({ kind: s.code, name: s.name, active: s.active }))
	};
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		const item = await priceBook.read(store.id, params.id);
		if (!item) error(404, 'Not found');
		return saveLine(store.id, item.section, request, item);
	},
	toggle: async ({ params }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		const item = await priceBook.read(store.id, params.id);
		if (!item) error(404, 'Not found');
		await priceBook.update(store.id, item.id, { active: !item.active });
		return { toggled: true };
	},
	/** Removes the line; quotes already built keep their own copy of its prices. */
	delete: async ({ params }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		const item = await priceBook.read(store.id, params.id);
		if (!item) error(404, 'Not found');
		await priceBook.remove(store.id, item.id);
		redirect(303, `/app/price-book#${item.section}`);
	}
};
