import { linkedJob, openLink } from '$lib/server/customer-page';
import * as changeOrders from '$lib/server/db/queries/change-orders';
import * as field from '$lib/server/db/queries/field';
import * as completions from '$lib/server/db/queries/completions';
import { readInStore } from '$lib/server/db/tenant';
import { photoResponse } from '$lib/server/change-orders/photos';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/**
 * A site photo through the customer's link, only where the page shows it: a report photo once
 * the store has sent the customer a change order from that report, a completion photo once the
 * job is marked complete. Anything else, another job's or store's photo included, is 404.
 */
export const GET: RequestHandler = async ({ params, url, setHeaders }) => {
	const link = openLink(params.token);
	setHeaders({ 'referrer-policy': 'same-origin' });
	const photo = await readInStore(link.storeId, async (tx) => {
		const { job } = await linkedJob(tx, link);
		const row = await field.readPhoto(tx, job.id, params.photo);
		if (!row) return undefined;
		if (row.purpose === 'completion') {
			return (await completions.read(tx, job.id)) ? row : undefined;
		}
		const sent = await changeOrders.listSent(tx, job.id);
		return sent.length ? row : undefined;
	});
	if (!photo) error(404, 'Not found');
	return photoResponse(photo, url);
};
