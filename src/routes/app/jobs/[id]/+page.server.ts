import * as jobs from '$lib/server/db/queries/jobs';
import { inStore, readInStore } from '$lib/server/db/tenant';
import type { JobStatus, MoveFacts } from '$lib/jobs/status';
import { parseForm } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { can } from '$lib/server/permissions';
import { canBook, canDelete, handMove, nextStatuses } from '$lib/jobs/status';
import { moveByHand } from '$lib/server/jobs/move';
import { jobStory } from '$lib/server/jobs/story';
import { jobAssignSchema, jobMoveSchema, jobUpdateSchema } from '$lib/schemas/job';
import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { loadJobSite, siteAction } from './site.server';

/** The moves staff can make by hand now, with what the job has. */
function movesByHand(from: JobStatus, facts: MoveFacts) {
	return nextStatuses(from).filter((to) => handMove(from, to, facts).ok);
}

export const load: PageServerLoad = async ({ params }) => {
	const { store, grants, scope } = requirePermission({ job: ['read'] });
	return readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		if (!job) error(404, 'Not found');
		const canAssign = can(grants, { job: ['assign'] });
		const installers = canAssign ? await jobs.listInstallers(tx) : [];
		const { story, moveFacts } = await jobStory(tx, job, grants);
		return {
			job,
			...story,
			installers,
			moves: can(grants, { job: ['schedule'] }) ? movesByHand(job.status, moveFacts) : [],
			canAssign,
			// The schedule books it (and moves a booking); the page links there.
			canBook: can(grants, { job: ['schedule'] }) && canBook(job.status),
			site: await loadJobSite(tx, job, grants),
			canEdit: can(grants, { job: ['update'] }),
			canDelete: can(grants, { job: ['delete'] }) && canDelete(job.status)
		};
	});
};

export const actions: Actions = {
	site: siteAction,
	save: async ({ request, params }) => {
		const member = requirePermission({ job: ['update'] });
		await requireJob(member, params.id);
		const { store } = member;
		const parsed = await parseForm(request, jobUpdateSchema);
		if (!parsed.ok) return parsed.failure;
		const row = await inStore(store.id, (tx) => jobs.update(tx, params.id, parsed.data));
		if (!row) error(404, 'Not found');
		return { saved: true };
	},
	move: async ({ request, params }) => {
		const member = requirePermission({ job: ['schedule'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const parsed = await parseForm(request, jobMoveSchema);
		if (!parsed.ok) return parsed.failure;
		const { to, note } = parsed.data;
		const result = await inStore(store.id, (tx) => moveByHand(tx, params.id, to, user.id, note));
		if (!result.ok && result.reason === 'not_found') error(404, 'Not found');
		if (!result.ok)
			return fail(409, { moveError: `${result.message} The page shows the moves it allows.` });
		return { moved: true };
	},
	assign: async ({ request, params }) => {
		const member = requirePermission({ job: ['assign'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const parsed = await parseForm(request, jobAssignSchema);
		if (!parsed.ok) return parsed.failure;
		const { installerId } = parsed.data;
		const result = await inStore(store.id, (tx) =>
			jobs.assign(tx, params.id, installerId, user.id)
		);
		if (result === 'not_found') error(404, 'Not found');
		if (result === 'not_an_installer') {
			return fail(400, { assignError: 'Choose one of the store’s installers.' });
		}
		return { assigned: true };
	},
	delete: async ({ params }) => {
		const member = requirePermission({ job: ['delete'] });
		await requireJob(member, params.id);
		const { store } = member;
		const result = await inStore(store.id, (tx) => jobs.remove(tx, params.id));
		if (result === 'not_found') error(404, 'Not found');
		if (result === 'not_draft') {
			return fail(409, {
				deleteError:
					'Only a draft or cancelled job with no quote and no payment can be deleted; cancel this one instead, so its history is kept.'
			});
		}
		redirect(303, '/app/jobs');
	}
};
