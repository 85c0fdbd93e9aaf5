import { handMove, type JobStatus, type MoveFacts } from '$lib/jobs/status';
import * as completions from '../db/queries/completions';
import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import * as quotes from '../db/queries/quotes';
import type { StoreTx, StoreWriteTx } from '../db/tenant';

export type HandMoveResult =
	| { ok: true; job: jobs.Job }
	| { ok: false; reason: 'not_found' }
	| { ok: false; reason: 'refused'; message: string };

/** What `handMove` checks, from what was read of a job: one reading for a move and the job page. */
export function factsFrom(read: {
	quoteStatuses: readonly quotes.QuoteStatus[];
	ledger: { depositDueCents: number; balanceDueCents: number };
	booked: boolean;
	completion: { signedAt: Date | null } | undefined;
}): MoveFacts {
	return {
		quoteSent: read.quoteStatuses.includes('sent'),
		quoteAccepted: read.quoteStatuses.includes('accepted'),
		depositDue: read.ledger.depositDueCents > 0,
		balanceDue: read.ledger.balanceDueCents > 0,
		booked: read.booked,
		signedOff: read.completion ? Boolean(read.completion.signedAt) : undefined
	};
}

/** What `handMove` needs to know about a job, read in the caller's transaction. */
export async function moveFacts(tx: StoreTx, jobId: string): Promise<MoveFacts> {
	return factsFrom({
		quoteStatuses: await quotes.statusesOf(tx, jobId),
		ledger: (await payments.moneyFor(tx, jobId)).ledger,
		booked: await jobs.isBooked(tx, jobId),
		completion: await completions.read(tx, jobId)
	});
}

/**
 * A move staff make by hand (the job page, the API): only the steps the state rules allow with
 * what the job has (`handMove`). Cancelling the job, or taking a quoted job back to draft, withdraws
 * the quote still before the customer, so the customer's link says so and nothing can answer it.
 */
export async function moveByHand(
	tx: StoreWriteTx,
	jobId: string,
	to: JobStatus,
	actorId: string,
	note = ''
): Promise<HandMoveResult> {
	const from = await jobs.lockStatus(tx, jobId);
	if (!from) return { ok: false, reason: 'not_found' };
	const check = handMove(from, to, await moveFacts(tx, jobId));
	if (!check.ok) return { ok: false, reason: 'refused', message: check.message };
	if (to === 'cancelled' || to === 'draft') await quotes.withdrawOpen(tx, jobId);
	const moved = await jobs.move(tx, jobId, to, actorId, note);
	if (!moved.ok)
		return moved.reason === 'not_found'
			? moved
			: { ok: false, reason: 'refused', message: `A job cannot become ${to} now.` };
	return moved;
}
