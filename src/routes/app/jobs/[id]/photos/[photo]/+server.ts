import * as field from '$lib/server/db/queries/field';
import * as jobs from '$lib/server/db/queries/jobs';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { photoResponse } from '$lib/server/change-orders/photos';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/**
 * A photo from the site (the installer's report or the completion walk-through), for the store's
 * staff who see the job (`?size=thumb` for the thumbnail). Installers read theirs through the
 * field API; another store's, another job's or a made-up photo is 404.
 */
export const GET: RequestHandler = async ({ params, url }) => {
	const { store, scope } = requirePermission({ job: ['read'] });
	const photo = await readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		if (!job) return undefined;
		return (await field.readPhoto(tx, job.id, params.photo)) ?? undefined;
	});
	if (!photo) error(404, 'Not found');
	return photoResponse(photo, url);
};
