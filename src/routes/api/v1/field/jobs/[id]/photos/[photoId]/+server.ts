import { endpoint } from '$lib/server/api';
import { readInStore } from '$lib/server/db/tenant';
import { readPhotoFile } from '$lib/server/field/photos';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** A site photo (`?size=thumb` for its thumbnail), to members who may see the job only. */
export const GET: RequestHandler = endpoint(async ({ params, url }) => {
	const member = requirePermission({ assignedJob: ['read'] }, { job: ['read'] });
	await requireJob(member, params.id);
	const size = url.searchParams.get('size') === 'thumb' ? 'thumb' : 'full';
	const file = await readInStore(member.store.id, (tx) =>
		readPhotoFile(tx, params.id, params.photoId, size)
	);
	if (!file) error(404, 'Not found');
	return new Response(new Uint8Array(file.bytes), {
		headers: {
			'content-type': file.type,
			'cache-control': 'private, max-age=86400',
			'x-content-type-options': 'nosniff'
		}
	});
});
