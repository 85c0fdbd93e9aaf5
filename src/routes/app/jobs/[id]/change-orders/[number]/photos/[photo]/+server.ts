import * as changeOrders from '$lib/server/db/queries/change-orders';
import * as field from '$lib/server/db/queries/field';
import * as jobs from '$lib/server/db/queries/jobs';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { photoResponse } from '$lib/server/change-orders/photos';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/**
 * A photo of the job's field report, for the manager reviewing its change order (`?size=thumb`
 * for the thumbnail). Another store's or another job's photo is 404.
 */
export const GET: RequestHandler = async ({ params, url }) => {
	const { store, scope } = requirePermission({ changeOrder: ['review'] });
	const photo = await readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		if (!job || !/^[1-9]\d{0,5}$/.test(params.number)) return undefined;
		const row = await changeOrders.readByNumber(tx, job.id, Number(params.number));
		if (!row) return undefined;
		const found = await field.readPhoto(tx, job.id, params.photo);
		return found?.purpose === 'report' ? found : undefined;
	});
	if (!photo) error(404, 'Not found');
	return photoResponse(photo, url);
};
