// Who sees what, read as a browser reads it: each role's `__data.json` and API answers from the
// app served in this process (real hooks, guards and loads). Salespeople see sell prices; costs,
// installer pay and margins only where the owner turns it on; card fees never. Installers cannot
// list the store's people through the auth endpoints; an invitation shows only the store's name
// to anyone but its invitee.
import { inStore } from '$lib/server/db/tenant';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sampleJob } from '$lib/estimating/sample';
import * as jobs from '$lib/server/db/queries/jobs';
import { payment } from '$lib/server/db/schema';
import { startApp, type App, type PageData, type Visitor } from './app-server';
import {
	addMember,
	auth,
	makeJob,
	makePaidJob,
	makeStore,
	sessionOf,
	TEST_PASSWORD,
	unique,
	type TestStore
} from './factories';

let app: App;
let store: TestStore;
let paid: Awaited<ReturnType<typeof makePaidJob>>;
let soldBySales: { id: string };
let people: Record<'owner' | 'manager' | 'sales' | 'otherSales' | 'installer', Visitor>;
const emails: string[] = [];
const FEE = 87;

beforeAll(async () => {
	app = await startApp();
	store = await makeStore('Brackenridge Floors');
	const manager = await addMember(store.id, 'manager', 'Ilse Marrow');
	const sales = await addMember(store.id, 'sales', 'Oren Pike');
	const otherSales = await addMember(store.id, 'sales', 'Wynn Calder');
	const installer = await addMember(store.id, 'installer', 'Tove Linnet');
	emails.push(store.owner.email, manager.email, sales.email, otherSales.email, installer.email);
	paid = await makePaidJob(store);
	// What the card processor kept on the deposit (as the Stripe sync records it).
	await inStore(store.id, (tx) =>
		tx.update(payment).set({ feeCents: FEE }).where(eq(payment.id, paid.payment.id))
	);
	await inStore(store.id, (tx) => jobs.assign(tx, paid.job.id, installer.id, store.owner.id));
	soldBySales = await makeJob(store.id, sales.id);
	people = {
		owner: await app.signIn(store.owner.email),
		manager: await app.signIn(manager.email),
		sales: await app.signIn(sales.email),
		otherSales: await app.signIn(otherSales.email),
		installer: await app.signIn(installer.email)
	};
	// The first request compiles the app's server modules: do it before the timed tests.
	await people.owner.page(`/app/jobs/${paid.job.id}`);
}, 240_000);

afterAll(async () => {
	await app?.close();
});

function dataOf(page: PageData): Record<string, unknown> {
	if (page.kind !== 'data') throw new Error(`expected page data, got ${JSON.stringify(page)}`);
	return page.data;
}

/** Every key anywhere in a value, with its value. */
function entries(value: unknown, out: [string, unknown][] = []): [string, unknown][] {
	if (Array.isArray(value)) for (const v of value) entries(v, out);
	else if (value && typeof value === 'object') {
		for (const [k, v] of Object.entries(value)) {
			out.push([k, v]);
			entries(v, out);
		}
	}
	return out;
}

/** Keys that carry what the store pays or keeps, with a number in them. */
const storeSideNumbers = (value: unknown) =>
	entries(value)
		.filter(([k, v]) => /^(cost|pay|fee|margin|installerPay)/i.test(k) && v !== null && v !== 0)
		.filter(([, v]) => typeof v === 'number' || (typeof v === 'object' && !Array.isArray(v)))
		.map(([k]) => k);

async function setAccess(salesSeeCosts: boolean, salesJobs: 'all' | 'own') {
	const answer = await people.owner.action('/app/settings?/access', {
		...(salesSeeCosts ? { salesSeeCosts: 'on' } : {}),
		salesJobs
	});
	expect(answer.status).toBe(200);
	expect(answer.json()).toMatchObject({ type: 'success' });
}

