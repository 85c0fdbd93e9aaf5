import { and, asc, count, desc, eq, getTableColumns, ilike, or, sql, type SQL } from 'drizzle-orm';
import type { CustomerInput, CustomerListQuery } from '../../../schemas/customer';
import { customer, job } from '../schema';
import { runNamed } from '../named';
import type { StoreTx, StoreWriteTx } from '../tenant';

export type Customer = typeof customer.$inferSelect;

const sortColumns = {
	name: customer.name,
	created: customer.createdAt,
	updated: customer.updatedAt
} as const;

/** Escapes LIKE wildcards in user text. */
export function likePattern(text: string): string {
	return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** A page of the store's customers, filtered by name, e-mail or phone. */
export async function list(tx: StoreTx, query: CustomerListQuery) {
	const filters: SQL[] = [eq(customer.organizationId, tx.storeId)];
	if (query.q) {
		const pattern = likePattern(query.q);
		filters.push(
			or(
				ilike(customer.name, pattern),
				ilike(customer.email, pattern),
				ilike(customer.phone, pattern)
			) as SQL
		);
	}
	const where = and(...filters);
	const order = query.dir === 'asc' ? asc : desc;
	// The count rides along with the page (one statement, one pass over the matches: it reads
	// them all either way); only a page past the end, which has no row to carry it, counts alone.
	const found = await runNamed(
		tx
			.select({
				...getTableColumns(customer),
				total: sql<number>`count(*) over ()`.mapWith(Number)
			})
			.from(customer)
			.where(where)
			.orderBy(order(sortColumns[query.sort]), asc(customer.id))
			.limit(query.pageSize)
			.offset((query.page - 1) * query.pageSize)
	);
	const rows: Customer[] = found.map(({ total: _, ...row }) => row);
	if (found.length) return { rows, total: found[0].total };
	const [{ total }] = await tx.select({ total: count() }).from(customer).where(where);
	return { rows, total };
}

export async function read(tx: StoreTx, id: string): Promise<Customer | undefined> {
	const [row] = await tx
		.select()
		.from(customer)
		.where(and(eq(customer.organizationId, tx.storeId), eq(customer.id, id)));
	return row;
}

export async function create(tx: StoreWriteTx, input: CustomerInput): Promise<Customer> {
	const [row] = await tx
		.insert(customer)
		.values({ ...input, organizationId: tx.storeId })
		.returning();
	return row;
}

export async function update(
	tx: StoreWriteTx,
	id: string,
	input: Partial<CustomerInput>
): Promise<Customer | undefined> {
	const [row] = await tx
		.update(customer)
		.set({ ...input, updatedAt: new Date() })
		.where(and(eq(customer.organizationId, tx.storeId), eq(customer.id, id)))
		.returning();
	return row;
}

/**
 * Deletes a customer that has no jobs. A customer with jobs is kept (the jobs' history needs
 * them): the answer says so.
 */
export async function remove(
	tx: StoreWriteTx,
	id: string
): Promise<'deleted' | 'not_found' | 'has_jobs'> {
	const [{ jobs }] = await tx
		.select({ jobs: count() })
		.from(job)
		.where(and(eq(job.organizationId, tx.storeId), eq(job.customerId, id)));
	if (jobs > 0) {
		const [exists] = await tx
			.select({ id: customer.id })
			.from(customer)
			.where(and(eq(customer.organizationId, tx.storeId), eq(customer.id, id)));
		return exists ? 'has_jobs' : 'not_found';
	}
	const deleted = await tx
		.delete(customer)
		.where(and(eq(customer.organizationId, tx.storeId), eq(customer.id, id)))
		.returning({ id: customer.id });
	return deleted.length ? 'deleted' : 'not_found';
}
