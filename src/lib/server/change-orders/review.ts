import { formatMoney } from '$lib/format';
import { changeOrderLabel } from '$lib/jobs/change-order-status';
import { jobLabel } from '$lib/jobs/status';
import { customerLink } from '../customer-page';
import * as changeOrders from '../db/queries/change-orders';
import * as jobs from '../db/queries/jobs';
import * as quotes from '../db/queries/quotes';
import { readProfile, readStore } from '../db/queries/stores';
import type { ChangeOrderAdjustment } from '../db/schema';
import type { StoreWriteTx } from '../db/tenant';
import { queueMail } from '../mail/queue';
import { changeOrderMail } from '../mail/templates';
import { changeOrderFigures } from './figures';
import { customerChangeOrder, roomNamesOf } from './view';

export type ReviewResult =
	| { ok: true; changeOrder: changeOrders.ChangeOrderRow }
	| { ok: false; reason: 'not_found' | 'not_submitted' | 'nothing_to_send' };

/** The job's change order, locked, while it is still the manager's to change. */
async function lockSubmitted(tx: StoreWriteTx, jobId: string, id: string) {
	const row = await changeOrders.lock(tx, jobId, id);
	if (!row) return { ok: false, reason: 'not_found' } as const;
	if (row.status !== 'submitted') return { ok: false, reason: 'not_submitted' } as const;
	return { ok: true, row } as const;
}

/**
 * Replaces a submitted change order's adjustments (a manager's lines with a description) and
 * works its figures out again from the engine's result and the settings stored with it.
 */
export async function adjustChangeOrder(
	tx: StoreWriteTx,
	jobId: string,
	id: string,
	adjustments: ChangeOrderAdjustment[]
): Promise<ReviewResult> {
	const locked = await lockSubmitted(tx, jobId, id);
	if (!locked.ok) return locked;
	const figures = changeOrderFigures(locked.row.result, adjustments, locked.row.input.settings);
	const row = await changeOrders.update(tx, id, { adjustments, ...figures });
	return row ? { ok: true, changeOrder: row } : { ok: false, reason: 'not_found' };
}

/**
 * Sends a submitted change order to the customer: it becomes `reviewed` (its figures frozen from
 * now on, by the database) and the e-mail with the customer's link is queued in this transaction.
 */
export async function sendChangeOrder(
	tx: StoreWriteTx,
	jobId: string,
	id: string,
	options: { to: string; actorId: string }
): Promise<ReviewResult> {
	const locked = await lockSubmitted(tx, jobId, id);
	if (!locked.ok) return locked;
	// A change order that came to nothing after adjustments is declined, not sent.
	if (locked.row.totalCents === 0 && locked.row.payDeltaCents === 0) {
		return { ok: false, reason: 'nothing_to_send' };
	}
	const store = await readStore(tx);
	const job = await jobs.readForStore(tx, jobId);
	if (!store || !job) return { ok: false, reason: 'not_found' };
	const now = new Date();
	const row = await changeOrders.update(tx, id, {
		status: 'reviewed',
		reviewedAt: now,
		reviewedBy: options.actorId,
		sentAt: now,
		sentTo: options.to
	});
	if (!row) return { ok: false, reason: 'not_found' };
	const profile = await readProfile(tx);
	const url = await customerLink(tx, jobId);
	const accepted = await quotes.accepted(tx, jobId);
	// The items in the words the customer's page shows them in, with the same amounts.
	const shown = customerChangeOrder(row, accepted ? roomNamesOf(accepted) : new Map());
	const money = (cents: number) => formatMoney(cents, row.currency);
	await queueMail(
		tx,
		'change-order',
		changeOrderMail({
			to: options.to,
			storeName: store.name,
			storePhone: profile.phone,
			replyTo: profile.email,
			customerName: job.customerName,
			jobLabel: jobLabel(job.number),
			jobTitle: job.title,
			changeLabel: changeOrderLabel(row.number),
			totalCents: row.totalCents,
			total: formatMoney(Math.abs(row.totalCents), row.currency),
			url,
			logoUrl: profile.logoKey ? `${url}/logo` : undefined,
			items: [
				...shown.lines
					.filter((l) => l.deltaCents !== 0)
					.map((l): [string, string] => [l.description, money(l.deltaCents)]),
				...shown.adjustments.map((a): [string, string] => [a.description, money(a.amountCents)]),
				...(shown.taxCents ? [['Tax', money(shown.taxCents)] as [string, string]] : [])
			]
		}),
		{ jobId, createdBy: options.actorId }
	);
	return { ok: true, changeOrder: row };
}

/** A manager declines a submitted change order, with the reason (required). */
export async function declineChangeOrder(
	tx: StoreWriteTx,
	jobId: string,
	id: string,
	options: { reason: string; actorId: string }
): Promise<ReviewResult> {
	const locked = await lockSubmitted(tx, jobId, id);
	if (!locked.ok) return locked;
	const row = await changeOrders.update(tx, id, {
		status: 'declined',
		declineReason: options.reason,
		declinedBy: options.actorId,
		reviewedAt: new Date(),
		reviewedBy: options.actorId
	});
	return row ? { ok: true, changeOrder: row } : { ok: false, reason: 'not_found' };
}
