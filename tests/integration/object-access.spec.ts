// "May this member touch these ids": jobs, customers, quotes and payments, by role, by the
// store's choice for salespeople, and never another store's.
import { inStore } from '$lib/server/db/tenant';
import { isHttpError } from '@sveltejs/kit';
import { beforeAll, describe, expect, it } from 'vitest';
import * as jobs from '$lib/server/db/queries/jobs';
import {
	jobScope,
	MAX_IDS,
	requireJob,
	requireObjects,
	touchable,
	type Asker
} from '$lib/server/object-access';
import { grantsOf, type Role, type StoreAccess } from '$lib/server/permissions';
import {
	addMember,
	makeCustomer,
	makeJob,
	makePaidJob,
	makeStore,
	type TestStore
} from './factories';

let store: TestStore;
let other: TestStore;
let people: Record<'sales' | 'otherSales' | 'installer', { id: string }>;
let sold: { id: string };
let soldByOther: { id: string };
let paid: Awaited<ReturnType<typeof makePaidJob>>;
let theirs: Awaited<ReturnType<typeof makePaidJob>>;

const OWN: StoreAccess = { salesSeeCosts: false, salesJobs: 'own' };

function asker(role: Role, userId: string, access?: StoreAccess, storeId = store.id): Asker {
	return { store: { id: storeId }, user: { id: userId }, grants: grantsOf(role, access) };
}

async function statusOf(work: Promise<unknown>): Promise<number | 'ok'> {
	try {
		await work;
		return 'ok';
	} catch (e) {
		if (isHttpError(e)) return e.status;
		throw e;
	}
}

beforeAll(async () => {
	store = await makeStore('Larchmere Floors');
	other = await makeStore('Quillon Tile');
	people = {
		sales: await addMember(store.id, 'sales', 'Hale Brisk'),
		otherSales: await addMember(store.id, 'sales', 'Nell Varga'),
		installer: await addMember(store.id, 'installer', 'Corin Ash')
	};
	sold = await makeJob(store.id, people.sales.id);
	soldByOther = await makeJob(store.id, people.otherSales.id);
	await inStore(store.id, (tx) => jobs.assign(tx, sold.id, people.installer.id, store.owner.id));
	paid = await makePaidJob(store);
	theirs = await makePaidJob(other);
});

describe('jobScope', () => {
	it('gives staff the store, installers their assigned jobs, and salespeople what the store chose', () => {
		expect(jobScope(grantsOf('owner'), 'u1')).toEqual({ kind: 'store' });
		expect(jobScope(grantsOf('manager', OWN), 'u1')).toEqual({ kind: 'store' });
		expect(jobScope(grantsOf('sales'), 'u1')).toEqual({ kind: 'store' });
		expect(jobScope(grantsOf('sales', OWN), 'u1')).toEqual({ kind: 'sold', userId: 'u1' });
		expect(jobScope(grantsOf('installer'), 'u1')).toEqual({ kind: 'assigned', userId: 'u1' });
		expect(jobScope(grantsOf('installer', OWN), 'u1')).toEqual({ kind: 'assigned', userId: 'u1' });
	});
});

describe('touchable', () => {
	const allJobs = () => [sold.id, soldByOther.id, paid.job.id, theirs.job.id];

	it("answers the store's jobs to its staff, and never another store's", async () => {
		const owner = asker('owner', store.owner.id);
		expect(await touchable(owner, 'job', allJobs())).toEqual(
			new Set([sold.id, soldByOther.id, paid.job.id])
		);
		expect(await touchable(asker('sales', people.sales.id), 'job', allJobs())).toEqual(
			new Set([sold.id, soldByOther.id, paid.job.id])
		);
	});

	it('keeps salespeople to the jobs they sell where the store asks it', async () => {
		expect(await touchable(asker('sales', people.sales.id, OWN), 'job', allJobs())).toEqual(
			new Set([sold.id])
		);
		expect(await touchable(asker('sales', people.otherSales.id, OWN), 'job', allJobs())).toEqual(
			new Set([soldByOther.id])
		);
	});

	it('keeps installers to the jobs assigned to them, and to no quote, payment or customer', async () => {
		const installer = asker('installer', people.installer.id);
		expect(await touchable(installer, 'job', allJobs())).toEqual(new Set([sold.id]));
		expect(await touchable(installer, 'quote', [paid.quote.id])).toEqual(new Set());
		expect(await touchable(installer, 'payment', [paid.payment.id])).toEqual(new Set());
		expect(await touchable(installer, 'customer', [paid.customer.id])).toEqual(new Set());
	});

	it('reaches quotes and payments through their job', async () => {
		const owner = asker('owner', store.owner.id);
		const quotes = [paid.quote.id, theirs.quote.id];
		const payments = [paid.payment.id, theirs.payment.id];
		expect(await touchable(owner, 'quote', quotes)).toEqual(new Set([paid.quote.id]));
		expect(await touchable(owner, 'payment', payments)).toEqual(new Set([paid.payment.id]));
		// The paid job was sold by the owner: a salesperson kept to their own does not reach it.
		const own = asker('sales', people.sales.id, OWN);
		expect(await touchable(own, 'quote', quotes)).toEqual(new Set());
		expect(await touchable(own, 'payment', payments)).toEqual(new Set());
		expect(await touchable(asker('sales', people.sales.id), 'payment', payments)).toEqual(
			new Set([paid.payment.id])
		);
	});

	it("answers the store's customers to those who read customers", async () => {
		const mine = await makeCustomer(store.id);
		const ids = [mine.id, paid.customer.id, theirs.customer.id];
		expect(await touchable(asker('sales', people.sales.id, OWN), 'customer', ids)).toEqual(
			new Set([mine.id, paid.customer.id])
		);
	});

	it('finds nothing, without an error, for ids no row can have', async () => {
		const owner = asker('owner', store.owner.id);
		const odd = ['', 'a\u0000b', 'x'.repeat(129), '__proto__', "' or 1=1 --"];
		for (const kind of ['job', 'customer', 'quote', 'payment'] as const) {
			expect(await touchable(owner, kind, odd)).toEqual(new Set());
		}
	});

	it('refuses to be asked about more than a bounded number of ids', async () => {
		const many = Array.from({ length: MAX_IDS + 1 }, (_, i) => `id-${i}`);
		expect(await statusOf(touchable(asker('owner', store.owner.id), 'job', many))).toBe(400);
	});
});

describe('requireObjects', () => {
	it('passes when every id may be touched, and is 404 when any may not', async () => {
		const owner = asker('owner', store.owner.id);
		expect(await statusOf(requireObjects(owner, 'job', [sold.id, paid.job.id]))).toBe('ok');
		expect(await statusOf(requireObjects(owner, 'job', [sold.id, theirs.job.id]))).toBe(404);
		expect(await statusOf(requireObjects(owner, 'job', []))).toBe(404);
		expect(
			await statusOf(requireJob(asker('installer', people.installer.id), soldByOther.id))
		).toBe(404);
		expect(await statusOf(requireJob(asker('sales', people.sales.id, OWN), sold.id))).toBe('ok');
		// Another store's member asking about this store's job, in their own store: 404.
		expect(
			await statusOf(requireJob(asker('owner', other.owner.id, undefined, other.id), sold.id))
		).toBe(404);
	});
});
