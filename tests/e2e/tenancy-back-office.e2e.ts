// A member of Tallow Creek Floors cannot read, change or delete a Hollin Vale site or price-book
// line through pages, form actions or the JSON API: 404, and nothing changes for Hollin Vale.
import type { APIRequestContext } from '@playwright/test';
import { makeStore, personOf } from './factories';
import { expect, requestAs, test } from './fixtures';

let hollin: APIRequestContext;
let owner: APIRequestContext;
let manager: APIRequestContext;
let theirCustomer: { id: string };
let theirSite: { id: string; address: string };
let theirLine: { id: string; name: string };

const json = { 'content-type': 'application/json', accept: 'application/json' };

// The demo stores, read as their people (and written only where the app must refuse).
test.beforeAll(async ({ playwright }) => {
	[hollin, owner, manager] = await Promise.all([
		requestAs(playwright, 'hollinOwner'),
		requestAs(playwright, 'owner'),
		requestAs(playwright, 'manager')
	]);
	theirCustomer = (await (await hollin.get('/api/v1/customers')).json()).rows[0];
	theirSite = (await (await hollin.get(`/api/v1/customers/${theirCustomer.id}/sites`)).json())
		.rows[0];
	theirLine = (await (await hollin.get('/api/v1/price-items?section=floor')).json()).rows[0];
	expect(theirSite.address).toBe('12 Sluice Row');
	expect(theirLine.name).toBe('Hollin porcelain 24 × 24 in');
});

test.afterAll(async () => {
	await Promise.all([hollin, owner, manager].map((c) => c.dispose()));
});

test("another store's site is 404 through the API and the customer page's actions", async ({
	baseURL
}) => {
	for (const member of [owner, manager]) {
		expect((await member.get(`/api/v1/sites/${theirSite.id}`)).status()).toBe(404);
		expect(
			(
				await member.patch(`/api/v1/sites/${theirSite.id}`, {
					headers: json,
					data: { address: 'Taken' }
				})
			).status()
		).toBe(404);
		expect((await member.delete(`/api/v1/sites/${theirSite.id}`)).status()).toBe(404);
		expect((await member.get(`/api/v1/customers/${theirCustomer.id}/sites`)).status()).toBe(404);
		expect(
			(
				await member.post(`/api/v1/customers/${theirCustomer.id}/sites`, {
					headers: json,
					data: { address: 'Taken' }
				})
			).status()
		).toBe(404);
	}
	const form = { headers: { origin: baseURL!, accept: 'text/html' }, maxRedirects: 0 };
	// Their customer's page and its site actions.
	expect((await owner.get(`/app/customers/${theirCustomer.id}`)).status()).toBe(404);
	for (const [action, data] of [
		['addSite', { address: 'Taken' }],
		['saveSite', { siteId: theirSite.id, address: 'Taken' }],
		['deleteSite', { siteId: theirSite.id }]
	] as const) {
		const r = await owner.post(`/app/customers/${theirCustomer.id}?/${action}`, {
			...form,
			form: data
		});
		expect(r.status(), action).toBe(404);
	}
	// Through one of our own customers and jobs: their site id is as unknown as a made-up one.
	const ours = (await (await owner.get('/api/v1/customers?q=Oakhurst')).json()).rows[0];
	for (const [action, data] of [
		['saveSite', { siteId: theirSite.id, address: 'Taken' }],
		['deleteSite', { siteId: theirSite.id }]
	] as const) {
		const r = await owner.post(`/app/customers/${ours.id}?/${action}`, { ...form, form: data });
		expect(r.status(), action).toBe(404);
	}
	const ourJob = (await (await owner.get('/api/v1/jobs?q=Oakhurst')).json()).rows[0];
	const moved = await owner.post(`/app/jobs/${ourJob.id}?/site`, {
		...form,
		form: { siteId: theirSite.id }
	});
	expect(moved.status()).toBe(400);
	const started = await owner.post(`/app/customers/${ours.id}?/startJob`, {
		...form,
		form: { title: 'On their site', siteId: theirSite.id }
	});
	expect(started.status()).toBe(400);
	// Their job's site section is theirs too.
	const theirJob = (await (await hollin.get('/api/v1/jobs')).json()).rows[0];
	expect(
		(await owner.post(`/app/jobs/${theirJob.id}?/site`, { ...form, form: { siteId: '' } })).status()
	).toBe(404);

	const still = await (await hollin.get(`/api/v1/sites/${theirSite.id}`)).json();
	expect(still.address).toBe('12 Sluice Row');
});

test("another store's price-book line is 404 through its page, its actions and the API", async ({
	baseURL
}) => {
	const form = { headers: { origin: baseURL!, accept: 'text/html' }, maxRedirects: 0 };
	for (const member of [owner, manager]) {
		expect((await member.get(`/app/price-book/${theirLine.id}`)).status()).toBe(404);
		for (const [action, data] of [
			['save', { name: 'Taken', materialPrice: '1' }],
			['toggle', {}],
			['delete', {}]
		] as const) {
			const r = await member.post(`/app/price-book/${theirLine.id}?/${action}`, {
				...form,
				form: data
			});
			expect(r.status(), action).toBe(404);
		}
		const fromList = await member.post('/app/price-book?/toggle', {
			...form,
			form: { id: theirLine.id }
		});
		expect(fromList.status()).toBe(404);
		expect((await member.get(`/api/v1/price-items/${theirLine.id}`)).status()).toBe(404);
		expect(
			(
				await member.patch(`/api/v1/price-items/${theirLine.id}`, {
					headers: json,
					data: { active: false }
				})
			).status()
		).toBe(404);
		expect((await member.delete(`/api/v1/price-items/${theirLine.id}`)).status()).toBe(404);
		const listed = await (await member.get('/api/v1/price-items')).json();
		expect(listed.rows.map((r: { id: string }) => r.id)).not.toContain(theirLine.id);
	}
	const still = await (await hollin.get(`/api/v1/price-items/${theirLine.id}`)).json();
	expect(still).toMatchObject({ name: 'Hollin porcelain 24 × 24 in', active: true });
});

test('the price-items API names each bad field of the engine’s shape and writes nothing', async ({
	playwright
}) => {
	// Counted in a store of the test's own with the demo's book: nothing else adds lines there.
	const store = await makeStore({ people: ['manager'], priceBook: true });
	const ownManager = await requestAs(playwright, personOf(store, 'manager'));
	const before = (await (await ownManager.get('/api/v1/price-items')).json()).rows.length;
	const bad = await ownManager.post('/api/v1/price-items', {
		headers: json,
		data: {
			section: 'floor',
			name: 'Half a product',
			data: { kind: 'laminate', material: { basis: 'carton', priceCents: 12.5 } }
		}
	});
	expect(bad.status()).toBe(400);
	const paths = (await bad.json()).issues.map((i: { path: string }) => i.path);
	expect(paths).toEqual(
		expect.arrayContaining([
			'data.material.priceCents',
			'data.labourCentsPerSqFt',
			'data.payCentsPerSqFt'
		])
	);
	const twice = await ownManager.post('/api/v1/price-items', {
		headers: json,
		data: {
			section: 'removal',
			code: 'carpet',
			name: 'Again',
			data: { basis: 'sqft', priceCents: 1, payCents: 1 }
		}
	});
	expect(twice.status()).toBe(409);
	expect((await (await ownManager.get('/api/v1/price-items')).json()).rows.length).toBe(before);
	await ownManager.dispose();
});
