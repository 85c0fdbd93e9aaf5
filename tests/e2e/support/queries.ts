// The one place where the browser tests write and read through the app's query modules (and the
// seed's writers, which use them). Each function names its store first and opens one store
// transaction for its work (`inStore`/`readInStore`, which set the store for row-level security). When the query modules change shape, adapt
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
import { inStore, readInStore } from '../../../src/lib/server/db/tenant';
import type { JobStatus } from '../../../src/lib/jobs/status';

export type { MeasureDraft };

/** The demo's trade settings and price book; answers a floor's id by its name. */
export async function addPriceBook(storeId: string): Promise<(name: string) => string> {
	return inStore(storeId, (tx) => seedPriceBook(tx));
}

export async function setStripeAccount(storeId: string, account: string) {
	await inStore(storeId, (tx) => tradeSettings.saveStripeAccount(tx, account));
}

export async function addCustomer(storeId: string, input: CustomerInput) {
	return inStore(storeId, (tx) => customers.create(tx, input));
}

export async function addSite(storeId: string, customerId: string, input: sites.SiteInput) {
	const row = await inStore(storeId, (tx) => sites.create(tx, customerId, input));
	if (!row) throw new Error(`No site for customer ${customerId}`);
	return row;
}

/** A draft job, at a site when given, with a measure when given. */
export async function addJob(
	storeId: string,
	input: { customerId: string; title: string; siteId?: string; measure?: MeasureDraft },
	sellerId: string
) {
	const row = await inStore(storeId, async (tx) => {
		const job = await jobs.create(
			tx,
			{ customerId: input.customerId, title: input.title },
			sellerId
		);
		if (!job) throw new Error(`Job ${input.title} was not created`);
		if (input.siteId) await sites.setJobSite(tx, job.id, input.siteId);
		if (input.measure) {
			const saved = await measures.save(tx, job.id, input.measure, 0, sellerId);
			if (!saved.ok) throw new Error(`The measure of ${input.title} was not saved`);
		}
		return job;
	});
	return row;
}

/** Moves a job along its path as the product does: the seed's own walk, in one transaction. */
export async function moveJob(storeId: string, ...rest: DropFirst<Parameters<typeof walkJob>>) {
	await inStore(storeId, (tx) => walkJob(tx, ...rest));
}

type DropFirst<T extends unknown[]> = T extends [unknown, ...infer R] ? R : never;
export type { JobStatus };

/** Assigns a job to an installer of the store, whatever its state (as the demo's second store). */
export async function assignJob(storeId: string, jobId: string, installerId: string, by: string) {
	const answer = await inStore(storeId, (tx) => jobs.assign(tx, jobId, installerId, by));
	if (answer !== 'assigned') throw new Error(`The job was not assigned: ${answer}`);
}

/** The demo's measure of a job by its title, with the store's own floors. */
export function demoMeasureOf(title: string, floor: (name: string) => string): MeasureDraft {
	return demoMeasure(title, floor);
}

/** The store's trade settings and currency, as the server reads them. */
export async function settingsOf(storeId: string) {
	return readInStore(storeId, (tx) => tradeSettings.read(tx));
}

/** The store's active price book, as the engine gets it. */
export async function priceBookOf(storeId: string, currency: string) {
	return readInStore(storeId, (tx) => priceBookFor(tx, currency));
}
