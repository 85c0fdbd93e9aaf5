import { canStartOnSite } from '$lib/jobs/status';
import * as jobs from '$lib/server/db/queries/jobs';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const { store, scope } = requirePermission({ assignedJob: ['read'] });
	const job = await readInStore(store.id, (tx) => jobs.readForViewer(tx, params.id, scope));
	if (!job) error(404, 'Not found');
	return { job };
};

export const actions: Actions = {
	start: async ({ params }) => {
		const { store, user, scope } = requirePermission({ assignedJob: ['report'] });
		const result = await inStore(store.id, async (tx) => {
			// Only a job assigned to this installer, in this store.
			const job = await jobs.readForViewer(tx, params.id, scope);
			if (!job) return null;
			if (!canStartOnSite(job.status)) return { ok: false } as const;
			return jobs.move(tx, job.id, 'in_progress', user.id, 'Started on site');
		});
		if (!result) error(404, 'Not found');
		if (!result.ok) return fail(409, { message: 'This job is not booked to start yet.' });
		return { started: true };
	}
};
