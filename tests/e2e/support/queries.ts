// The one place where the browser tests write and read through the app's query modules (and the
// seed's writers, which use them). Each function names its store first, as the queries do, and
// each query sets the store for row-level security. When the query modules change shape, adapt
// this file alone; the factories and the tests call only what is here.
import { demoMeasure } from '../../../scripts/demo-measures';
import { seedPriceBook, walkJob } from '../../../scripts/seed';
import type { MeasureDraft } from '../../../src/lib/measure/draft';
import type { CustomerInput } from '../../../src/lib/schemas/customer';
import * as customers from '../../../src/lib/server/db/queries/customers';
import * as jobs from '../../../src/lib/server/db/queries/jobs';
import * as measures from '../../../src/lib/server/db/queries/measures';
import { priceBookFor } from '../../../src/lib/server/db/queries/price-book';
import * as tradeSettings from '../../../src/lib/server/db/queries/settings';
import * as sites from '../../../src/lib/server/db/queries/sites';

export type { MeasureDraft };

/** The demo's trade settings and price book; answers a floor's id by its name. */
export async function addPriceBook(storeId: string): Promise<(name: string) => string> {
	return seedPriceBook(storeId);
}

export async function setStripeAccount(storeId: string, account: string) {
	await tradeSettings.saveStripeAccount(storeId, account);
}

export async function addCustomer(storeId: string, input: CustomerInput) {
	return customers.create(storeId, input);
}

export async function addSite(storeId: string, customerId: string, input: sites.SiteInput) {
	const row = await sites.create(storeId, customerId, input);
	if (!row) throw new Error(`No site for customer ${customerId}`);
	return row;
}

/** A draft job, at a site when given, with a measure when given. */
export async function addJob(
	storeId: string,
	input: { customerId: string; title: string; siteId?: string; measure?: MeasureDraft },
	sellerId: string
) {
	const row = await jobs.create(
		storeId,
		{ customerId: input.customerId, title: input.title },
		sellerId
	);
	if (!row) throw new Error(`Job ${input.title} was not created`);
	if (input.siteId) await sites.setJobSite(storeId, row.id, input.siteId);
	if (input.measure) {
		const saved = await measures.save(storeId, row.id, input.measure, 0, sellerId);
		if (!saved.ok) throw new Error(`The measure of ${input.title} was not saved`);
	}
	return row;
}

/** Moves a job along its path as the product does: the seed's own walk. */
export { walkJob as moveJob };

/** Assigns a job to an installer of the store, whatever its state (as the demo's second store). */
export async function assignJob(storeId: string, jobId: string, installerId: string, by: string) {
	const answer = await jobs.assign(storeId, jobId, installerId, by);
	if (answer !== 'assigned') throw new Error(`The job was not assigned: ${answer}`);
}

/** The demo's measure of a job by its title, with the store's own floors. */
export function demoMeasureOf(title: string, floor: (name: string) => string): MeasureDraft {
	return demoMeasure(title, floor);
}

/** The store's trade settings and currency, as the server reads them. */
export async function settingsOf(storeId: string) {
	return tradeSettings.read(storeId);
}

/** The store's active price book, as the engine gets it. */
export async function priceBookOf(storeId: string, currency: string) {
	return priceBookFor(storeId, currency);
}
