import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import { parseForm, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { jobCreateSchema } from '$lib/schemas/job';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const { store } = requirePermission({ job: ['create'] });
	const { rows } = await customers.list(store.id, {
		q: null,
		sort: 'name',
		dir: 'asc',
		page: 1,
		pageSize: 100
	});
	return {
		customers: rows.map((c) => ({ id: c.id, name: c.name })),
		customerId: url.searchParams.get('customer') ?? ''
	};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const { store, user } = requirePermission({ job: ['create'] });
		const parsed = await parseForm(request, jobCreateSchema);
		if (!parsed.ok) return parsed.failure;
		const row = await jobs.create(store.id, parsed.data, user.id);
		if (!row) return refuse(parsed.form, { customerId: ['Choose one of the store’s customers'] });
		redirect(303, `/app/jobs/${row.id}`);
	}
};
