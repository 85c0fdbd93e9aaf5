import { error } from '@sveltejs/kit';
import {
	calculators,
	isRefusal,
	type CalculatorName,
	type CalculatorResult
} from '$lib/calculators/registry';
import { estimate, forInstaller, type EstimateResult, type StoreSettings } from '$lib/estimating';
import type { EstimatePreviewInput } from '$lib/schemas/preview';
import { priceBookFor } from './db/queries/price-book';
import type { StoreTx } from './db/tenant';
import { tradeSettingsFor } from './store-settings';
import { sellEstimate, seesCosts, type SellEstimate } from './figures';
import { can, type Grants } from './permissions';

/** What an installer gets from a preview: the engine's installer view, with the errors. */
export type InstallerPreview = ReturnType<typeof forInstaller> &
	Pick<EstimateResult, 'ok' | 'errors' | 'warnings'>;

/** Work beyond the engine's limits is the request's fault: 400 with each field at fault. */
function refuse(issues: { path: string; message: string }[]): never {
	error(400, { message: 'This is more work than the engine takes on', issues });
}

/**
 * Runs a calculator (input already checked with its schema) with the store's saved settings,
 * so the store's own waste, loads and limits apply. Work beyond the engine's limits is a 400.
 */
export async function runCalculator(
	tx: StoreTx,
	name: CalculatorName,
	input: unknown
): Promise<CalculatorResult> {
	const { settings } = await tradeSettingsFor(tx);
	const run = calculators[name].run as (i: unknown, s: StoreSettings) => CalculatorResult;
	const result = run(input, settings);
	if (isRefusal(result)) refuse([{ path: result.field, message: result.message }]);
	return result;
}

/**
 * The whole estimate of a job, with the store's settings and price book where the body leaves
 * them out, as the member may see it (./figures): everything with `cost: read`; sell prices
 * without pay or margin for the other price-book readers (salespeople); the installer view
 * (quantities, prep, their pay and schedule) for the rest, never store prices or margins.
 */
export async function previewEstimate(
	tx: StoreTx,
	grants: Grants,
	body: EstimatePreviewInput
): Promise<EstimateResult | SellEstimate | InstallerPreview> {
	const stored = body.settings && body.priceBook ? undefined : await tradeSettingsFor(tx);
	const settings = body.settings ?? stored!.settings;
	const priceBook = body.priceBook ?? (await priceBookFor(tx, stored!.currency));
	const result = estimate({ job: body.job, settings, priceBook });
	const beyond = result.errors.filter((e) => e.limit !== undefined);
	if (beyond.length > 0) refuse(beyond.map(({ path, message }) => ({ path, message })));
	if (seesCosts(grants)) return result;
	if (can(grants, { priceBook: ['read'] })) return sellEstimate(result);
	return {
		ok: result.ok,
		errors: result.errors,
		warnings: result.warnings,
		...forInstaller(result)
	};
}
