import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import * as sites from '$lib/server/db/queries/sites';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { fieldErrors, parseForm, typedValues } from '$lib/server/forms';
import { createJob } from '$lib/server/jobs/create';
import { readSiteChoice } from '$lib/server/jobs/sites';
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
	return readInStore(store.id, async (tx) => {
		const row = await customers.read(tx, params.id);
		if (!row) error(404, 'Not found');
		const { rows: customerJobs } = await jobs.list(
			tx,
			{ customerId: row.id, sort: 'number', dir: 'desc', page: 1, pageSize: 100, q: null },
			scope
		);
		return {
			customer: row,
			jobs: customerJobs,
			sites: await sites.listWithJobCounts(tx, row.id),
			canEditSites: can(grants, { customer: ['update'] }),
			canEdit: can(grants, { customer: ['update'] }),
			canDelete: can(grants, { customer: ['delete'] })
		};
	});
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const { store } = requirePermission({ customer: ['update'] });
		const parsed = await parseForm(request, customerSchema);
		if (!parsed.ok) return parsed.failure;
		const row = await inStore(store.id, (tx) => customers.update(tx, params.id, parsed.data));
		if (!row) error(404, 'Not found');
		return { saved: true };
	},
	delete: async ({ params }) => {
		const { store } = requirePermission({ customer: ['delete'] });
		const result = await inStore(store.id, (tx) => customers.remove(tx, params.id));
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
		const made = await inStore(store.id, (tx) =>
			createJob(tx, { ...parsed.data, customerId: params.id }, where.choice, user.id)
		);
		if (!made.ok && made.reason === 'other_site') {
			return refuseJob({ siteId: ['Choose one of this customer’s sites'] });
		}
		if (!made.ok) error(404, 'Not found');
		redirect(303, `/app/jobs/${made.job.id}`);
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
		const row = await inStore(store.id, (tx) => sites.create(tx, params.id, parsed.data));
		if (!row) error(404, 'Not found');
		return { siteSaved: row.id };
	},
	saveSite: async ({ request, params }) => {
		const { store } = requirePermission({ customer: ['update'] });
		const form = await request.formData();
		const siteId = String(form.get('siteId') ?? '');
		const parsed = siteSchema.safeParse(formFields(form));
		const saved = await inStore(store.id, async (tx) => {
			const current = siteId ? await sites.read(tx, siteId) : undefined;
			if (!current || current.customerId !== params.id) return 'not_found' as const;
			if (!parsed.success) return 'invalid' as const;
			await sites.update(tx, siteId, parsed.data);
			return 'saved' as const;
		});
		if (saved === 'not_found') error(404, 'Not found');
		if (!parsed.success) {
			return fail(400, {
				site: { id: siteId, values: typedValues(form), errors: fieldErrors(parsed.error) }
			});
		}
		return { siteSaved: siteId };
	},
	deleteSite: async ({ request, params }) => {
		const { store } = requirePermission({ customer: ['update'] });
		const siteId = String((await request.formData()).get('siteId') ?? '');
		const result = await inStore(store.id, async (tx) => {
			const current = siteId ? await sites.read(tx, siteId) : undefined;
			if (!current || current.customerId !== params.id) return 'not_found' as const;
			return sites.remove(tx, siteId);
		});
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
