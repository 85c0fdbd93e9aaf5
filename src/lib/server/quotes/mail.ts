import { formatMoney } from '$lib/format';
import { jobLabel } from '$lib/jobs/status';
import { papersOf } from '$lib/papers/store-papers';
import { config } from '../config';
import { customerLink } from '../customer-page';
import * as jobs from '../db/queries/jobs';
import type * as quotes from '../db/queries/quotes';
import { emailOf, readProfile, readStore } from '../db/queries/stores';
import type { StoreTx } from '../db/tenant';
import { customerAnswerMail, quoteMail, type Mail } from '../mail/templates';

/** The e-mail that carries a sent quote to the customer, from the store, with a fresh link. */
export async function quoteMailFor(tx: StoreTx, quote: quotes.Quote, to: string): Promise<Mail> {
	const store = await readStore(tx);
	const job = await jobs.readForStore(tx, quote.jobId);
	if (!store || !job) throw new Error('quote without its store or job');
	const profile = await readProfile(tx);
	const url = await customerLink(tx, job.id);
	return quoteMail({
		to,
		storeName: store.name,
		storePhone: profile.phone,
		replyTo: profile.email,
		customerName: job.customerName,
		jobTitle: job.title,
		total: formatMoney(quote.totalCents, quote.currency),
		deposit: formatMoney(quote.depositCents, quote.currency),
		validUntil: quote.validUntil ?? new Date(),
		timeZone: store.timeZone,
		url,
		logoUrl: profile.logoKey ? `${url}/logo` : undefined,
		// The quote's page says the same under "What happens next".
		nextSteps: papersOf({ nextSteps: profile.papersNextSteps }).nextSteps
	});
}

/**
 * What the customer did with the quote, for the job's salesperson; null when the job has no
 * salesperson with an e-mail.
 */
export async function answerMailFor(
	tx: StoreTx,
	jobId: string,
	answer: 'accepted' | 'changes',
	note?: string
): Promise<Mail | null> {
	const store = await readStore(tx);
	const job = await jobs.readForStore(tx, jobId);
	if (!store || !job) return null;
	const seller = await emailOf(tx, job.salespersonId);
	if (!seller) return null;
	return customerAnswerMail({
		to: seller,
		storeName: store.name,
		customerName: job.customerName,
		jobLabel: jobLabel(job.number),
		jobTitle: job.title,
		answer,
		note,
		url: `${config.origin}/app/jobs/${job.id}/quote`
	});
}
