import * as priceBook from '$lib/server/db/queries/price-book';
import { seesCosts, visiblePriceItem } from '$lib/server/figures';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { currencyOf } from './lines.server';
import { formFields } from '$lib/input';

export const load: PageServerLoad = async ({ url }) => {
	const { store, grants } = requirePermission({ priceBook: ['read'] });
	const [items, currency] = await Promise.all([priceBook.list(store.id), currencyOf(store.id)]);
	return {
		items: items.map((i) => visiblePriceItem(grants, i)),
		currency,
		added: url.searchParams.get('added'),
		canEdit: can(grants, { priceBook: ['update'] }),
		canSeeCosts: seesCosts(grants)
	};
};

const lineId = z.object({ id: z.string().trim().min(1).max(64) });

export const actions: Actions = {
	/** Deactivates or reactivates a line: an inactive line is kept but not used in new quotes. */
	toggle: async ({ request }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		const parsed = lineId.safeParse(formFields(await request.formData()));
		if (!parsed.success) return fail(400, { message: 'Choose a line' });
		const current = await priceBook.read(store.id, parsed.data.id);
		if (!current) error(404, 'Not found');
		await priceBook.update(store.id, current.id, { active: !current.active });
		return { toggled: current.id, active: !current.active };
	}
};
