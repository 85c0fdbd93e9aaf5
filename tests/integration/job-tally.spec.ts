// The store's tally of jobs per status and salesperson (migration 0020), which the job list reads
// its totals from: kept by the database in the same transaction as every change to `job`, whoever
// makes it, and always equal to counting the jobs; checked and mended by the periodic task.
import { describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { inStore, readInStore } from '$lib/server/db/tenant';
import * as jobs from '$lib/server/db/queries/jobs';
import { user } from '$lib/server/db/schema';
import { jobScope } from '$lib/server/object-access';
import { grantsOf } from '$lib/server/permissions';
import { addMember, makeCustomer, makeJob, makeStore } from './factories';

type Row = { status: string; salesperson: string; jobs: number };

/** The store's tally rows that hold jobs, and the same figures counted from `job`. */
async function tallyAndCount(storeId: string): Promise<{ tally: Row[]; counted: Row[] }> {
	return readInStore(storeId, async (tx) => {
		const tally = await tx.execute<Row>(sql`
			select status::text, salesperson_id as salesperson, jobs from job_tally
			where organization_id = ${storeId} and jobs <> 0 order by 1, 2`);
		const counted = await tx.execute<Row>(sql`
			select status::text, coalesce(salesperson_id, '') as salesperson, count(*)::int as jobs
			from job where organization_id = ${storeId} group by 1, 2 order by 1, 2`);
		return { tally: tally.rows, counted: counted.rows };
	});
}

async function expectTallied(storeId: string) {
	const { tally, counted } = await tallyAndCount(storeId);
	expect(tally).toEqual(counted);
	return tally;
}

describe("the store's tally of jobs", () => {
	it('follows inserts, moves, salespeople, deletes and a rolled-back change', async () => {
		const store = await makeStore('Tally Floors');
		const seller = await addMember(store.id, 'sales', 'Tess Tally');
		const customer = await makeCustomer(store.id, 'Ada Ledger');
		const a = await makeJob(store.id, store.owner.id, customer.id);
		const b = await makeJob(store.id, seller.id, customer.id);
		const c = await makeJob(store.id, seller.id, customer.id);
		const first = await expectTallied(store.id);
		expect(first).toHaveLength(2);
		expect(first).toEqual(
			expect.arrayContaining([
				{ status: 'draft', salesperson: store.owner.id, jobs: 1 },
				{ status: 'draft', salesperson: seller.id, jobs: 2 }
			])
		);

		// Many rows in one statement: one write per status and salesperson.
		await inStore(store.id, (tx) =>
			tx.execute(sql`insert into job (id, organization_id, number, customer_id, title, status, salesperson_id)
				select gen_random_uuid()::text, ${store.id}, n, ${customer.id}, 'Bulk ' || n,
				       case when n % 3 = 0 then 'quoted'::job_status else 'draft'::job_status end,
				       case when n % 2 = 0 then ${seller.id} else null end
				from generate_series(9001, 9030) as n`)
		);
		await expectTallied(store.id);

		// A move of status, through the app.
		await inStore(store.id, (tx) => jobs.move(tx, a.id, 'quoted', store.owner.id));
		// A change of salesperson and a change that touches neither (no tally write needed).
		await inStore(store.id, async (tx) => {
			await tx.execute(sql`update job set salesperson_id = ${store.owner.id} where id = ${b.id}`);
			await tx.execute(sql`update job set notes = 'measured twice' where id = ${c.id}`);
		});
		await expectTallied(store.id);

		// Deleted: one through the app, then many in one statement.
		expect(await inStore(store.id, (tx) => jobs.remove(tx, c.id))).toBe('deleted');
		await inStore(store.id, (tx) =>
			tx.execute(
				sql`delete from job where organization_id = ${store.id} and number between 9001 and 9010`
			)
		);
		await expectTallied(store.id);

		// A transaction that fails leaves the tally as it was, with its jobs.
		const before = await expectTallied(store.id);
		await expect(
			inStore(store.id, async (tx) => {
				await jobs.move(tx, b.id, 'quoted', store.owner.id);
				await jobs.create(tx, { customerId: customer.id, title: 'Never kept' }, seller.id);
				throw new Error('given up');
			})
		).rejects.toThrow('given up');
		expect(await expectTallied(store.id)).toEqual(before);
	});

	it('follows a salesperson removed from the system (their jobs keep no salesperson)', async () => {
		const store = await makeStore('Leaving Floors');
		const seller = await addMember(store.id, 'sales', 'Lev Leaving');
		const customer = await makeCustomer(store.id, 'Ida Ledger');
		await makeJob(store.id, seller.id, customer.id);
		await makeJob(store.id, seller.id, customer.id);
		await db.delete(user).where(eq(user.id, seller.id));
		expect(await expectTallied(store.id)).toEqual([{ status: 'draft', salesperson: '', jobs: 2 }]);
	});

	it('keeps up with stores writing at once, and each store sees only its own', async () => {
		const one = await makeStore('Busy Floors');
		const two = await makeStore('Other Busy Floors');
		const [c1, c2] = [
			await makeCustomer(one.id, 'Ben Busy'),
			await makeCustomer(two.id, 'Bo Busy')
		];
		const made = await Promise.all(
			Array.from({ length: 12 }, (_, i) =>
				i % 2 ? makeJob(one.id, one.owner.id, c1.id) : makeJob(two.id, two.owner.id, c2.id)
			)
		);
		await Promise.all(
			made
				.filter((_, i) => i % 4 === 1)
				.map((j) => inStore(one.id, (tx) => jobs.move(tx, j.id, 'quoted', one.owner.id)))
		);
		expect(await expectTallied(one.id)).toEqual([
			{ status: 'draft', salesperson: one.owner.id, jobs: 3 },
			{ status: 'quoted', salesperson: one.owner.id, jobs: 3 }
		]);
		await expectTallied(two.id);
		// Under the store policy, one store reads no row of another's tally.
		const seen = await readInStore(one.id, (tx) =>
			tx.execute<{ n: number }>(
				sql`select count(*)::int as n from job_tally where organization_id = ${two.id}`
			)
		);
		expect(seen.rows[0].n).toBe(0);
		// Nor writes one: the policy holds for the app, and the trigger's function cannot be called.
		await expect(
			inStore(one.id, (tx) =>
				tx.execute(sql`insert into job_tally (organization_id, status, salesperson_id, jobs)
					values (${two.id}, 'draft', '', 5)`)
			)
		).rejects.toThrow();
		await expect(
			inStore(one.id, (tx) => tx.execute(sql`select job_tally_follow()`))
		).rejects.toThrow();
		await expectTallied(two.id);
	});

	it('is checked against the jobs, and mended when a write from outside left it behind', async () => {
		const store = await makeStore('Mended Floors');
		const other = await makeStore('Untouched Floors');
		const customer = await makeCustomer(store.id, 'Mo Mended');
		for (let i = 0; i < 3; i++) await makeJob(store.id, store.owner.id, customer.id);
		await makeJob(other.id, other.owner.id);
		expect(await inStore(store.id, jobs.mendTally)).toBe(false);
		// As a copy made with triggers off might leave it: a count wrong, and a row of no jobs.
		await inStore(store.id, (tx) =>
			tx.execute(sql`update job_tally set jobs = 7 where organization_id = ${store.id}`)
		);
		await inStore(store.id, (tx) =>
			tx.execute(sql`insert into job_tally (organization_id, status, salesperson_id, jobs)
				values (${store.id}, 'sold', '', 2)`)
		);
		const otherBefore = await expectTallied(other.id);
		expect(await inStore(store.id, jobs.mendTally)).toBe(true);
		expect(await expectTallied(store.id)).toEqual([
			{ status: 'draft', salesperson: store.owner.id, jobs: 3 }
		]);
		expect(await inStore(store.id, jobs.mendTally)).toBe(false);
		expect(await expectTallied(other.id)).toEqual(otherBefore);
		// The list's total follows.
		const staff = jobScope(grantsOf('owner'), store.owner.id);
		const listed = await readInStore(store.id, (tx) =>
			jobs.list(tx, { page: 1, pageSize: 25, sort: 'number', dir: 'desc', q: null }, staff)
		);
		expect(listed.total).toBe(3);
	});

	it("gives the job list its totals: the store's, a status's and a salesperson's own", async () => {
		const store = await makeStore('Counted Floors');
		const seller = await addMember(store.id, 'sales', 'Sol Counted');
		const customer = await makeCustomer(store.id, 'Uma Ledger');
		for (let i = 0; i < 3; i++) await makeJob(store.id, seller.id, customer.id);
		const other = await makeJob(store.id, store.owner.id, customer.id);
		await inStore(store.id, (tx) => jobs.move(tx, other.id, 'quoted', store.owner.id));
		const page = { page: 1, pageSize: 2, sort: 'number', dir: 'desc', q: null } as const;
		const staff = jobScope(grantsOf('owner'), store.owner.id);
		// A salesperson whose store shows them only the jobs they sold.
		const ownOnly = { kind: 'sold', userId: seller.id } as const;
		const totalOf = async (viewer: jobs.JobViewer, query = {}) =>
			readInStore(store.id, (tx) => jobs.list(tx, { ...page, ...query }, viewer));
		expect(await totalOf(staff)).toMatchObject({ total: 4, totalCapped: false });
		expect(await totalOf(staff, { status: 'quoted' })).toMatchObject({ total: 1 });
		expect(await totalOf(staff, { salespersonId: seller.id })).toMatchObject({ total: 3 });
		expect(await totalOf(ownOnly, { salespersonId: store.owner.id })).toMatchObject({ total: 0 });
		const own = await totalOf(ownOnly);
		expect(own.total).toBe(3);
		expect(own.rows).toHaveLength(2);
		const second = await totalOf(ownOnly, { page: 2 });
		expect(second.total).toBe(3);
		expect(second.rows.map((r) => r.salespersonId)).toEqual([seller.id]);
	});
});
