import * as jobs from '$lib/server/db/queries/jobs';
import { requirePermission } from '$lib/server/guards';
import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const { store, scope } = requirePermission({ assignedJob: ['read'] });
	const job = await jobs.read(store.id, params.id, scope);
	if (!job) error(404, 'Not found');
	return { job };
};

export const actions: Actions = {
	start: async ({ params }) => {
		const { store, user, scope } = requirePermission({ assignedJob: ['report'] });
		// Only a job assigned to this installer, in this store.
		const job = await jobs.read(store.id, params.id, scope);
		if (!job) error(404, 'Not found');
		const result = await jobs.move(store.id, job.id, 'in_progress', user.id, 'Started on site');
		if (!result.ok) return fail(409, { message: 'This job is not booked to start yet.' });
		return { started: true };
	}
};
