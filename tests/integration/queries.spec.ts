// The first wall: every query module takes the store id first and never crosses it.
import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import { beforeAll, describe, expect, it } from 'vitest';
import { addMember, makeCustomer, makeJob, makeStore, type TestStore } from './factories';
import { jobScope } from '$lib/server/object-access';
import { grantsOf } from '$lib/server/permissions';

const page = { q: null, sort: 'name', dir: 'asc', page: 1, pageSize: 100 } as const;
const jobPage = { q: null, sort: 'number', dir: 'desc', page: 1, pageSize: 100 } as const;

let a: TestStore;
let b: TestStore;
let bCustomer: customers.Customer;
let bJob: jobs.Job;

beforeAll(async () => {
	a = await makeStore('Alpha Floors');
	b = await makeStore('Beta Floors');
	await makeCustomer(a.id, 'Alpha customer');
	bCustomer = await makeCustomer(b.id, 'Beta customer');
	bJob = await makeJob(b.id, b.owner.id, bCustomer.id);
});

describe('customers across stores', () => {
	it("lists, reads, changes and deletes none of another store's customers", async () => {
		const listed = await customers.list(a.id, page);
		expect(listed.rows.map((r) => r.organizationId)).toEqual(listed.rows.map(() => a.id));
		expect(listed.rows.some((r) => r.id === bCustomer.id)).toBe(false);
		expect(await customers.read(a.id, bCustomer.id)).toBeUndefined();
		expect(await customers.update(a.id, bCustomer.id, { name: 'Taken' })).toBeUndefined();
		expect(await customers.remove(a.id, bCustomer.id)).toBe('not_found');
		expect((await customers.read(b.id, bCustomer.id))?.name).toBe('Beta customer');
	});

	it('searches by name, e-mail or phone, with wildcards taken literally', async () => {
		const store = await makeStore('Search Floors');
		await customers.create(store.id, {
			name: 'Greta Oak',
			email: 'g@x.example',
			phone: '555-0101',
			notes: ''
		});
		await customers.create(store.id, {
			name: '100% Wool Rugs',
			email: null,
			phone: null,
			notes: ''
		});
		const find = async (q: string) =>
			(await customers.list(store.id, { ...page, q })).rows.map((r) => r.name);
		expect(await find('oak')).toEqual(['Greta Oak']);
		expect(await find('0101')).toEqual(['Greta Oak']);
		expect(await find('%')).toEqual(['100% Wool Rugs']);
	});

	it('keeps a customer who has jobs', async () => {
		expect(await customers.remove(b.id, bCustomer.id)).toBe('has_jobs');
	});
});

describe('jobs across stores', () => {
	it("lists, reads, changes, moves, assigns and deletes none of another store's jobs", async () => {
		const staff = jobScope(grantsOf('owner'), a.owner.id);
		const { rows } = await jobs.list(a.id, jobPage, staff);
		expect(rows.some((r) => r.id === bJob.id)).toBe(false);
		expect(await jobs.read(a.id, bJob.id, staff)).toBeUndefined();
		expect(await jobs.update(a.id, bJob.id, { title: 'Taken' })).toBeUndefined();
		expect(await jobs.move(a.id, bJob.id, 'quoted', a.owner.id)).toEqual({
			ok: false,
			reason: 'not_found'
		});
		expect(await jobs.assign(a.id, bJob.id, null, a.owner.id)).toBe('not_found');
		expect(await jobs.remove(a.id, bJob.id)).toBe('not_found');
		expect(await jobs.events(a.id, bJob.id)).toEqual([]);
		expect((await jobs.read(b.id, bJob.id, jobScope(grantsOf('owner'), b.owner.id)))?.status).toBe(
			'draft'
		);
	});

	it("refuses a job for another store's customer", async () => {
		expect(
			await jobs.create(a.id, { customerId: bCustomer.id, title: 'x' }, a.owner.id)
		).toBeUndefined();
	});

	it('numbers jobs per store from 1001', async () => {
		const store = await makeStore('Numbering Floors');
		const first = await makeJob(store.id, store.owner.id);
		const second = await makeJob(store.id, store.owner.id);
		expect([first.number, second.number]).toEqual([1001, 1002]);
	});

	it('gives concurrent creates distinct numbers', async () => {
		const store = await makeStore('Busy Floors');
		const c = await makeCustomer(store.id);
		const made = await Promise.all(
			Array.from({ length: 12 }, () =>
				jobs.create(store.id, { customerId: c.id, title: 't' }, store.owner.id)
			)
		);
		expect(new Set(made.map((j) => j?.number)).size).toBe(12);
	});
});

