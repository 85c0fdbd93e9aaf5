import { estimatePreviewSchema } from '$lib/schemas/preview';
import { endpoint, readJson } from '$lib/server/api';
import { readInStore } from '$lib/server/db/tenant';
import { previewEstimate } from '$lib/server/estimates';
import { requireMember } from '$lib/server/guards';
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The whole estimate of a job; nothing is saved. Each member gets what they may see. */
export const POST: RequestHandler = endpoint(async ({ request }) => {
	const { store, grants } = requireMember();
	const input = await readJson(request, estimatePreviewSchema);
	return json(await readInStore(store.id, (tx) => previewEstimate(tx, grants, input)));
});
