import { readInStore } from '$lib/server/db/tenant';
import { readWorkOrder } from '$lib/server/field/work-order';
import { requirePermission } from '$lib/server/guards';
import { workOrderPdf } from '$lib/server/pdf/work-order-pdf';
import { pdfResponse } from '$lib/server/quotes/pdf';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The work order of a job assigned to the installer, as a PDF (no prices in it). */
export const GET: RequestHandler = async ({ params }) => {
	const { store, scope } = requirePermission({ assignedJob: ['read'] });
	const order = await readInStore(store.id, (tx) => readWorkOrder(tx, params.id, scope));
	if (!order) error(404, 'Not found');
	return pdfResponse(await workOrderPdf(order, store.name), `${order.job.label}-work-order.pdf`);
};
