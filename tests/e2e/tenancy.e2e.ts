// A member of one store cannot list, read, change or delete another store's rows through pages,
// form actions or the JSON API: the answer is 404, never the row, and nothing changes.
import type { APIRequestContext } from '@playwright/test';
import { makeStore, personOf } from './factories';
import { expect, requestAs, test } from './fixtures';

let hollin: APIRequestContext;
let tallowOwner: APIRequestContext;
let tallowSales: APIRequestContext;
let rosa: APIRequestContext;
let theirCustomer: { id: string; name: string };
let theirJob: { id: string; title: string };

const json = { 'content-type': 'application/json', accept: 'application/json' };

// The demo stores, read as their people (and written only where the app must refuse).
test.beforeAll(async ({ playwright }) => {
	[hollin, tallowOwner, tallowSales, rosa] = await Promise.all([
		requestAs(playwright, 'hollinOwner'),
		requestAs(playwright, 'owner'),
		requestAs(playwright, 'sales'),
		requestAs(playwright, 'installer')
	]);
	theirCustomer = (await (await hollin.get('/api/v1/customers')).json()).rows[0];
	theirJob = (await (await hollin.get('/api/v1/jobs')).json()).rows[0];
	expect(theirCustomer.name).toBe('Pim Arkwright');
	expect(theirJob.title).toBe('Entry hall porcelain');
});

test.afterAll(async () => {
	await Promise.all([hollin, tallowOwner, tallowSales, rosa].map((c) => c.dispose()));
});

test("another store's customer is 404 on its page, its form actions and the API", async ({
	baseURL
}) => {
	for (const member of [tallowOwner, tallowSales]) {
		expect((await member.get(`/app/customers/${theirCustomer.id}`)).status()).toBe(404);
		const form = { headers: { origin: baseURL!, accept: 'text/html' }, maxRedirects: 0 };
		expect(
			(
				await member.post(`/app/customers/${theirCustomer.id}?/save`, {
					...form,
					form: { name: 'Taken' }
				})
			).status()
		).toBe(404);
		expect(
			(
				await member.post(`/app/customers/${theirCustomer.id}?/startJob`, {
					...form,
					form: { title: 'Taken' }
				})
			).status()
		).toBe(404);
		const api = await member.get(`/api/v1/customers/${theirCustomer.id}`);
		expect(api.status()).toBe(404);
		expect(await api.json()).toEqual({ message: 'Not found' });
		expect(
			(
				await member.patch(`/api/v1/customers/${theirCustomer.id}`, {
					headers: json,
					data: { name: 'Taken' }
				})
			).status()
		).toBe(404);
		const listed = await (await member.get('/api/v1/customers?pageSize=100')).json();
		expect(listed.rows.map((r: { id: string }) => r.id)).not.toContain(theirCustomer.id);
		const search = await (await member.get('/api/v1/customers?q=Arkwright')).json();
		expect(search.total).toBe(0);
	}
	// The owner may delete customers: still 404 for another store's.
	const form = {
		headers: { origin: baseURL!, accept: 'text/html' },
		maxRedirects: 0,
		form: { confirm: 'yes' }
	};
	expect(
		(await tallowOwner.post(`/app/customers/${theirCustomer.id}?/delete`, form)).status()
	).toBe(404);
	expect((await tallowOwner.delete(`/api/v1/customers/${theirCustomer.id}`)).status()).toBe(404);
	// Nothing changed for its own store.
	const mine = await (await hollin.get(`/api/v1/customers/${theirCustomer.id}`)).json();
	expect(mine.name).toBe('Pim Arkwright');
});

