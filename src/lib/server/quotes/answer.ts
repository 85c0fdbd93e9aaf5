import type { StoreWriteTx } from '../db/tenant';
import { queueMail } from '../mail/queue';
import { answerMailFor } from './mail';
import { recordAcceptance, recordChangeRequest, type CustomerAnswer } from './record-answer';

export type { CustomerAnswer };

/** Tells the job's salesperson what the customer did, when the job has one with an e-mail. */
async function tellSalesperson(
	tx: StoreWriteTx,
	jobId: string,
	answer: 'accepted' | 'changes',
	note?: string
) {
	const mail = await answerMailFor(tx, jobId, answer, note);
	if (mail) await queueMail(tx, 'customer-answer', mail, { jobId });
}

/**
 * The customer accepts a sent version by typing their name; the job becomes accepted and the
 * salesperson is told.
 */
export async function acceptQuote(
	tx: StoreWriteTx,
	jobId: string,
	quoteId: string,
	signature: { name: string; ip: string | null; userAgent: string | null }
): Promise<CustomerAnswer> {
	const answer = await recordAcceptance(tx, jobId, quoteId, signature);
	if (answer.ok) await tellSalesperson(tx, jobId, 'accepted');
	return answer;
}

/**
 * The customer asks for changes with a note; the job goes back to draft for the next version, and
 * the salesperson is told.
 */
export async function requestChanges(
	tx: StoreWriteTx,
	jobId: string,
	quoteId: string,
	note: string
): Promise<CustomerAnswer> {
	const answer = await recordChangeRequest(tx, jobId, quoteId, note);
	if (answer.ok) await tellSalesperson(tx, jobId, 'changes', note);
	return answer;
}
