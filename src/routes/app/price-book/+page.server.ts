import * as priceBook from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requireRole } from '$lib/server/guards';
import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const { store } = requireRole('owner', 'manager');
	return readInStore(store.id, async (tx) => ({
		items: await priceBook.list(tx),
		currency: (await tradeSettings.termsOf(tx)).currency,
		added: url.searchParams.get('added')
	}));
};

const lineId = z.object({ id: z.string().trim().min(1).max(64) });

export const actions: Actions = {
	/** Deactivates or reactivates a line: an inactive line is kept but not used in new quotes. */
	toggle: async ({ request }) => {
		const { store } = requireRole('owner', 'manager');
		const parsed = lineId.safeParse(Object.fromEntries(await request.formData()));
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
