import { changeOrderLabel } from '$lib/jobs/change-order-status';
import { jobLabel } from '$lib/jobs/status';
import { config } from '../config';
import * as changeOrders from '../db/queries/change-orders';
import * as jobs from '../db/queries/jobs';
import { emailOf, readStore } from '../db/queries/stores';
import type { StoreWriteTx } from '../db/tenant';
import { queueMail } from '../mail/queue';
import { changeOrderAnswerMail } from '../mail/templates';

/** Tells the manager who sent it (or else the job's salesperson) what the customer decided. */
async function tellStore(tx: StoreWriteTx, row: changeOrders.ChangeOrderRow) {
	const store = await readStore(tx);
	const job = await jobs.readForStore(tx, row.jobId);
	if (!store || !job) return;
	const to = (await emailOf(tx, row.reviewedBy)) ?? (await emailOf(tx, job.salespersonId));
	if (!to) return;
	await queueMail(
		tx,
		'change-order-answer',
		changeOrderAnswerMail({
			to,
			storeName: store.name,
			customerName: job.customerName,
			jobLabel: jobLabel(job.number),
			jobTitle: job.title,
			changeLabel: changeOrderLabel(row.number),
			answer: row.status === 'approved' ? 'approved' : 'declined',
			reason: row.declineReason || undefined,
			url: `${config.origin}/app/jobs/${job.id}/change-orders/${row.number}`
		}),
		{ jobId: job.id }
	);
}

export type CustomerDecision =
	| { ok: true; changeOrder: changeOrders.ChangeOrderRow }
	| { ok: false; reason: 'not_found' | 'not_open' };

interface Signature {
	ip: string | null;
	userAgent: string | null;
}

/** The change order the customer is deciding on, locked: only one sent and not yet decided. */
async function lockWithCustomer(tx: StoreWriteTx, jobId: string, id: string) {
	const row = await changeOrders.lock(tx, jobId, id);
	if (!row) return { ok: false, reason: 'not_found' } as const;
	if (row.status !== 'reviewed') return { ok: false, reason: 'not_open' } as const;
	return { ok: true, row } as const;
}

/**
 * The customer approves a change order sent to them by typing their name (kept with the time,
 * address and browser, as for the quote). Once decided it is never decided again: the lock and
 * the state check answer a second click, and the database trigger refuses it besides.
 */
export async function approveChangeOrder(
	tx: StoreWriteTx,
	jobId: string,
	id: string,
	signature: Signature & { name: string }
): Promise<CustomerDecision> {
	const locked = await lockWithCustomer(tx, jobId, id);
	if (!locked.ok) return locked;
	const row = await changeOrders.update(tx, id, {
		status: 'approved',
		decidedAt: new Date(),
		decidedName: signature.name,
		decidedIp: signature.ip,
		decidedUserAgent: signature.userAgent
	});
	if (!row) return { ok: false, reason: 'not_found' };
	await tellStore(tx, row);
	return { ok: true, changeOrder: row };
}

/** The customer declines a change order sent to them, with a reason if they give one. */
export async function customerDeclinesChangeOrder(
	tx: StoreWriteTx,
	jobId: string,
	id: string,
	signature: Signature & { reason: string }
): Promise<CustomerDecision> {
	const locked = await lockWithCustomer(tx, jobId, id);
	if (!locked.ok) return locked;
	const row = await changeOrders.update(tx, id, {
		status: 'declined',
		declineReason: signature.reason,
		decidedAt: new Date(),
		decidedIp: signature.ip,
		decidedUserAgent: signature.userAgent
	});
	if (!row) return { ok: false, reason: 'not_found' };
	await tellStore(tx, row);
	return { ok: true, changeOrder: row };
}
