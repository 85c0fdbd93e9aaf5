import { canSignOff } from '$lib/jobs/status';
import * as completions from '../db/queries/completions';
import * as jobs from '../db/queries/jobs';
import type { StoreWriteTx } from '../db/tenant';
import { balanceRequested, requestBalance } from './balance';

export type SignOffResult =
	| { ok: true; completion: completions.Completion; balanceRequested: boolean }
	| { ok: false; reason: 'not_found' | 'not_completed' | 'already_signed' };

/**
 * The customer signs off a completed job by typing their name; the time, address and browser
 * are kept with it, as for the quote's acceptance. Once signed the database keeps it as it is, so
 * it is signed once. The balance e-mail goes with it if the completion did not send one.
 */
export async function signOff(
	tx: StoreWriteTx,
	jobId: string,
	signature: { name: string; ip: string | null; userAgent: string | null }
): Promise<SignOffResult> {
	const status = await jobs.lockStatus(tx, jobId);
	if (!status) return { ok: false, reason: 'not_found' };
	if (!canSignOff(status)) return { ok: false, reason: 'not_completed' };
	const completion = await completions.lock(tx, jobId);
	if (!completion) return { ok: false, reason: 'not_completed' };
	if (completion.signedAt) return { ok: false, reason: 'already_signed' };
	const signed = await completions.sign(tx, completion.id, { ...signature, at: new Date() });
	if (!signed) return { ok: false, reason: 'not_found' };
	let requested = await balanceRequested(tx, jobId);
	if (!requested) requested = (await requestBalance(tx, jobId)).queued;
	return { ok: true, completion: signed, balanceRequested: requested };
}
