import * as changeOrders from '$lib/server/db/queries/change-orders';
import * as quotes from '$lib/server/db/queries/quotes';
import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import { inStore, readInStore, type StoreTx } from '$lib/server/db/tenant';
import { fieldErrors, parseForm, refuse } from '$lib/server/forms';
import { readFields } from '$lib/input';
import { seesCosts } from '$lib/server/figures';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { can } from '$lib/server/permissions';
import {
	adjustChangeOrder,
	declineChangeOrder,
	sendChangeOrder,
	type ReviewResult
} from '$lib/server/change-orders/review';
import { deskChangeOrder, photoLines, roomNamesOf } from '$lib/server/change-orders/view';
import {
	adjustSchema,
	managerDeclineSchema,
	sendChangeOrderSchema
} from '$lib/schemas/change-order';
import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

/** `CO-3` is 3 in the address; anything else is no change order. */
function numberOf(param: string): number {
	if (!/^[1-9]\d{0,5}$/.test(param)) error(404, 'Not found');
	return Number(param);
}

async function changeOrderOf(tx: StoreTx, jobId: string, param: string) {
	const row = await changeOrders.readByNumber(tx, jobId, numberOf(param));
	if (!row) error(404, 'Not found');
	return row;
}

const REFUSED: Record<Exclude<ReviewResult, { ok: true }>['reason'], string> = {
	not_found: 'This change order is gone.',
	not_submitted:
		'This change order was already sent to the customer or declined; its figures are kept as they were.',
	nothing_to_send:
		'After the adjustments this change order comes to nothing: decline it instead of sending it.'
};

export const load: PageServerLoad = async ({ params }) => {
	const { store, grants, scope } = requirePermission({ changeOrder: ['review'] });
	return readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		if (!job) error(404, 'Not found');
		const row = await changeOrderOf(tx, job.id, params.number);
		const quote = await quotes.accepted(tx, job.id);
		const rooms = quote ? roomNamesOf(quote) : new Map<string, string>();
		const photos = photoLines(
			await changeOrders.reportPhotos(tx, job.id),
			await changeOrders.liveFoundItems(tx, row.reportId)
		);
		const customer = await customers.read(tx, job.customerId);
		return {
			job: {
				id: job.id,
				number: job.number,
				title: job.title,
				status: job.status,
				customerName: job.customerName,
				installerName: job.installerName
			},
			customerEmail: customer?.email ?? '',
			changeOrder: deskChangeOrder(row, rooms, seesCosts(grants)),
			photos,
			canSend: can(grants, { changeOrder: ['approve'] })
		};
	});
};

export const actions: Actions = {
	adjust: async ({ request, params }) => {
		const member = requirePermission({ changeOrder: ['review'] });
		await requireJob(member, params.id);
		const form = await request.formData();
		const result = await inStore(member.store.id, async (tx) => {
			const row = await changeOrders.readByNumber(tx, params.id, numberOf(params.number));
			if (!row) return { ok: false, reason: 'not_found' } as const;
			// Amounts are read in the change order's own currency.
			const fields = readFields(form);
			if (!fields.ok)
				return { ok: false, reason: 'invalid', failure: refuse(form, {}, fields.message) } as const;
			const parsed = adjustSchema(row.currency).safeParse(fields.value);
			if (!parsed.success)
				return {
					ok: false,
					reason: 'invalid',
					failure: refuse(form, fieldErrors(parsed.error))
				} as const;
			return adjustChangeOrder(tx, params.id, row.id, parsed.data.adjustments);
		});
		if (!result.ok && result.reason === 'not_found') error(404, 'Not found');
		if (!result.ok && result.reason === 'invalid') return result.failure;
		if (!result.ok) return fail(409, { message: REFUSED[result.reason] });
		return { adjusted: true };
	},
	send: async ({ request, params }) => {
		const member = requirePermission({ changeOrder: ['approve'] });
		await requireJob(member, params.id);
		const parsed = await parseForm(request, sendChangeOrderSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await inStore(member.store.id, async (tx) => {
			const row = await changeOrders.readByNumber(tx, params.id, numberOf(params.number));
			if (!row) return { ok: false, reason: 'not_found' } as const;
			return sendChangeOrder(tx, params.id, row.id, {
				to: parsed.data.to,
				actorId: member.user.id
			});
		});
		if (!result.ok && result.reason === 'not_found') error(404, 'Not found');
		if (!result.ok) return fail(409, { message: REFUSED[result.reason] });
		return { sent: true };
	},
	decline: async ({ request, params }) => {
		const member = requirePermission({ changeOrder: ['review'] });
		await requireJob(member, params.id);
		const parsed = await parseForm(request, managerDeclineSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await inStore(member.store.id, async (tx) => {
			const row = await changeOrders.readByNumber(tx, params.id, numberOf(params.number));
			if (!row) return { ok: false, reason: 'not_found' } as const;
			return declineChangeOrder(tx, params.id, row.id, {
				reason: parsed.data.reason,
				actorId: member.user.id
			});
		});
		if (!result.ok && result.reason === 'not_found') error(404, 'Not found');
		if (!result.ok) return fail(409, { message: REFUSED[result.reason] });
		return { declined: true };
	}
};
