import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import * as sites from '$lib/server/db/queries/sites';
import { fieldErrors, parseForm, typedValues } from '$lib/server/forms';
import { placeJob, readSiteChoice, siteFits } from '$lib/server/job-sites';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { customerSchema } from '$lib/schemas/customer';
import { jobCreateSchema } from '$lib/schemas/job';
import { siteSchema } from '$lib/schemas/site';
import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { formFields } from '$lib/input';

export const load: PageServerLoad = async ({ params }) => {
	const { store, grants, scope } = requirePermission({ customer: ['read'] });
	const row = await customers.read(store.id, params.id);
	if (!row) error(404, 'Not found');
	const { rows: customerJobs } = await jobs.list(
		store.id,
		{ customerId: row.id, sort: 'number', dir: 'desc', page: 1, pageSize: 100, q: null },
		scope
	);
	return {
		customer: row,
		jobs: customerJobs,
		sites: await sites.listWithJobCounts(store.id, row.id),
		canEditSites: can(grants, { customer: ['update'] }),
		canEdit: can(grants, { customer: ['update'] }),
		canDelete: can(grants, { customer: ['delete'] })
	};
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const { store } = requirePermission({ customer: ['update'] });
		const parsed = await parseForm(request, customerSchema);
		if (!parsed.ok) return parsed.failure;
		const row = await customers.update(store.id, params.id, parsed.data);
		if (!row) error(404, 'Not found');
		return { saved: true };
	},
	delete: async ({ params }) => {
		const { store } = requirePermission({ customer: ['delete'] });
		const result = await customers.remove(store.id, params.id);
		if (result === 'not_found') error(404, 'Not found');
		if (result === 'has_jobs') {
			return fail(409, {
				deleteError:
					'This customer has jobs, so their record stays. Cancel or close the jobs instead.'
			});
		}
		redirect(303, '/app/customers');
	},
	startJob: async ({ request, params }) => {
		const { store, user } = requirePermission({ job: ['create'] });
		const form = await request.formData();
		const parsed = jobCreateSchema.omit({ customerId: true }).safeParse(formFields(form));
		const where = readSiteChoice(form);
		// Its own keys, so the customer form beside it keeps what it shows.
		const refuseJob = (errors: Record<string, string[]>) =>
			fail(400, { job: { values: typedValues(form), errors } });
		if (!parsed.success || !where.ok) {
			return refuseJob({
				...(parsed.success ? {} : fieldErrors(parsed.error)),
				...(where.ok ? {} : where.errors)
			});
		}
		if (!(await customers.read(store.id, params.id))) error(404, 'Not found');
		if (!(await siteFits(store.id, params.id, where.choice))) {
			return refuseJob({ siteId: ['Choose one of this customer’s sites'] });
		}
		const row = await jobs.create(store.id, { ...parsed.data, customerId: params.id }, user.id);
		if (!row) error(404, 'Not found');
		await placeJob(store.id, row, where.choice);
		redirect(303, `/app/jobs/${row.id}`);
	},
	addSite: async ({ request, params }) => {
		const { store } = requirePermission({ customer: ['update'] });
		const form = await request.formData();
		const parsed = siteSchema.safeParse(formFields(form));
		if (!parsed.success) {
			return fail(400, {
				site: { id: 'new', values: typedValues(form), errors: fieldErrors(parsed.error) }
			});
		}
		const row = await sites.create(store.id, params.id, parsed.data);
		if (!row) error(404, 'Not found');
		return { siteSaved: row.id };
	},
	saveSite: async ({ request, params }) => {
		const { store } = requirePermission({ customer: ['update'] });
		const form = await request.formData();
		const siteId = String(form.get('siteId') ?? '');
		const current = siteId ? await sites.read(store.id, siteId) : undefined;
		if (!current || current.customerId !== params.id) error(404, 'Not found');
		const parsed = siteSchema.safeParse(formFields(form));
		if (!parsed.success) {
			return fail(400, {
				site: { id: siteId, values: typedValues(form), errors: fieldErrors(parsed.error) }
			});
		}
		await sites.update(store.id, siteId, parsed.data);
		return { siteSaved: siteId };
	},
	deleteSite: async ({ request, params }) => {
		const { store } = requirePermission({ customer: ['update'] });
		const siteId = String((await request.formData()).get('siteId') ?? '');
		const current = siteId ? await sites.read(store.id, siteId) : undefined;
		if (!current || current.customerId !== params.id) error(404, 'Not found');
		const result = await sites.remove(store.id, siteId);
		if (result === 'not_found') error(404, 'Not found');
		if (result === 'has_jobs') {
			return fail(409, {
				siteDelete: {
					id: siteId,
					message: 'Jobs are at this site, so it stays for their history.'
				}
			});
		}
		return { siteDeleted: true };
	}
};
