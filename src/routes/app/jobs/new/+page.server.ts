import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import * as sites from '$lib/server/db/queries/sites';
import { fieldErrors, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { placeJob, readSiteChoice, siteFits } from '$lib/server/job-sites';
import { jobCreateSchema } from '$lib/schemas/job';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { formFields } from '$lib/input';

export const load: PageServerLoad = async ({ url }) => {
	const { store } = requirePermission({ job: ['create'] });
	const { rows } = await customers.list(store.id, {
		q: null,
		sort: 'name',
		dir: 'asc',
		page: 1,
		pageSize: 100
	});
	const customerId = url.searchParams.get('customer') ?? '';
	const known = rows.some((c) => c.id === customerId);
	return {
		customers: rows.map((c) => ({ id: c.id, name: c.name })),
		customerId: known ? customerId : '',
		sites: known ? await sites.listForCustomer(store.id, customerId) : []
	};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const { store, user } = requirePermission({ job: ['create'] });
		const form = await request.formData();
		const parsed = jobCreateSchema.safeParse(formFields(form));
		const where = readSiteChoice(form);
		if (!parsed.success || !where.ok) {
			return refuse(form, {
				...(parsed.success ? {} : fieldErrors(parsed.error)),
				...(where.ok ? {} : where.errors)
			});
		}
		if (!(await siteFits(store.id, parsed.data.customerId, where.choice))) {
			return refuse(form, { siteId: ['Choose one of this customer’s sites, or a new address'] });
		}
		const row = await jobs.create(store.id, parsed.data, user.id);
		if (!row) return refuse(form, { customerId: ['Choose one of the store’s customers'] });
		await placeJob(store.id, row, where.choice);
		redirect(303, `/app/jobs/${row.id}`);
	}
};