test("another store's job is 404 on its page, its actions and the API", async ({ baseURL }) => {
	const form = { headers: { origin: baseURL!, accept: 'text/html' }, maxRedirects: 0 };
	expect((await tallowOwner.get(`/app/jobs/${theirJob.id}`)).status()).toBe(404);
	for (const [action, data] of [
		['save', { title: 'Taken' }],
		['move', { to: 'quoted' }],
		['assign', { installerId: '' }],
		['delete', { confirm: 'yes' }]
	] as const) {
		const response = await tallowOwner.post(`/app/jobs/${theirJob.id}?/${action}`, {
			...form,
			form: data
		});
		expect(response.status(), action).toBe(404);
	}
	expect((await tallowOwner.get(`/api/v1/jobs/${theirJob.id}`)).status()).toBe(404);
	expect(
		(
			await tallowOwner.patch(`/api/v1/jobs/${theirJob.id}`, {
				headers: json,
				data: { title: 'x' }
			})
		).status()
	).toBe(404);
	expect(
		(
			await tallowOwner.post(`/api/v1/jobs/${theirJob.id}/moves`, {
				headers: json,
				data: { to: 'quoted' }
			})
		).status()
	).toBe(404);
	expect((await tallowOwner.delete(`/api/v1/jobs/${theirJob.id}`)).status()).toBe(404);
	const created = await tallowOwner.post('/api/v1/jobs', {
		headers: json,
		data: { customerId: theirCustomer.id, title: 'On their customer' }
	});
	expect(created.status()).toBe(404);
	const listed = await (await tallowOwner.get('/api/v1/jobs?pageSize=100')).json();
	expect(listed.rows.map((r: { id: string }) => r.id)).not.toContain(theirJob.id);
	const still = await (await hollin.get(`/api/v1/jobs/${theirJob.id}`)).json();
	expect(still).toMatchObject({ title: 'Entry hall porcelain', status: 'draft' });
});

test("an installer of store A opening store B's job is 404, though B assigned it to them", async () => {
	// Rosa installs for both stores; her active store is Tallow Creek Floors.
	expect((await rosa.get(`/field/jobs/${theirJob.id}`)).status()).toBe(404);
	expect((await rosa.get(`/api/v1/jobs/${theirJob.id}`)).status()).toBe(404);
	const mine = await (await rosa.get('/api/v1/jobs')).json();
	expect(mine.rows.map((r: { title: string }) => r.title).sort()).toEqual([
		'Bathroom tile',
		'Sunroom laminate'
	]);
});

test('the API answers JSON 401 without a session and 403 to a role that may not', async ({
	playwright,
	baseURL
}) => {
	const anonymous = await playwright.request.newContext({ baseURL });
	const noSession = await anonymous.get('/api/v1/customers');
	expect(noSession.status()).toBe(401);
	expect(await noSession.json()).toEqual({ message: 'Sign in first' });
	await anonymous.dispose();

	const ownJobs = await (await tallowSales.get('/api/v1/jobs')).json();
	const refused = await tallowSales.post(`/api/v1/jobs/${ownJobs.rows[0].id}/moves`, {
		headers: json,
		data: { to: 'cancelled' }
	});
	expect(refused.status()).toBe(403);
	expect((await refused.json()).message).toMatch(/does not allow/);
	const installer = await rosa.get('/api/v1/customers');
	expect(installer.status()).toBe(403);
});

test('the API names each bad field of a body, and writes nothing', async ({
	baseURL,
	playwright
}) => {
	// Counted in a store of the test's own, where nothing else adds customers meanwhile.
	const seller = await requestAs(
		playwright,
		personOf(await makeStore({ people: ['sales'] }), 'sales')
	);
	const before = (await (await seller.get('/api/v1/customers')).json()).total;
	const response = await seller.post('/api/v1/customers', {
		headers: json,
		data: { name: '', email: 'not-an-address', phone: 'call me' }
	});
	expect(response.status()).toBe(400);
	const body = await response.json();
	expect(body.issues.map((i: { path: string }) => i.path).sort()).toEqual([
		'email',
		'name',
		'phone'
	]);
	expect((await (await seller.get('/api/v1/customers')).json()).total).toBe(before);
	const notJson = await seller.post('/api/v1/customers', {
		data: 'name=x',
		headers: { 'content-type': 'text/plain', origin: baseURL! }
	});
	expect(notJson.status()).toBe(415);
	await seller.dispose();
});

test('a salesperson posting to the settings form is refused, and the store keeps its name', async ({
	baseURL
}) => {
	const response = await tallowSales.post('/app/settings', {
		headers: { origin: baseURL!, accept: 'text/html' },
		form: { name: 'Hijacked' },
		maxRedirects: 0
	});
	expect(response.status()).toBe(403);
	const me = await (await tallowSales.get('/api/v1/me')).json();
	expect(me.store.name).toBe('Tallow Creek Floors');
});
