import { endpoint, readJson } from '$lib/server/api';
import * as jobs from '$lib/server/db/queries/jobs';
import * as measures from '$lib/server/db/queries/measures';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { emptyMeasure } from '$lib/measure/draft';
import { measureSaveSchema } from '$lib/schemas/measure';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The stored measure, or an empty one at version 0 when nothing was saved yet. */
export const GET: RequestHandler = endpoint(async ({ params }) => {
	const { store, scope } = requirePermission({ job: ['read'] });
	const job = await jobs.read(store.id, params.id, scope);
	if (!job) error(404, 'Not found');
	const stored = await measures.read(store.id, job.id);
	return json(
		stored ?? { draft: emptyMeasure(), version: 0, updatedAt: null, updatedByName: null }
	);
});

/**
 * Saves the whole draft on top of `baseVersion`. When someone saved in between, nothing is
 * written: 409 with their measure, so the editor can show both.
 */
export const PUT: RequestHandler = endpoint(async ({ params, request }) => {
	const member = requirePermission({ job: ['update'] });
	await requireJob(member, params.id);
	const { store, user, scope } = member;
	const body = await readJson(request, measureSaveSchema);
	const saved = await measures.save(store.id, params.id, body.draft, body.baseVersion, user.id);
	if (saved.ok) return json({ version: saved.version, updatedAt: saved.updatedAt });
	if (saved.reason === 'conflict') {
		const by = saved.current.updatedByName ?? 'Someone';
		return json(
			{ message: `${by} saved this measure while you were editing`, current: saved.current },
			{ status: 409 }
		);
	}
	// No measure to save on top of: either the job is not the store's, or the version named is gone.
	const job = await jobs.read(store.id, params.id, scope);
	if (!job) error(404, 'Not found');
	return json(
		{
			message: 'The measure these changes were made on is no longer stored',
			current: { draft: emptyMeasure(), version: 0, updatedAt: null, updatedByName: null }
		},
		{ status: 409 }
	);
});
