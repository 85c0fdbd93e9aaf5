import * as customers from '$lib/server/db/queries/customers';
import * as sites from '$lib/server/db/queries/sites';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { fieldErrors, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { createJob } from '$lib/server/jobs/create';
import { readSiteChoice } from '$lib/server/jobs/sites';
import { jobCreateSchema } from '$lib/schemas/job';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { formFields } from '$lib/input';

export const load: PageServerLoad = async ({ url }) => {
	const { store } = requirePermission({ job: ['create'] });
	const customerId = url.searchParams.get('customer') ?? '';
	return readInStore(store.id, async (tx) => {
		const { rows } = await customers.list(tx, {
			q: null,
			sort: 'name',
			dir: 'asc',
			page: 1,
			pageSize: 100
		});
		const known = rows.some((c) => c.id === customerId);
		return {
			customers: rows.map((c) => ({ id: c.id, name: c.name })),
			customerId: known ? customerId : '',
			sites: known ? await sites.listForCustomer(tx, customerId) : []
		};
	});
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
		const made = await inStore(store.id, (tx) => createJob(tx, parsed.data, where.choice, user.id));
		if (!made.ok && made.reason === 'other_site') {
			return refuse(form, { siteId: ['Choose one of this customer’s sites, or a new address'] });
		}
		if (!made.ok) return refuse(form, { customerId: ['Choose one of the store’s customers'] });
		redirect(303, `/app/jobs/${made.job.id}`);
	}
};
