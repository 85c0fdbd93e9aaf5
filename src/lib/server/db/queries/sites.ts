import { and, asc, count, eq } from 'drizzle-orm';
import { customer, job, site } from '../schema';
import { inStore } from '../tenant';

export type Site = typeof site.$inferSelect;

export interface SiteInput {
	label: string;
	address: string;
	town: string;
	postcode: string;
	builtYear: number | null;
	subfloor: string;
	notes: string;
}

/** A customer's sites, by label and address. */
export async function listForCustomer(storeId: string, customerId: string): Promise<Site[]> {
	return inStore(storeId, (tx) =>
		tx
			.select()
			.from(site)
			.where(and(eq(site.organizationId, storeId), eq(site.customerId, customerId)))
			.orderBy(asc(site.label), asc(site.address))
	);
}

export async function read(storeId: string, id: string): Promise<Site | undefined> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select()
			.from(site)
			.where(and(eq(site.organizationId, storeId), eq(site.id, id)));
		return row;
	});
}

/** A new site for a customer of the same store; undefined when the customer is not the store's. */
export async function create(
	storeId: string,
	customerId: string,
	input: SiteInput
): Promise<Site | undefined> {
	return inStore(storeId, async (tx) => {
		const [owner] = await tx
			.select({ id: customer.id })
			.from(customer)
			.where(and(eq(customer.organizationId, storeId), eq(customer.id, customerId)));
		if (!owner) return undefined;
		const [row] = await tx
			.insert(site)
			.values({ ...input, customerId, organizationId: storeId })
			.returning();
		return row;
	});
}

export async function update(
	storeId: string,
	id: string,
	input: Partial<SiteInput>
): Promise<Site | undefined> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.update(site)
			.set({ ...input, updatedAt: new Date() })
			.where(and(eq(site.organizationId, storeId), eq(site.id, id)))
			.returning();
		return row;
	});
}

/** Deletes a site no job is at; a site with jobs stays for their history. */
export async function remove(
	storeId: string,
	id: string
): Promise<'deleted' | 'not_found' | 'has_jobs'> {
	return inStore(storeId, async (tx) => {
		const [{ jobs }] = await tx
			.select({ jobs: count() })
			.from(job)
			.where(and(eq(job.organizationId, storeId), eq(job.siteId, id)));
		const [exists] = await tx
			.select({ id: site.id })
			.from(site)
			.where(and(eq(site.organizationId, storeId), eq(site.id, id)));
		if (!exists) return 'not_found';
		if (jobs > 0) return 'has_jobs';
		await tx.delete(site).where(and(eq(site.organizationId, storeId), eq(site.id, id)));
		return 'deleted';
	});
}

/** Puts a job at one of its customer's sites (or none). */
export async function setJobSite(
	storeId: string,
	jobId: string,
	siteId: string | null
): Promise<'saved' | 'not_found' | 'other_customer'> {
	return inStore(storeId, async (tx) => {
		const [j] = await tx
			.select({ customerId: job.customerId })
			.from(job)
			.where(and(eq(job.organizationId, storeId), eq(job.id, jobId)));
		if (!j) return 'not_found';
		if (siteId) {
			const [s] = await tx
				.select({ customerId: site.customerId })
				.from(site)
				.where(and(eq(site.organizationId, storeId), eq(site.id, siteId)));
			if (!s) return 'not_found';
			if (s.customerId !== j.customerId) return 'other_customer';
		}
		await tx
			.update(job)
			.set({ siteId, updatedAt: new Date() })
			.where(and(eq(job.organizationId, storeId), eq(job.id, jobId)));
		return 'saved';
	});
}

/** The site a job is at, or undefined (no site, or the job is not the store's). */
export async function forJob(storeId: string, jobId: string): Promise<Site | undefined> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select({ site })
			.from(job)
			.innerJoin(site, and(eq(site.id, job.siteId), eq(site.organizationId, job.organizationId)))
			.where(and(eq(job.organizationId, storeId), eq(job.id, jobId)));
		return row?.site;
	});
}
