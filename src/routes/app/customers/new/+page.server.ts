import { create } from '$lib/server/db/queries/customers';
import { inStore } from '$lib/server/db/tenant';
import { parseForm } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { customerSchema } from '$lib/schemas/customer';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	requirePermission({ customer: ['create'] });
	return {};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const { store } = requirePermission({ customer: ['create'] });
		const parsed = await parseForm(request, customerSchema);
		if (!parsed.ok) return parsed.failure;
		const row = await inStore(store.id, (tx) => create(tx, parsed.data));
		redirect(303, `/app/customers/${row.id}`);
	}
};
