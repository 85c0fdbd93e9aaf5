// The job page as one story, read as a browser reads it (`__data.json` through the real hooks,
// guards and loads): the one next step chosen from the job's state and the viewer's grants, the
// rooms drawn from the measure, and the store's own figures (margin, installer pay, the days the
// engine worked out) only for those who see costs — never a salesperson without the store's
// setting, never an installer.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { changeOrderFromReport } from '$lib/server/change-orders/from-report';
import { inStore, readInStore } from '$lib/server/db/tenant';
import * as jobs from '$lib/server/db/queries/jobs';
import { jobStory } from '$lib/server/jobs/story';
import { moveFacts } from '$lib/server/jobs/move';
import { jobScope } from '$lib/server/object-access';
import { grantsOf } from '$lib/server/permissions';
import { startApp, type App, type PageData, type Visitor } from './app-server';
import {
	addMember,
	makeJob,
	makePaidJob,
	makeQuotedJob,
	sendAndAccept,
	makeStore,
	type TestStore
} from './factories';
import { makeBookedJob } from './field-jobs';
import { completeJob, jobOnSite, recordFound, recordPhoto, soldOf } from './change-order-jobs';

let app: App;
let store: TestStore;
let people: Record<'owner' | 'manager' | 'sales' | 'installer', Visitor>;
const made: Record<string, { id: string }> = {};

beforeAll(async () => {
	app = await startApp();
	store = await makeStore('Larchmere Floors');
	const manager = await addMember(store.id, 'manager', 'Hedda Quarry');
	const sales = await addMember(store.id, 'sales', 'Piet Osgood');
	const booked = await makeBookedJob(store);
	made.fresh = await makeJob(store.id, store.owner.id);
	made.drafted = (await makeQuotedJob(store)).job;
	const accepted = await makeQuotedJob(store);
	await sendAndAccept(store, accepted);
	made.accepted = accepted.job;
	made.sold = (await makePaidJob(store)).job;
	made.booked = booked.job;
	people = {
		owner: await app.signIn(store.owner.email),
		manager: await app.signIn(manager.email),
		sales: await app.signIn(sales.email),
		installer: await app.signIn(booked.installer.user.email)
	};
	// The first request compiles the app's server modules.
	await people.owner.page(`/app/jobs/${made.fresh.id}`);
}, 240_000);

afterAll(async () => {
	await app?.close();
});

function dataOf(page: PageData): Record<string, unknown> {
	if (page.kind !== 'data') throw new Error(`expected page data, got ${JSON.stringify(page)}`);
	return page.data;
}

type Next = { step: string; action: { label: string; href: string } | null; note: string };
const nextOf = async (who: Visitor, jobId: string) =>
	dataOf(await who.page(`/app/jobs/${jobId}`)).next as Next;

/** Every key anywhere in a value. */
function keys(value: unknown, out: string[] = []): string[] {
	if (Array.isArray(value)) for (const v of value) keys(v, out);
	else if (value && typeof value === 'object') {
		for (const [k, v] of Object.entries(value)) {
			out.push(k);
			keys(v, out);
		}
	}
	return out;
}

const STORE_SIDE = ['marginCents', 'marginBps', 'installerPayCents', 'engineDays', 'costCents'];

async function setSalesSeeCosts(on: boolean) {
	const answer = await people.owner.action('/app/settings?/access', {
		...(on ? { salesSeeCosts: 'on' } : {}),
		salesJobs: 'all'
	});
	expect(answer.json()).toMatchObject({ type: 'success' });
}

describe('the moves by hand the page offers', () => {
	it('are checked against the same facts a move reads for itself', async () => {
		const grants = grantsOf('owner');
		for (const [name, { id }] of Object.entries(made)) {
			const [fromStory, ownRead] = await readInStore(store.id, async (tx) => {
				const job = await jobs.readForViewer(tx, id, jobScope(grants, store.owner.id));
				if (!job) throw new Error(`no job ${name}`);
				return [(await jobStory(tx, job, grants)).moveFacts, await moveFacts(tx, id)];
			});
			expect(fromStory, name).toEqual(ownRead);
		}
	});
});

