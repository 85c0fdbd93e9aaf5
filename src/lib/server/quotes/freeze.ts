import { canMove, canQuote } from '$lib/jobs/status';
import * as jobs from '../db/queries/jobs';
import * as quotes from '../db/queries/quotes';
import type { StoreWriteTx } from '../db/tenant';

export type SendResult =
	| { ok: true; quote: quotes.Quote }
	| { ok: false; reason: 'not_found' | 'not_draft' | 'job_moved_on' };

/**
 * What sending a draft version does to the data: it is frozen from now on, earlier versions are
 * superseded, and a draft job becomes quoted. `sendQuote` (./send.ts) does this and e-mails it;
 * the demo seed only this, so its made-up customers get no e-mail.
 */
export async function freezeQuote(
	tx: StoreWriteTx,
	quoteId: string,
	options: { to: string; validDays: number; actorId: string }
): Promise<SendResult> {
	const q = await quotes.lock(tx, quoteId);
	if (!q) return { ok: false, reason: 'not_found' };
	if (q.status !== 'draft') return { ok: false, reason: 'not_draft' };
	const status = await jobs.lockStatus(tx, q.jobId);
	if (!status || !canQuote(status)) return { ok: false, reason: 'job_moved_on' };
	await quotes.supersedeOthers(tx, q.jobId, q.id);
	const now = new Date();
	const sent = await quotes.update(tx, q.id, {
		status: 'sent',
		sentAt: now,
		sentTo: options.to,
		validUntil: new Date(now.getTime() + options.validDays * 86_400_000)
	});
	// A draft job becomes quoted; one already quoted (a newer version) stays so.
	if (canMove(status, 'quoted')) {
		await jobs.move(
			tx,
			q.jobId,
			'quoted',
			options.actorId,
			`Quote version ${q.version} sent to ${options.to}`
		);
	}
	return { ok: true, quote: sent };
}
