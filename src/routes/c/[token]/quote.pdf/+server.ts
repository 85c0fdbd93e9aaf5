import { resolveLink } from '$lib/server/customer-page';
import * as quotes from '$lib/server/db/queries/quotes';
import { pdfOf, pdfResponse } from '$lib/server/quote-service';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The quote the customer's link shows, as PDF. */
export const GET: RequestHandler = async ({ params }) => {
	const { store, job } = await resolveLink(params.token);
	const quote = await quotes.forCustomer(store.id, job.id);
	if (!quote) error(404, 'There is no quote to show yet.');
	const bytes = await pdfOf(store, quote);
	return pdfResponse(bytes, `quote-${quote.version}.pdf`);
};