describe('the next step', { timeout: 60_000 }, () => {
	it('follows the job from measure to booking, for the manager', async () => {
		const walk: [string, string, string][] = [
			['fresh', 'measure', `/app/jobs/${made.fresh.id}/measure`],
			['drafted', 'send_quote', `/app/jobs/${made.drafted.id}/quote`],
			['accepted', 'take_deposit', `/app/jobs/${made.accepted.id}/payments`],
			['sold', 'book_install', `/app/schedule?job=${made.sold.id}`],
			['booked', 'await_install', `/app/schedule?job=${made.booked.id}`]
		];
		for (const [job, step, href] of walk) {
			const next = await nextOf(people.manager, made[job].id);
			expect({ job, step: next.step, href: next.action?.href }).toEqual({ job, step, href });
		}
	});

	it('offers a salesperson their own steps, and says who books and takes money', async () => {
		expect((await nextOf(people.sales, made.fresh.id)).action?.label).toBe('Measure the rooms');
		expect((await nextOf(people.sales, made.drafted.id)).action?.label).toBe(
			'Send quote version 1'
		);
		const deposit = await nextOf(people.sales, made.accepted.id);
		expect(deposit).toMatchObject({ step: 'take_deposit', action: null });
		expect(deposit.note).toMatch(/records payments/);
		const book = await nextOf(people.sales, made.sold.id);
		expect(book).toMatchObject({ step: 'book_install', action: null });
	});

	it('asks for a review of what the installer found, then for the balance once complete', async () => {
		const site = await jobOnSite('Corrie Vale Floors');
		const owner = await app.signIn(site.store.owner.email);
		expect((await nextOf(owner, site.job.id)).step).toBe('await_report');

		const hole = { type: 'prep', kind: 'hole_repair' } as const;
		const sold = soldOf(site, hole);
		const [item] = await recordFound(site, [
			{ ref: hole, qty: sold.qty + 1, unit: 'each', roomId: sold.roomId }
		]);
		await recordPhoto(site, { clientId: item.clientId, roomId: item.roomId });
		const raised = await inStore(site.store.id, (tx) =>
			changeOrderFromReport(tx, site.report.id, site.installer.id)
		);
		expect(raised).toMatchObject({ ok: true });
		const page = dataOf(await owner.page(`/app/jobs/${site.job.id}`));
		expect(page.next).toMatchObject({
			step: 'review_change_order',
			action: { label: 'Review CO-1', href: `/app/jobs/${site.job.id}/change-orders/1` }
		});
		// The report photo shows as a thumbnail through the job's own photo address.
		const photos = page.photos as { report: number; thumbs: { href: string }[] };
		expect(photos.report).toBe(1);
		expect(photos.thumbs).toHaveLength(1);
		expect(photos.thumbs[0].href).toMatch(new RegExp(`^/app/jobs/${site.job.id}/photos/`));
		const thumb = await owner.request(`${photos.thumbs[0].href}?size=thumb`);
		expect(thumb.status).toBe(200);
		// The installer reads photos through the field API, never the desk's address.
		const installer = await app.signIn(site.installer.email);
		expect((await installer.request(photos.thumbs[0].href)).status).toBe(403);

		await completeJob(site);
		const done = dataOf(await owner.page(`/app/jobs/${site.job.id}`));
		// The change order is still waiting for review, so that comes first.
		expect((done.next as Next).step).toBe('review_change_order');
		const money = done.money as { ledger: { balanceDueCents: number } };
		expect(money.ledger.balanceDueCents).toBeGreaterThan(0);
	});

	it('asks for the balance of a completed job with nothing left to review', async () => {
		const site = await jobOnSite('Wendle Mill Floors');
		const owner = await app.signIn(site.store.owner.email);
		await completeJob(site);
		const next = await nextOf(owner, site.job.id);
		expect(next).toMatchObject({
			step: 'collect_balance',
			action: { label: 'Collect the balance', href: `/app/jobs/${site.job.id}/payments` }
		});
	});
});

