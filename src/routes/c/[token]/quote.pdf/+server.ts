import { linkedJob, openLink } from '$lib/server/customer-page';
import * as quotes from '$lib/server/db/queries/quotes';
import { readInStore } from '$lib/server/db/tenant';
import { quotePdf } from '$lib/server/pdf/quote-pdf';
import { pdfResponse, quotePdfInput } from '$lib/server/quotes/pdf';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The quote the customer's link shows, as PDF. */
export const GET: RequestHandler = async ({ params }) => {
	const link = openLink(params.token);
	const found = await readInStore(link.storeId, async (tx) => {
		const { job } = await linkedJob(tx, link);
		const quote = await quotes.forCustomer(tx, job.id);
		if (!quote) error(404, 'There is no quote to show yet.');
		return { input: await quotePdfInput(tx, quote), version: quote.version };
	});
	return pdfResponse(await quotePdf(found.input), `quote-${found.version}.pdf`);
};
