import { config } from './config';
import { signLink } from './customer-link';
import * as customers from './db/queries/customers';
import * as jobs from './db/queries/jobs';
import { WHOLE_STORE } from './db/queries/access';
import * as quotes from './db/queries/quotes';
import * as tradeSettings from './db/queries/settings';
import * as sites from './db/queries/sites';
import { readProfile } from './db/queries/stores';
import { readLogo } from './logo';
import { mailer } from './mail';
import { quoteMail } from './mail/templates';
import { quotePdf } from './pdf/quote-pdf';
import { jobLabel } from '../jobs/status';
import { formatMoney } from '../format';
import { quoteView } from '../quote-view';

/** How long a customer's link works; every e-mail carries a fresh one. */
export const LINK_DAYS = 90;

/** The customer's link to a job: `/c/<token>`, signed, expiring. */
export function customerLink(storeId: string, jobId: string, now = new Date()) {
	const token = signLink(
		{ storeId, jobId, expiresAt: new Date(now.getTime() + LINK_DAYS * 86_400_000) },
		config.authSecret
	);
	return `${config.origin}/c/${token}`;
}

/** The store as locals and customer links carry it: its time zone dates the e-mail and PDF. */
type Store = { id: string; name: string; timeZone: string };

/** E-mails a sent quote to the customer, from the store, with a fresh link. */
export async function mailQuote(store: Store, quote: quotes.Quote, to: string) {
	const [job, profile] = await Promise.all([
		jobs.read(store.id, quote.jobId, WHOLE_STORE),
		readProfile(store.id)
	]);
	if (!job) throw new Error('quote without its job');
	await mailer(
		quoteMail({
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
			url: customerLink(store.id, job.id)
		})
	);
}

/** The quote's PDF with the store's details (and logo, when it has one). */
export async function pdfOf(store: Store, quote: quotes.Quote) {
	const [job, profile, trade] = await Promise.all([
		jobs.read(store.id, quote.jobId, WHOLE_STORE),
		readProfile(store.id),
		tradeSettings.read(store.id)
	]);
	if (!job) throw new Error('quote without its job');
	const [customer, site, logo] = await Promise.all([
		customers.read(store.id, job.customerId),
		job.siteId ? sites.read(store.id, job.siteId) : Promise.resolve(undefined),
		readLogo(store.id)
	]);
	return quotePdf({
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
		quote: quoteView(quote.result, {
			currency: quote.currency,
			metric: trade.settings.units.system === 'metric'
		})
	});
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
