import * as priceBook from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { seesCosts, visiblePriceItem } from '$lib/server/figures';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { formFields } from '$lib/input';

export const load: PageServerLoad = async ({ url }) => {
	const { store, grants } = requirePermission({ priceBook: ['read'] });
	return readInStore(store.id, async (tx) => ({
		items: (await priceBook.list(tx)).map((i) => visiblePriceItem(grants, i)),
		currency: (await tradeSettings.termsOf(tx)).currency,
		added: url.searchParams.get('added'),
		canEdit: can(grants, { priceBook: ['update'] }),
		canSeeCosts: seesCosts(grants)
	}));
};

const lineId = z.object({ id: z.string().trim().min(1).max(64) });

export const actions: Actions = {
	/** Deactivates or reactivates a line: an inactive line is kept but not used in new quotes. */
	toggle: async ({ request }) => {
		const { store } = requirePermission({ priceBook: ['update'] });
		const parsed = lineId.safeParse(formFields(await request.formData()));
		if (!parsed.success) return fail(400, { message: 'Choose a line' });
		const id = parsed.data.id;
		const changed = await inStore(store.id, async (tx) => {
			const current = await priceBook.read(tx, id);
			return current && priceBook.update(tx, current.id, { active: !current.active });
		});
		if (!changed) error(404, 'Not found');
		return { toggled: changed.id, active: changed.active };
	}
};
