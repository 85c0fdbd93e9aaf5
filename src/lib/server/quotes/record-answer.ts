import { canMove, type JobStatus } from '$lib/jobs/status';
import * as jobs from '../db/queries/jobs';
import * as quotes from '../db/queries/quotes';
import type { StoreWriteTx } from '../db/tenant';

export type CustomerAnswer =
	| { ok: true; quote: quotes.Quote }
	| { ok: false; reason: 'not_found' | 'not_open' | 'expired' | 'withdrawn' };

/**
 * The sent version the customer answers, locked: refused when answered, replaced, expired, or
 * withdrawn by the store (a cancelled job withdraws it; a job the answer cannot move is refused
 * the same way, never half-answered).
 */
async function openQuote(tx: StoreWriteTx, quoteId: string, jobId: string, to: JobStatus) {
	const status = await jobs.lockStatus(tx, jobId);
	const q = await quotes.lock(tx, quoteId, jobId);
	if (!q || !status) return { ok: false, reason: 'not_found' } as const;
	if (q.status === 'withdrawn' || (q.status === 'sent' && !canMove(status, to))) {
		return { ok: false, reason: 'withdrawn' } as const;
	}
	if (q.status !== 'sent') return { ok: false, reason: 'not_open' } as const;
	if (q.validUntil && q.validUntil < new Date()) return { ok: false, reason: 'expired' } as const;
	return { ok: true, quote: q } as const;
}

/**
 * What the customer's acceptance does to the data: the version is accepted under the name typed
 * and the job becomes accepted. `acceptQuote` (./answer.ts) does this and tells the salesperson.
 */
export async function recordAcceptance(
	tx: StoreWriteTx,
	jobId: string,
	quoteId: string,
	signature: { name: string; ip: string | null; userAgent: string | null }
): Promise<CustomerAnswer> {
	const open = await openQuote(tx, quoteId, jobId, 'accepted');
	if (!open.ok) return open;
	const accepted = await quotes.update(tx, quoteId, {
		status: 'accepted',
		acceptedAt: new Date(),
		acceptedName: signature.name,
		acceptedIp: signature.ip,
		acceptedUserAgent: signature.userAgent
	});
	const moved = await jobs.move(
		tx,
		jobId,
		'accepted',
		null,
		`Accepted by ${signature.name} (version ${accepted.version})`
	);
	if (!moved.ok) throw new Error(`job ${jobId} could not become accepted: ${moved.reason}`);
	return { ok: true, quote: accepted };
}

/** What asking for changes does to the data: the note is kept and the job goes back to draft. */
export async function recordChangeRequest(
	tx: StoreWriteTx,
	jobId: string,
	quoteId: string,
	note: string
): Promise<CustomerAnswer> {
	const open = await openQuote(tx, quoteId, jobId, 'draft');
	if (!open.ok) return open;
	const asked = await quotes.update(tx, quoteId, {
		status: 'changes_requested',
		changeNote: note,
		changeRequestedAt: new Date()
	});
	await jobs.move(tx, jobId, 'draft', null, `Customer asked for changes: ${note}`);
	return { ok: true, quote: asked };
}
