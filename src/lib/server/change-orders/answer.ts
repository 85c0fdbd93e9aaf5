import * as changeOrders from '../db/queries/change-orders';
import type { StoreWriteTx } from '../db/tenant';

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
	return row ? { ok: true, changeOrder: row } : { ok: false, reason: 'not_found' };
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
	return row ? { ok: true, changeOrder: row } : { ok: false, reason: 'not_found' };
}