describe("a salesperson's page data", { timeout: 60_000 }, () => {
	it('carries no card fees on the job and its payments; the manager gets them', async () => {
		const sales = dataOf(await people.sales.page(`/app/jobs/${paid.job.id}/payments`));
		const money = sales.money as { payments: { feeCents: unknown }[]; ledger: object };
		expect(money.payments.length).toBeGreaterThan(0);
		expect(money.payments.map((p) => p.feeCents)).toEqual(money.payments.map(() => null));
		expect(money.ledger).toMatchObject({ feesCents: null });
		expect(storeSideNumbers(sales)).toEqual([]);
		expect(sales.showFees).toBe(false);

		const job = dataOf(await people.sales.page(`/app/jobs/${paid.job.id}`));
		expect((job.money as { ledger: object }).ledger).toMatchObject({ feesCents: null });
		expect(storeSideNumbers(job)).toEqual([]);

		const manager = dataOf(await people.manager.page(`/app/jobs/${paid.job.id}/payments`));
		const theirs = manager.money as { payments: { feeCents: unknown }[]; ledger: object };
		expect(theirs.payments.map((p) => p.feeCents)).toContain(FEE);
		expect(theirs.ledger).toMatchObject({ feesCents: FEE });
		const managerJob = dataOf(await people.manager.page(`/app/jobs/${paid.job.id}`));
		expect((managerJob.money as { ledger: object }).ledger).toMatchObject({ feesCents: FEE });
	});

	it('gives the measure page sell prices only: no costs, no installer pay rates', async () => {
		const sales = dataOf(await people.sales.page(`/app/jobs/${paid.job.id}/measure`));
		const book = sales.priceBook as { floors: { material: object }[] };
		expect(book.floors.length).toBeGreaterThan(0);
		expect(entries(book).filter(([k]) => k === 'costCents')).toEqual([]);
		expect(entries(book).filter(([k, v]) => k.startsWith('pay') && v !== 0)).toEqual([]);
		expect(entries(book).some(([k, v]) => k === 'priceCents' && Number(v) > 0)).toBe(true);

		const manager = dataOf(await people.manager.page(`/app/jobs/${paid.job.id}/measure`));
		const full = entries(manager.priceBook);
		expect(full.some(([k, v]) => k === 'costCents' && Number(v) > 0)).toBe(true);
		expect(full.some(([k, v]) => k === 'payCentsPerSqFt' && Number(v) > 0)).toBe(true);
	});

	it('shows the quote without installer pay or margin; the manager sees both', async () => {
		const sales = dataOf(await people.sales.page(`/app/jobs/${paid.job.id}/quote`));
		const view = (sales.current as { view: object }).view;
		expect(view).toHaveProperty('lines');
		expect(view).not.toHaveProperty('pay');
		expect(view).not.toHaveProperty('margin');
		expect(storeSideNumbers(sales)).toEqual([]);

		const manager = dataOf(await people.manager.page(`/app/jobs/${paid.job.id}/quote`));
		expect((manager.current as { view: object }).view).toHaveProperty('margin.marginCents');
	});

	it('reads the price book and its API at sell prices, and may not change it', async () => {
		const page = dataOf(await people.sales.page('/app/price-book'));
		expect((page.items as unknown[]).length).toBeGreaterThan(0);
		expect(storeSideNumbers(page.items)).toEqual([]);
		expect(page).toMatchObject({ canEdit: false, canSeeCosts: false });
		const api = await people.sales.request('/api/v1/price-items');
		expect(api.status).toBe(200);
		expect(api.text).not.toMatch(/costCents|payCents/);
		expect(api.text).toMatch(/priceCents/);
		const write = await people.sales.action('/app/price-book?/toggle', { id: 'x' });
		expect(write.status).toBe(403);

		const manager = dataOf(await people.manager.page('/app/price-book'));
		expect(JSON.stringify(manager.items)).toMatch(/payCents/);
	});

	it('gets the estimate preview at sell prices: no pay, pay total or margin', async () => {
		const job = sampleJob(2);
		for (const room of job.rooms)
			if (room.floor) room.floor.productId = paid.floors[room.floor.productId];
		const body = JSON.stringify({ job });
		const post = (who: Visitor) =>
			who.request('/api/v1/estimates/preview', {
				method: 'POST',
				headers: { 'content-type': 'application/json' },
				body
			});
		const sales = await post(people.sales);
		expect(sales.status).toBe(200);
		const result = sales.json() as Record<string, unknown>;
		expect(result).toHaveProperty('totals');
		for (const hidden of ['pay', 'installerPayCents', 'margin'])
			expect(result).not.toHaveProperty(hidden);
		const manager = (await post(people.manager)).json() as Record<string, unknown>;
		expect(manager).toHaveProperty('margin');
		expect(manager.installerPayCents).toBeGreaterThan(0);
	});
});

