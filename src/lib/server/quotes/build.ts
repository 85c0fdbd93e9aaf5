import { estimate, type EstimateInput } from '$lib/estimating';
import { canQuote } from '$lib/jobs/status';
import { toEngine, type DraftError } from '$lib/measure/draft';
import * as jobs from '../db/queries/jobs';
import * as measures from '../db/queries/measures';
import { priceBookFor } from '../db/queries/price-book';
import * as quotes from '../db/queries/quotes';
import * as tradeSettings from '../db/queries/settings';
import { InvalidStoreSettings } from '../db/queries/settings';
import type { StoreTx, StoreWriteTx } from '../db/tenant';

export type BuildResult =
	| { ok: true; quote: quotes.Quote }
	| { ok: false; reason: 'not_found' | 'no_measure' | 'closed' | 'settings' }
	| { ok: false; reason: 'invalid'; errors: DraftError[] };

/** The whole input of a quote: the job's measure, the store's settings and a copy of its prices. */
async function inputFor(tx: StoreTx, jobId: string) {
	const stored = await measures.read(tx, jobId);
	if (!stored) return { missing: true as const };
	let trade: tradeSettings.StoreTradeSettings;
	try {
		trade = await tradeSettings.read(tx);
	} catch (e) {
		// Never priced with the engine's defaults instead of what the store saved.
		if (e instanceof InvalidStoreSettings) return { invalidSettings: true as const };
		throw e;
	}
	const priceBook = await priceBookFor(tx, trade.currency);
	const read = toEngine(stored.draft, trade.settings);
	const input: EstimateInput = { job: read.job, settings: trade.settings, priceBook };
	return { input, draftErrors: read.errors, trade };
}

/**
 * Builds (or rebuilds) the draft version of a job's quote from its measure and today's price
 * book. A draft is replaced; when the newest version was already sent, this makes the next
 * version. Nothing is written while any field of the measure or any room cannot be priced.
 */
export async function buildQuote(
	tx: StoreWriteTx,
	jobId: string,
	userId: string
): Promise<BuildResult> {
	const prepared = await inputFor(tx, jobId);
	if ('missing' in prepared) return { ok: false, reason: 'no_measure' };
	if ('invalidSettings' in prepared) return { ok: false, reason: 'settings' };
	const { input, draftErrors, trade } = prepared;
	if (draftErrors.length) return { ok: false, reason: 'invalid', errors: draftErrors };
	if (input.job.rooms.length === 0) {
		return {
			ok: false,
			reason: 'invalid',
			errors: [{ path: 'rooms', message: 'Measure at least one room first' }]
		};
	}
	const result = estimate(input);
	if (!result.ok) {
		return {
			ok: false,
			reason: 'invalid',
			errors: result.errors.map((e) => ({
				path: e.path.replace(/^job\./, ''),
				roomId: e.roomId,
				message: e.message
			}))
		};
	}
	const status = await jobs.lockStatus(tx, jobId);
	if (!status) return { ok: false, reason: 'not_found' };
	if (!canQuote(status)) return { ok: false, reason: 'closed' };
	const latest = await quotes.latest(tx, jobId);
	const values = {
		input,
		result,
		currency: trade.currency,
		subtotalCents: result.totals.subtotalCents,
		taxCents: result.totals.taxCents,
		totalCents: result.totals.totalCents,
		depositCents: result.totals.depositCents,
		createdBy: userId
	};
	if (latest?.status === 'draft') {
		return { ok: true, quote: await quotes.update(tx, latest.id, values) };
	}
	const quote = await quotes.insert(tx, { ...values, jobId, version: (latest?.version ?? 0) + 1 });
	return { ok: true, quote };
}

/** The estimate the job's measure gives today, without saving anything (a preview). */
export async function previewQuote(tx: StoreTx, jobId: string) {
	const prepared = await inputFor(tx, jobId);
	if ('missing' in prepared || 'invalidSettings' in prepared) return undefined;
	return { result: estimate(prepared.input), draftErrors: prepared.draftErrors };
}
