import { and, asc, count, eq, getTableColumns, sql } from 'drizzle-orm';
import { customer, job, site } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { runShape } from '../named';

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
export async function listForCustomer(tx: StoreTx, customerId: string): Promise<Site[]> {
	return runShape(
		tx,
		'sites.listForCustomer',
		() =>
			tx
				.select()
				.from(site)
				.where(
					and(
						eq(site.organizationId, sql.placeholder('store')),
						eq(site.customerId, sql.placeholder('customer'))
					)
				)
				.orderBy(asc(site.label), asc(site.address)),
		{ store: tx.storeId, customer: customerId }
	);
}

/** A customer's sites with how many jobs are at each (a site with jobs is kept when deleted). */
export async function listWithJobCounts(
	tx: StoreTx,
	customerId: string
): Promise<(Site & { jobs: number })[]> {
	return tx
		.select({ ...getTableColumns(site), jobs: count(job.id) })
		.from(site)
		.leftJoin(job, and(eq(job.siteId, site.id), eq(job.organizationId, site.organizationId)))
		.where(and(eq(site.organizationId, tx.storeId), eq(site.customerId, customerId)))
		.groupBy(site.id)
		.orderBy(asc(site.label), asc(site.address));
}

/** The site a job is at (undefined when none, or when the job is not the store's). */
export async function forJob(tx: StoreTx, jobId: string): Promise<Site | undefined> {
	const [row] = await runShape(
		tx,
		'sites.forJob',
		() =>
			tx
				.select(getTableColumns(site))
				.from(job)
				.innerJoin(site, and(eq(site.id, job.siteId), eq(site.organizationId, job.organizationId)))
				.where(
					and(eq(job.organizationId, sql.placeholder('store')), eq(job.id, sql.placeholder('job')))
				),
		{ store: tx.storeId, job: jobId }
	);
	return row;
}

export async function read(tx: StoreTx, id: string): Promise<Site | undefined> {
	const [row] = await tx
		.select()
		.from(site)
		.where(and(eq(site.organizationId, tx.storeId), eq(site.id, id)));
	return row;
}

/** A new site for a customer of the same store; undefined when the customer is not the store's. */
export async function create(
	tx: StoreWriteTx,
	customerId: string,
	input: SiteInput
): Promise<Site | undefined> {
	const [owner] = await tx
		.select({ id: customer.id })
		.from(customer)
		.where(and(eq(customer.organizationId, tx.storeId), eq(customer.id, customerId)));
	if (!owner) return undefined;
	const [row] = await tx
		.insert(site)
		.values({ ...input, customerId, organizationId: tx.storeId })
		.returning();
	return row;
}

export async function update(
	tx: StoreWriteTx,
	id: string,
	input: Partial<SiteInput>
): Promise<Site | undefined> {
	const [row] = await tx
		.update(site)
		.set({ ...input, updatedAt: new Date() })
		.where(and(eq(site.organizationId, tx.storeId), eq(site.id, id)))
		.returning();
	return row;
}

/** Deletes a site no job is at; a site with jobs stays for their history. */
export async function remove(
	tx: StoreWriteTx,
	id: string
): Promise<'deleted' | 'not_found' | 'has_jobs'> {
	const [{ jobs }] = await tx
		.select({ jobs: count() })
		.from(job)
		.where(and(eq(job.organizationId, tx.storeId), eq(job.siteId, id)));
	const [exists] = await tx
		.select({ id: site.id })
		.from(site)
		.where(and(eq(site.organizationId, tx.storeId), eq(site.id, id)));
	if (!exists) return 'not_found';
	if (jobs > 0) return 'has_jobs';
	await tx.delete(site).where(and(eq(site.organizationId, tx.storeId), eq(site.id, id)));
	return 'deleted';
}

/** Puts a job at one of its customer's sites (or none). */
export async function setJobSite(
	tx: StoreWriteTx,
	jobId: string,
	siteId: string | null
): Promise<'saved' | 'not_found' | 'other_customer'> {
	const [j] = await tx
		.select({ customerId: job.customerId })
		.from(job)
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, jobId)));
	if (!j) return 'not_found';
	if (siteId) {
		const [s] = await tx
			.select({ customerId: site.customerId })
			.from(site)
			.where(and(eq(site.organizationId, tx.storeId), eq(site.id, siteId)));
		if (!s) return 'not_found';
		if (s.customerId !== j.customerId) return 'other_customer';
	}
	await tx
		.update(job)
		.set({ siteId, updatedAt: new Date() })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, jobId)));
	return 'saved';
}