describe('the owner\'s "Who sees what" settings', { timeout: 60_000 }, () => {
	it('shows salespeople costs, pay and margins when turned on, and card fees still never', async () => {
		expect(dataOf(await people.owner.page('/app/settings')).access).toEqual({
			salesSeeCosts: false,
			salesJobs: 'all'
		});
		await setAccess(true, 'all');
		try {
			const quote = dataOf(await people.sales.page(`/app/jobs/${paid.job.id}/quote`));
			expect((quote.current as { view: object }).view).toHaveProperty('margin.marginCents');
			const measure = dataOf(await people.sales.page(`/app/jobs/${paid.job.id}/measure`));
			expect(entries(measure.priceBook).some(([k, v]) => k === 'costCents' && Number(v) > 0)).toBe(
				true
			);
			const money = dataOf(await people.sales.page(`/app/jobs/${paid.job.id}/payments`));
			expect((money.money as { ledger: object }).ledger).toMatchObject({ feesCents: null });
			expect(
				(money.money as { payments: { feeCents: unknown }[] }).payments.every(
					(p) => p.feeCents === null
				)
			).toBe(true);
		} finally {
			await setAccess(false, 'all');
		}
		const quote = dataOf(await people.sales.page(`/app/jobs/${paid.job.id}/quote`));
		expect((quote.current as { view: object }).view).not.toHaveProperty('margin');
	});

	it("are the owner's alone, and a value outside the choices is refused by its field", async () => {
		const manager = await people.manager.action('/app/settings?/access', {
			salesSeeCosts: 'on',
			salesJobs: 'all'
		});
		expect(manager.status).toBe(403);
		const bad = await people.owner.action('/app/settings?/access', { salesJobs: 'everyone' });
		expect(bad.json()).toMatchObject({ type: 'failure', status: 400 });
		expect(bad.text).toMatch(/Choose which jobs salespeople see/);
		expect(dataOf(await people.owner.page('/app/settings')).access).toEqual({
			salesSeeCosts: false,
			salesJobs: 'all'
		});
	});

	it('keep salespeople to the jobs they sell when the store asks, in pages and the API', async () => {
		await setAccess(false, 'own');
		try {
			const list = dataOf(await people.otherSales.page('/app/jobs'));
			expect((list.rows as { id: string }[]).map((r) => r.id)).toEqual([]);
			const mine = dataOf(await people.sales.page('/app/jobs'));
			expect((mine.rows as { id: string }[]).map((r) => r.id)).toEqual([soldBySales.id]);
			expect(await people.sales.page(`/app/jobs/${paid.job.id}`)).toMatchObject({
				kind: 'error',
				status: 404
			});
			expect((await people.sales.request(`/api/v1/jobs/${paid.job.id}`)).status).toBe(404);
			const patch = await people.otherSales.request(`/api/v1/jobs/${soldBySales.id}`, {
				method: 'PATCH',
				headers: { 'content-type': 'application/json' },
				body: JSON.stringify({ title: 'Taken over' })
			});
			expect(patch.status).toBe(404);
			const move = await people.otherSales.action(`/app/jobs/${soldBySales.id}?/save`, {
				title: 'Taken over',
				notes: ''
			});
			expect(move.status).toBe(404);
			expect((await people.sales.request(`/api/v1/jobs/${soldBySales.id}`)).status).toBe(200);
			// Managers keep the whole store.
			const manager = dataOf(await people.manager.page('/app/jobs'));
			expect((manager.rows as { id: string }[]).map((r) => r.id)).toEqual(
				expect.arrayContaining([paid.job.id, soldBySales.id])
			);
		} finally {
			await setAccess(false, 'all');
		}
		expect((await people.otherSales.request(`/api/v1/jobs/${soldBySales.id}`)).status).toBe(200);
	});
});

describe("the store's people through the auth endpoints", { timeout: 60_000 }, () => {
	const paths = [
		'/api/auth/organization/list-members',
		'/api/auth/organization/list-members/',
		`/api/auth/organization/list-members?organizationId=${'STORE'}`,
		'/api/auth/organization/get-full-organization',
		'/api/auth/organization/list-invitations',
		'/api/auth/organization/get-active-member-role?userId=USER'
	];

	it('are not listed to an installer, a salesperson, or anyone else over HTTP', async () => {
		for (const who of ['installer', 'sales', 'owner'] as const) {
			for (const p of paths) {
				const answer = await people[who].request(
					p.replace('STORE', store.id).replace('USER', store.owner.id)
				);
				expect(answer.status, `${who} ${p}`).toBeGreaterThanOrEqual(400);
				for (const email of emails) expect(answer.text, `${who} ${p}`).not.toContain(email);
			}
		}
	});
});

describe("an invitation's page", { timeout: 60_000 }, () => {
	it("shows only the store's name to anyone but the invitee, signed in", async () => {
		const email = `${unique('invitee')}@test.example`;
		const invitation = await auth.api.createInvitation({
			headers: await sessionOf(store.owner.email),
			body: { email, role: 'manager', organizationId: store.id }
		});
		const path = `/invite/${invitation.id}`;
		const visitors: [string, Visitor][] = [
			['someone signed out', app.anonymous],
			['another member', people.sales]
		];
		for (const [who, visitor] of visitors) {
			const data = dataOf(await visitor.page(path));
			expect(data.invite, who).toEqual({ id: invitation.id, storeName: 'Brackenridge Floors' });
			const text = JSON.stringify(data);
			for (const hidden of [email, 'Manager', 'Brackenridge Floors owner']) {
				expect(text, `${who}: ${hidden}`).not.toContain(hidden);
			}
		}

		await auth.api.signUpEmail({ body: { name: 'Pell Arden', email, password: TEST_PASSWORD } });
		const invitee = dataOf(await (await app.signIn(email)).page(path));
		expect(invitee.invite).toMatchObject({
			storeName: 'Brackenridge Floors',
			email,
			roleLabel: 'Manager',
			inviterName: 'Brackenridge Floors owner',
			state: 'open'
		});
	});

	// Issue 11, rough edges: installers were offered "Start a store".
	it('offers starting a store to staff, never to someone who only installs', async () => {
		expect(dataOf(await people.installer.page('/stores')).offerNewStore).toBe(false);
		expect(dataOf(await people.sales.page('/stores')).offerNewStore).toBe(true);
	});
});
