import { estimate, forInstaller, type EstimateResult, type StoreSettings } from '$lib/estimating';
import type { EstimatePreviewInput } from '$lib/schemas/preview';
import { calculators, type CalculatorName, type CalculatorResult } from '$lib/schemas/estimate';
import { priceBookFor } from './db/queries/price-book';
import type { StoreTx } from './db/tenant';
import { tradeSettingsFor } from './store-settings';
import { can, type Role } from './permissions';

/** What an installer gets from a preview: the engine's installer view, with the errors. */
export type InstallerPreview = ReturnType<typeof forInstaller> &
	Pick<EstimateResult, 'ok' | 'errors' | 'warnings'>;

/**
 * Runs a calculator (input already checked with its schema) with the store's saved settings,
 * so the store's own waste, loads and limits apply.
 */
export async function runCalculator(
	tx: StoreTx,
	name: CalculatorName,
	input: unknown
): Promise<CalculatorResult> {
	const { settings } = await tradeSettingsFor(tx);
	const run = calculators[name].run as (i: unknown, s: StoreSettings) => CalculatorResult;
	return run(input, settings);
}

/**
 * The whole estimate of a job, with the store's settings and price book where the body leaves
 * them out. Roles that may read the price book get the whole result; an installer gets the
 * installer view (quantities, prep, pay and schedule), never store prices or margins.
 */
export async function previewEstimate(
	tx: StoreTx,
	role: Role,
	body: EstimatePreviewInput
): Promise<EstimateResult | InstallerPreview> {
	const stored = body.settings && body.priceBook ? undefined : await tradeSettingsFor(tx);
	const settings = body.settings ?? stored!.settings;
	const priceBook = body.priceBook ?? (await priceBookFor(tx, stored!.currency));
	const result = estimate({ job: body.job, settings, priceBook });
	if (can(role, { priceBook: ['read'] })) return result;
	return {
		ok: result.ok,
		errors: result.errors,
		warnings: result.warnings,
		...forInstaller(result)
	};
}
