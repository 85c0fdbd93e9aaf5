import * as priceBook from '$lib/server/db/queries/price-book';
import { requirePermission } from '$lib/server/guards';
import { EXISTING_FLOOR_KINDS, PREP_KINDS, SUPPLY_KINDS } from '$lib/estimating';
import { isSection } from '$lib/schemas/price-book';
import { error } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { currencyOf, saveLine } from '../../lines.server';

export const load: PageServerLoad = async ({ params, url }) => {
	const { store } = requirePermission({ priceBook: ['update'] });
	if (!isSection(params.section)) error(404, 'Not found');
	const lines = await priceBook.list(store.id);
	const taken = lines.filter((l) => l.section === params.section).map((l) => l.code);
	const kinds: readonly string[] =
		params.section === 'prep'
			? PREP_KINDS
			: params.section === 'removal'
				? EXISTING_FLOOR_KINDS
				: params.section === 'supply'
					? SUPPLY_KINDS
					: [];
	return {
		section: params.section,
		full: kinds.length > 0 && kinds.every((k) => taken.includes(k)),
		kind: url.searchParams.get('kind') ?? '',
		taken,
		currency: await currencyOf(store.id),
		supplies: lines
			.filter((l) => l.section === 'supply')
			.map((s) => ({ kind: s.code, name: s.name, active: s.active }))
	};
};

export const actions: Actions = {
	default: async ({ request, params }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		if (!isSection(params.section)) error(404, 'Not found');
		return saveLine(store.id, params.section, request);
	}
};
