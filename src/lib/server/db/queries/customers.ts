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

/**
 * How many matches a search takes by id from the trigram indexes (`customer_search_ids`, migration
 * 0021). Past that many, too common a text for the indexes to narrow much (a phone prefix, a mail
 * domain), the search tests each of the store's customers as the page is read instead. In the big
 * store of the scale seed (2,004 customers), the indexes find the 84 matches of "ash" in 0.2-0.3 ms
 * where testing every customer took 4.4 ms; a text that matches them all costs about 0.9 ms more
 * than before, the indexes' 501 ids first (bench/README.md).
 */
export const SEARCH_CAP = 500;

/**
 * Whether pg_trgm can narrow a search for `text` through its indexes: it takes trigrams only from
 * runs of three or more letters or digits, and a text without one would read the whole index.
 */
const narrowsByTrigrams = (text: string) => /[\p{L}\p{N}]{3}/u.test(text);

/** A page of the store's customers, filtered by name, e-mail or phone. */
export async function list(tx: StoreTx, query: CustomerListQuery) {
	const filters: SQL[] = [eq(customer.organizationId, tx.storeId)];
	// How many match, when the search already knows.
	let known: number | undefined;
	if (query.q) {
		const pattern = likePattern(query.q);
		const ids = narrowsByTrigrams(query.q) ? await searchIds(tx, pattern) : undefined;
		if (ids && ids.length <= SEARCH_CAP) {
			// The function tests the same three columns: its ids are the matches, all of them.
			filters.push(sql`${customer.id} = any(${sql.param(ids)}::text[])`);
			known = ids.length;
		} else {
			filters.push(
				or(
					ilike(customer.name, pattern),
					ilike(customer.email, pattern),
					ilike(customer.phone, pattern)
				) as SQL
			);
		}
	}
	const where = and(...filters);
	const order = query.dir === 'asc' ? asc : desc;
	const orderBy = [order(sortColumns[query.sort]), asc(customer.id)];
	const offset = (query.page - 1) * query.pageSize;
	if (known !== undefined) {
		const rows =
			offset < known
				? await runNamed(
						tx
							.select()
							.from(customer)
							.where(where)
							.orderBy(...orderBy)
							.limit(query.pageSize)
							.offset(offset)
					)
				: [];
		return { rows, total: known };
	}
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
			.orderBy(...orderBy)
			.limit(query.pageSize)
			.offset(offset)
	);
	const rows: Customer[] = found.map(({ total: _, ...row }) => row);
	if (found.length) return { rows, total: found[0].total };
	const [{ total }] = await tx.select({ total: count() }).from(customer).where(where);
	return { rows, total };
}

/**
 * The ids of the store's customers whose name, e-mail or phone matches `pattern`, through the
 * trigram indexes (migration 0021), up to one more than SEARCH_CAP.
 */
async function searchIds(tx: StoreTx, pattern: string): Promise<string[]> {
	const { rows } = await tx.execute<{ id: string }>(
		sql`select s.id from customer_search_ids(${pattern}, ${SEARCH_CAP + 1}) as s(id)`
	);
	return rows.map((r) => r.id);
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
