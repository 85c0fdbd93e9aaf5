import * as priceBook from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { EXISTING_FLOOR_KINDS, PREP_KINDS, SUPPLY_KINDS } from '$lib/estimating';
import { isSection } from '$lib/schemas/price-book';
import { error } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { saveLine } from '../../lines.server';

export const load: PageServerLoad = async ({ params, url }) => {
	const { store } = requirePermission({ priceBook: ['update'] });
	const section = params.section;
	if (!isSection(section)) error(404, 'Not found');
	const { lines, currency } = await readInStore(store.id, async (tx) => ({
		lines: await priceBook.list(tx),
		currency: (await tradeSettings.termsOf(tx)).currency
	}));
	const taken = lines.filter((l) => l.section === section).map((l) => l.code);
	const kinds: readonly string[] =
		section === 'prep'
			? PREP_KINDS
			: section === 'removal'
				? EXISTING_FLOOR_KINDS
				: section === 'supply'
					? SUPPLY_KINDS
					: [];
	return {
		section,
		full: kinds.length > 0 && kinds.every((k) => taken.includes(k)),
		kind: url.searchParams.get('kind') ?? '',
		taken,
		currency,
		supplies: lines
			.filter((l) => l.section === 'supply')
			.map((s) => ({ kind: s.code, name: s.name, active: s.active }))
	};
};

export const actions: Actions = {
	default: async ({ request, params }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		if (!isSection(params.section)) error(404, 'Not found');
		return saveLine(store.id, request, { section: params.section });
	}
};
