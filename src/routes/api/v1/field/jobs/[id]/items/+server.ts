import { endpoint, readJson } from '$lib/server/api';
import { inStore } from '$lib/server/db/tenant';
import { recordItems } from '$lib/server/field/report';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { fieldItemsSchema } from '$lib/schemas/field';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/**
 * The phone's outbox sends the report's items here: each answered by its client id as stored,
 * updated, unchanged (a resend), a conflict (with the stored item, to merge) or refused.
 */
export const POST: RequestHandler = endpoint(async ({ params, request }) => {
	const member = requirePermission({ assignedJob: ['report'] });
	await requireJob(member, params.id);
	const body = await readJson(request, fieldItemsSchema);
	const result = await inStore(member.store.id, (tx) =>
		recordItems(tx, params.id, member.user.id, body.items)
	);
	if (!result.ok) {
		if (result.reason === 'not_found') error(404, 'Not found');
		if (result.reason === 'no_report') error(409, 'Check in on the job first');
		error(409, 'This job is not under way: nothing can be recorded on it now');
	}
	return json({ items: result.answers });
});
