// Rows for the object-access module ($lib/server/object-access): which of some ids are in a store
// and within a member's scope of jobs. SQL only; the rules about who gets which scope live there.
import { and, eq, inArray, sql, type Placeholder, type SQL } from 'drizzle-orm';
import type { StoreAccess } from '../../permissions';
import { customer, job, organization, payment, quote } from '../schema';
import { db } from '../index';
import { inStore } from '../tenant';

/**
 * The jobs of a store a member may see and work on: all of them, the ones they sell (the
 * job's salesperson), the ones assigned to them (its installer), or none.
 */
export type JobScope =
	| { kind: 'store' }
	| { kind: 'sold'; userId: string }
	| { kind: 'assigned'; userId: string }
	| { kind: 'none' };

/** Every job of the store: for the store's own work (a customer's link, a webhook), not a member. */
export const WHOLE_STORE: JobScope = Object.freeze({ kind: 'store' });

/**
 * The condition on `job` rows for a scope (undefined: no condition beyond the store). `user` stands
 * for the scope's user id in it: a placeholder, for a statement built once and run for anyone.
 */
export function jobScopeFilter(scope: JobScope, user?: Placeholder): SQL | undefined {
	switch (scope.kind) {
		case 'store':
			return undefined;
		case 'sold':
			return eq(job.salespersonId, user ?? scope.userId);
		case 'assigned':
			return eq(job.installerId, user ?? scope.userId);
		case 'none':
			return sql`false`;
	}
}

/** Of `ids`, the jobs of the store within the scope. */
export async function jobsIn(storeId: string, scope: JobScope, ids: string[]): Promise<string[]> {
	if (!ids.length || scope.kind === 'none') return [];
	return inStore(storeId, async (tx) => {
		const rows = await tx
			.select({ id: job.id })
			.from(job)
			.where(and(eq(job.organizationId, storeId), inArray(job.id, ids), jobScopeFilter(scope)));
		return rows.map((r) => r.id);
	});
}

/** Of `ids`, the customers of the store. */
export async function customersIn(storeId: string, ids: string[]): Promise<string[]> {
	if (!ids.length) return [];
	return inStore(storeId, async (tx) => {
		const rows = await tx
			.select({ id: customer.id })
			.from(customer)
			.where(and(eq(customer.organizationId, storeId), inArray(customer.id, ids)));
		return rows.map((r) => r.id);
	});
}

/** Of `ids`, the quotes of the store whose job is within the scope. */
export async function quotesIn(storeId: string, scope: JobScope, ids: string[]): Promise<string[]> {
	if (!ids.length || scope.kind === 'none') return [];
	return inStore(storeId, async (tx) => {
		const rows = await tx
			.select({ id: quote.id })
			.from(quote)
			.innerJoin(job, and(eq(job.id, quote.jobId), eq(job.organizationId, quote.organizationId)))
			.where(and(eq(quote.organizationId, storeId), inArray(quote.id, ids), jobScopeFilter(scope)));
		return rows.map((r) => r.id);
	});
}

/** Of `ids`, the payments of the store whose job is within the scope. */
export async function paymentsIn(
	storeId: string,
	scope: JobScope,
	ids: string[]
): Promise<string[]> {
	if (!ids.length || scope.kind === 'none') return [];
	return inStore(storeId, async (tx) => {
		const rows = await tx
			.select({ id: payment.id })
			.from(payment)
			.innerJoin(
				job,
				and(eq(job.id, payment.jobId), eq(job.organizationId, payment.organizationId))
			)
			.where(
				and(eq(payment.organizationId, storeId), inArray(payment.id, ids), jobScopeFilter(scope))
			);
		return rows.map((r) => r.id);
	});
}

/**
 * Saves the owner's choices about who sees what. They live on the store's own row (read with
 * every membership), which the app changes only here.
 */
export async function saveStoreAccess(storeId: string, access: StoreAccess): Promise<void> {
	await db
		.update(organization)
		.set({ salesSeeCosts: access.salesSeeCosts, salesJobs: access.salesJobs })
		.where(eq(organization.id, storeId));
}