describe('installers', () => {
	it('see only the jobs assigned to them', async () => {
		const store = await makeStore('Crew Floors');
		const rosa = await addMember(store.id, 'installer', 'Rosa');
		const dev = await addMember(store.id, 'installer', 'Dev');
		const hers = await makeJob(store.id, store.owner.id);
		const his = await makeJob(store.id, store.owner.id);
		expect(await jobs.assign(store.id, hers.id, rosa.id, store.owner.id)).toBe('assigned');
		expect(await jobs.assign(store.id, his.id, dev.id, store.owner.id)).toBe('assigned');
		const asRosa = jobScope(grantsOf('installer'), rosa.id);
		const { rows } = await jobs.list(store.id, jobPage, asRosa);
		expect(rows.map((r) => r.id)).toEqual([hers.id]);
		expect(await jobs.read(store.id, his.id, asRosa)).toBeUndefined();
		expect(await jobs.countByStatus(store.id, asRosa)).toEqual({ draft: 1 });
	});

	it('of another store, or people who are not installers, cannot be assigned', async () => {
		const store = await makeStore('Assign Floors');
		const other = await makeStore('Other Floors');
		const outsider = await addMember(other.id, 'installer');
		const seller = await addMember(store.id, 'sales');
		const job = await makeJob(store.id, store.owner.id);
		expect(await jobs.assign(store.id, job.id, outsider.id, store.owner.id)).toBe(
			'not_an_installer'
		);
		expect(await jobs.assign(store.id, job.id, seller.id, store.owner.id)).toBe('not_an_installer');
	});
});

describe('job moves', () => {
	it('follow the state machine and keep a history with who and why', async () => {
		const store = await makeStore('History Floors');
		const job = await makeJob(store.id, store.owner.id);
		expect(await jobs.move(store.id, job.id, 'sold', store.owner.id)).toEqual({
			ok: false,
			reason: 'not_allowed',
			from: 'draft'
		});
		const moved = await jobs.move(store.id, job.id, 'quoted', store.owner.id, 'Sent by hand');
		expect(moved.ok && moved.job.status).toBe('quoted');
		const history = await jobs.events(store.id, job.id);
		expect(history.map((e) => [e.kind, e.fromStatus, e.toStatus, e.note])).toEqual([
			['status', 'draft', 'quoted', 'Sent by hand'],
			['created', null, 'draft', '']
		]);
	});

	it('let only one of two simultaneous moves from the same state win', async () => {
		const store = await makeStore('Race Floors');
		const job = await makeJob(store.id, store.owner.id);
		await jobs.move(store.id, job.id, 'quoted', store.owner.id);
		const [x, y] = await Promise.all([
			jobs.move(store.id, job.id, 'accepted', store.owner.id),
			jobs.move(store.id, job.id, 'draft', store.owner.id)
		]);
		expect([x.ok, y.ok].filter(Boolean)).toHaveLength(1);
	});

	it('delete only draft or cancelled jobs', async () => {
		const store = await makeStore('Delete Floors');
		const job = await makeJob(store.id, store.owner.id);
		await jobs.move(store.id, job.id, 'quoted', store.owner.id);
		expect(await jobs.remove(store.id, job.id)).toBe('not_draft');
		await jobs.move(store.id, job.id, 'cancelled', store.owner.id);
		expect(await jobs.remove(store.id, job.id)).toBe('deleted');
	});
});
