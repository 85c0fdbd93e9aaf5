import { canQuote } from '$lib/jobs/status';
import * as jobs from '../db/queries/jobs';
import * as quotes from '../db/queries/quotes';
import type { StoreWriteTx } from '../db/tenant';
import { queueMail } from '../mail/queue';
import { quoteMailFor } from './mail';

export type SendResult =
	| { ok: true; quote: quotes.Quote }
	| { ok: false; reason: 'not_found' | 'not_draft' | 'job_moved_on' };

/**
 * Sends a draft version: it is frozen from now on, earlier versions are superseded, a draft job
 * becomes quoted, and the e-mail to the customer is queued, all in the caller's transaction.
 */
export async function sendQuote(
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
	if (status === 'draft') {
		await jobs.move(
			tx,
			q.jobId,
			'quoted',
			options.actorId,
			`Quote version ${q.version} sent to ${options.to}`
		);
	}
	await queueMail(tx, 'quote', await quoteMailFor(tx, sent, options.to), {
		jobId: q.jobId,
		createdBy: options.actorId
	});
	return { ok: true, quote: sent };
}

/** E-mails the customer a fresh link to a quote already sent; undefined when it is not the job's. */
export async function resendQuoteLink(
	tx: StoreWriteTx,
	jobId: string,
	quoteId: string,
	to: string,
	actorId: string
): Promise<'queued' | 'not_found' | 'draft'> {
	const quote = await quotes.read(tx, quoteId);
	if (!quote || quote.jobId !== jobId) return 'not_found';
	if (quote.status === 'draft') return 'draft';
	await queueMail(tx, 'quote-link', await quoteMailFor(tx, quote, to), {
		jobId,
		createdBy: actorId
	});
	return 'queued';
}
