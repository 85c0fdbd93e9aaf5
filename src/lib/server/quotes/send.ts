import * as quotes from '../db/queries/quotes';
import type { StoreWriteTx } from '../db/tenant';
import { queueMail } from '../mail/queue';
import { freezeQuote, type SendResult } from './freeze';
import { quoteMailFor } from './mail';

export type { SendResult };

/**
 * Sends a draft version: it is frozen from now on, earlier versions are superseded, a draft job
 * becomes quoted, and the e-mail to the customer is queued, all in the caller's transaction.
 */
export async function sendQuote(
	tx: StoreWriteTx,
	quoteId: string,
	options: { to: string; validDays: number; actorId: string }
): Promise<SendResult> {
	const frozen = await freezeQuote(tx, quoteId, options);
	if (!frozen.ok) return frozen;
	await queueMail(tx, 'quote', await quoteMailFor(tx, frozen.quote, options.to), {
		jobId: frozen.quote.jobId,
		createdBy: options.actorId
	});
	return frozen;
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