describe("the store's own figures", { timeout: 60_000 }, () => {
	it('go to the owner and the manager: margin, installer pay and the engine’s days', async () => {
		for (const who of [people.owner, people.manager]) {
			const page = dataOf(await who.page(`/app/jobs/${made.booked.id}`));
			const figures = page.storeFigures as Record<string, number>;
			expect(figures).not.toBeNull();
			expect(figures.installerPayCents).toBeGreaterThan(0);
			expect(figures.revenueCents).toBeGreaterThan(0);
			expect(figures.marginCents).toBe(
				figures.revenueCents - figures.installerPayCents - figures.costCents
			);
			expect(figures.engineDays).toBeGreaterThanOrEqual(1);
			expect(figures.proposedDays).toBe(figures.engineDays);
		}
	});

	it('never reach a salesperson without the store’s setting: not one key in the page data', async () => {
		const page = dataOf(await people.sales.page(`/app/jobs/${made.booked.id}`));
		expect(page.storeFigures).toBeNull();
		const found = keys(page).filter((k) => STORE_SIDE.includes(k) || /^pay|margin/i.test(k));
		expect(found).toEqual([]);
		// What the salesperson does see: the quote's versions, the money and the booking.
		expect((page.quotes as unknown[]).length).toBe(1);
		expect(page.booking).toMatchObject({ days: 2 });
	});

	it('reach a salesperson when the owner turns costs on, and leave with the setting', async () => {
		await setSalesSeeCosts(true);
		try {
			const page = dataOf(await people.sales.page(`/app/jobs/${made.booked.id}`));
			expect(page.storeFigures).toMatchObject({ marginCents: expect.any(Number) });
		} finally {
			await setSalesSeeCosts(false);
		}
		const page = dataOf(await people.sales.page(`/app/jobs/${made.booked.id}`));
		expect(page.storeFigures).toBeNull();
	});

	it('never reach an installer, even on the job assigned to them', async () => {
		// The desk's job page is not theirs (their work order is under /field): refused outright.
		const raw = await people.installer.request(`/app/jobs/${made.booked.id}/__data.json`);
		expect(raw.status).toBe(403);
		for (const k of [...STORE_SIDE, 'storeFigures', 'next']) expect(raw.text).not.toContain(k);
		const answer = await people.installer.page(`/app/jobs/${made.booked.id}`);
		if (answer.kind === 'data') expect(answer.data).not.toHaveProperty('job');
	});
});

describe('the rooms', { timeout: 60_000 }, () => {
	it('are drawn from the measure, each with its outline and sizes', async () => {
		const page = dataOf(await people.sales.page(`/app/jobs/${made.drafted.id}`));
		const measure = page.measure as {
			rooms: number;
			sketches: { name: string; area: string; size: string; outline: { outer: unknown[] } }[];
		};
		expect(measure.rooms).toBe(1);
		expect(measure.sketches).toHaveLength(1);
		expect(measure.sketches[0]).toMatchObject({ name: 'Kitchen', area: '120 ft²' });
		expect(measure.sketches[0].size).toMatch(/12 ft.* by 10 ft/);
		expect(measure.sketches[0].outline.outer).toHaveLength(4);
	});

	it('say plainly when nothing is measured, quoted or paid yet', async () => {
		const page = dataOf(await people.manager.page(`/app/jobs/${made.fresh.id}`));
		expect(page).toMatchObject({
			measure: null,
			quotes: [],
			booking: null,
			report: null,
			completion: null,
			storeFigures: null
		});
		expect((page.timeline as { what: string }[]).map((e) => e.what)).toEqual(['Job started']);
	});
});
