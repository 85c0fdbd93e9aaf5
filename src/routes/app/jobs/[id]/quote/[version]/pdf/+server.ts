import * as jobs from '$lib/server/db/queries/jobs';
import * as quotes from '$lib/server/db/queries/quotes';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { quotePdf } from '$lib/server/pdf/quote-pdf';
import { pdfResponse, quotePdfInput } from '$lib/server/quotes/pdf';
import { jobLabel } from '$lib/jobs/status';
import { QUOTE_VERSION, readNumber } from '$lib/input';
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** A version of the job's quote as PDF, for store staff. */
export const GET: RequestHandler = async ({ params }) => {
	const { store, scope } = requirePermission({ quote: ['read'] });
	const version = readNumber(params.version, QUOTE_VERSION);
	const made = await readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		const quote =
			job && version.ok ? await quotes.readVersion(tx, job.id, version.value) : undefined;
		if (!job || !quote) error(404, 'Not found');
		return {
			input: await quotePdfInput(tx, quote),
			name: `${jobLabel(job.number)}-quote-v${quote.version}`
		};
	});
	return pdfResponse(await quotePdf(made.input), `${made.name}.pdf`);
};
