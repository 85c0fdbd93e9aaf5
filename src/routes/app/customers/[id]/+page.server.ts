import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import { parseForm } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { customerSchema } from '$lib/schemas/customer';
import { jobCreateSchema } from '$lib/schemas/job';
import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const { store, user, role } = requirePermission({ customer: ['read'] });
	const row = await customers.read(store.id, params.id);
	if (!row) error(404, 'Not found');
	const { rows: customerJobs } = await jobs.list(
		store.id,
		{ customerId: row.id, sort: 'number', dir: 'desc', page: 1, pageSize: 100, q: null },
		{ userId: user.id, role }
	);
	return {
		customer: row,
		jobs: customerJobs,
		canEdit: can(role, { customer: ['update'] }),
		canDelete: can(role, { customer: ['delete'] })
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
		const parsed = await parseForm(request, jobCreateSchema.omit({ customerId: true }));
		// Its own keys, so the customer form beside it keeps what it shows.
		if (!parsed.ok) {
			return fail(400, {
				job: { values: parsed.failure.data.values, errors: parsed.failure.data.errors }
			});
		}
		const row = await jobs.create(store.id, { ...parsed.data, customerId: params.id }, user.id);
		if (!row) error(404, 'Not found');
		redirect(303, `/app/jobs/${row.id}`);
	}
};
