import { jobLabel } from '$lib/jobs/status';
import { customerQuote } from '$lib/papers/customer-quote';
import { papersOf } from '$lib/papers/store-papers';
import * as customers from '../db/queries/customers';
import * as jobs from '../db/queries/jobs';
import type * as quotes from '../db/queries/quotes';
import * as sites from '../db/queries/sites';
import { readProfile, readStore } from '../db/queries/stores';
import type { StoreTx } from '../db/tenant';
import { readLogo } from '../logo';
import type { QuotePdfInput } from '../pdf/quote-pdf';

/**
 * What the quote's PDF shows: the store's details (and logo, when it has one), the customer and
 * the site, read in the caller's transaction; `quotePdf` draws it once the transaction is done.
 */
export async function quotePdfInput(tx: StoreTx, quote: quotes.Quote): Promise<QuotePdfInput> {
	const store = await readStore(tx);
	const job = await jobs.readForStore(tx, quote.jobId);
	if (!store || !job) throw new Error('quote without its store or job');
	const profile = await readProfile(tx);
	const customer = await customers.read(tx, job.customerId);
	const site = job.siteId ? await sites.read(tx, job.siteId) : undefined;
	const logo = await readLogo(tx);
	return {
		store: {
			name: store.name,
			timeZone: store.timeZone,
			address: profile.address,
			town: profile.town,
			phone: profile.phone,
			email: profile.email
		},
		logo:
			logo && (logo.type === 'image/png' || logo.type === 'image/jpeg')
				? { bytes: new Uint8Array(logo.bytes), type: logo.type }
				: undefined,
		customer: {
			name: job.customerName,
			email: customer?.email ?? null,
			phone: customer?.phone ?? null
		},
		site: site ? { address: site.address, town: site.town } : null,
		job: { label: jobLabel(job.number), title: job.title },
		version: quote.version,
		status: quote.status,
		issuedAt: quote.sentAt ?? quote.updatedAt,
		validUntil: quote.validUntil,
		accepted:
			quote.acceptedAt && quote.acceptedName
				? { name: quote.acceptedName, at: quote.acceptedAt }
				: null,
		// The customer's papers, as the link's page shows them.
		quote: customerQuote(quote, {
			currency: quote.currency,
			// The units the quote was built in, as stored with it.
			metric: quote.input.settings.units.system === 'metric',
			papers: papersOf({
				nextSteps: profile.papersNextSteps,
				cancellation: profile.papersCancellation,
				terms: profile.papersTerms
			})
		})
	};
}

/** A quote PDF as the answer to a request: shown in the browser, never cached by others. */
export function pdfResponse(bytes: Uint8Array, filename: string) {
	return new Response(Buffer.from(bytes), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `inline; filename="${filename}"`,
			'cache-control': 'private, no-store'
		}
	});
}
