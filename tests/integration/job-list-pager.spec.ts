// The job list's pages as the browser gets them (server-rendered HTML through the real hooks): a
// search whose count stops at the page (a page and one more found, not how many) still offers the
// next page, from the first page on; the store's list, whose total is exact, its first and last.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inStore } from '$lib/server/db/tenant';
import * as jobs from '$lib/server/db/queries/jobs';
import { startApp, type App, type Visitor } from './app-server';
import { makeCustomer, makeStore, type TestStore } from './factories';

let app: App;
let store: TestStore;
let owner: Visitor;

beforeAll(async () => {
	app = await startApp();
	store = await makeStore('Pagewright Floors');
	const customer = await makeCustomer(store.id, 'Hana Pellow');
	await inStore(store.id, async (tx) => {
		for (let i = 0; i < 30; i++)
			await jobs.create(
				tx,
				{ customerId: customer.id, title: `Oak hall ${i + 1}` },
				store.owner.id
			);
	});
	owner = await app.signIn(store.owner.email);
}, 240_000);

afterAll(async () => {
	await app?.close();
});

/** The page's text, tags and Svelte's markers left out. */
async function textOf(path: string): Promise<string> {
	const answer = await owner.request(path);
	expect(answer.status, path).toBe(200);
	return answer.text
		.replace(/<!--[\s\S]*?-->/g, '')
		.replace(/<[^>]+>/g, ' ')
		.replace(/\s+/g, ' ');
}

describe('the job list pager', { timeout: 60_000 }, () => {
	it('offers the next page of a search sorted by customer, whose count stops at the page', async () => {
		const first = await owner.request('/app/jobs?q=oak&sort=customer&dir=asc');
		expect(first.text).toMatch(/href="\?[^"]*page=2"/);
		expect(await textOf('/app/jobs?q=oak&sort=customer&dir=asc')).toContain(
			'Page 1 of 1+ · 25+ in all'
		);
		const second = await textOf('/app/jobs?q=oak&sort=customer&dir=asc&page=2');
		// The walk read every name on the second page: it knows how many there are.
		expect(second).toContain('Page 2 of 2 · 30 in all');
		expect(second).toContain('Oak hall 1 ');
		expect(second).toContain('Previous');
	});

	it("offers the first and last pages of the store's list, whose total is exact", async () => {
		const first = await owner.request('/app/jobs?pageSize=10');
		expect(first.text).toMatch(/href="\?pageSize=10&amp;page=3"[^>]*>Last</);
		expect(await textOf('/app/jobs?pageSize=10')).toContain('Page 1 of 3 · 30 in all');
		// The last page, read from the end of the order: the oldest jobs, and a way back.
		const last = await owner.request('/app/jobs?pageSize=10&page=3');
		expect(last.text).toMatch(/href="\?pageSize=10&amp;page=1"[^>]*>First</);
		const lastText = await textOf('/app/jobs?pageSize=10&page=3');
		expect(lastText).toContain('Page 3 of 3 · 30 in all');
		expect(lastText).toContain('Oak hall 1 ');
		expect(lastText).not.toContain('Oak hall 11 ');
		expect(lastText).not.toMatch(/\bLast\b/);
	});
});
