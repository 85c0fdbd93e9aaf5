import { endpoint, readJson } from '$lib/server/api';
import { moveByHand } from '$lib/server/jobs/move';
import { inStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { jobMoveSchema } from '$lib/schemas/job';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** Moves a job to another status, when the state rules allow it with what the job has. */
export const POST: RequestHandler = endpoint(async ({ params, request }) => {
	const member = requirePermission({ job: ['schedule'] });
	await requireJob(member, params.id);
	const { store, user } = member;
	const input = await readJson(request, jobMoveSchema);
	const result = await inStore(store.id, (tx) =>
		moveByHand(tx, params.id, input.to, user.id, input.note)
	);
	if (!result.ok && result.reason === 'not_found') error(404, 'Not found');
	if (!result.ok) error(409, result.message);
	return json(result.job);
});
