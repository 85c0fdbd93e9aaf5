import { endpoint, readJson } from '$lib/server/api';
import * as jobs from '$lib/server/db/queries/jobs';
import * as measures from '$lib/server/db/queries/measures';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { emptyMeasure } from '$lib/measure/draft';
import { measureSaveSchema } from '$lib/schemas/measure';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

const nothingSaved = () => ({
	draft: emptyMeasure(),
	version: 0,
	updatedAt: null,
	updatedByName: null
});

/** The stored measure, or an empty one at version 0 when nothing was saved yet. */
export const GET: RequestHandler = endpoint(async ({ params }) => {
	const { store, scope } = requirePermission({ job: ['read'] });
	const found = await readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		return job && ((await measures.read(tx, job.id)) ?? nothingSaved());
	});
	if (!found) error(404, 'Not found');
	return json(found);
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
	const saved = await inStore(store.id, async (tx) => {
		const result = await measures.save(tx, params.id, body.draft, body.baseVersion, user.id);
		// No measure to save on top of: either the job is not the store's, or the version named is gone.
		const known =
			result.ok || result.reason === 'conflict'
				? true
				: Boolean(await jobs.readForViewer(tx, params.id, scope));
		return { result, known };
	});
	const { result } = saved;
	if (result.ok) return json({ version: result.version, updatedAt: result.updatedAt });
	if (result.reason === 'conflict') {
		const by = result.current.updatedByName ?? 'Someone';
		return json(
			{ message: `${by} saved this measure while you were editing`, current: result.current },
			{ status: 409 }
		);
	}
	if (!saved.known) error(404, 'Not found');
	return json(
		{
			message: 'The measure these changes were made on is no longer stored',
			current: nothingSaved()
		},
		{ status: 409 }
	);
});
