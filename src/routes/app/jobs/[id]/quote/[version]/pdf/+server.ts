import * as jobs from '$lib/server/db/queries/jobs';
import * as quotes from '$lib/server/db/queries/quotes';
import { requirePermission } from '$lib/server/guards';
import { pdfOf, pdfResponse } from '$lib/server/quote-service';
import { jobLabel } from '$lib/jobs/status';
import { QUOTE_VERSION, readNumber } from '$lib/input';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** A version of the job's quote as PDF, for store staff. */
export const GET: RequestHandler = async ({ params }) => {
	const { store, scope } = requirePermission({ quote: ['read'] });
	const job = await jobs.read(store.id, params.id, scope);
	const version = readNumber(params.version, QUOTE_VERSION);
	const quote =
		job && version.ok ? await quotes.readVersion(store.id, job.id, version.value) : undefined;
	if (!job || !quote) error(404, 'Not found');
	const bytes = await pdfOf(store, quote);
	return pdfResponse(bytes, `${jobLabel(job.number)}-quote-v${quote.version}.pdf`);
};
