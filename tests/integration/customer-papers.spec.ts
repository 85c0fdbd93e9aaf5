// The customer's papers: the link's page data (what `__data.json` carries) and the quote PDF say
// what a homeowner should read (rooms, floors, prep in plain words, prices, deposit, the store's
// terms, cancellation policy and next steps, the homeowner's cautions) and none of the
// installer's notes; those are on the work order instead.
import { customerLink } from '$lib/server/customer-page';
import * as jobs from '$lib/server/db/queries/jobs';
import * as measures from '$lib/server/db/queries/measures';
import * as quotes from '$lib/server/db/queries/quotes';
import * as sites from '$lib/server/db/queries/sites';
import { savePapers } from '$lib/server/db/queries/stores';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { readWorkOrder } from '$lib/server/field/work-order';
import { drawQuotePdf } from '$lib/server/pdf/quote-pdf';
import { quotePdfInput } from '$lib/server/quotes/pdf';
import { buildQuote } from '$lib/server/quotes/build';
import type { CustomerQuote } from '$lib/papers/customer-quote';
import { DEFAULT_PAPERS } from '$lib/papers/store-papers';
import { HOMEOWNER_CAUTIONS } from '$lib/papers/audience';
import { inHouseWord } from '$lib/papers/testing';
import { emptyRoom } from '$lib/measure/draft';
import { isActionFailure, type RequestEvent } from '@sveltejs/kit';
import { describe, expect, it, vi } from 'vitest';
import {
	makeCustomer,
	makePriceBook,
	makeSite,
	makeStore,
	memberEvent,
	sendAndAccept,
	TEST_ORIGIN,
	type TestStore
} from './factories';

let current: Partial<RequestEvent> | undefined;
vi.mock('$app/server', () => ({ getRequestEvent: () => current }));
const customerPage = await import('../../src/routes/c/[token]/+page.server');
const settingsPage = await import('../../src/routes/app/settings/+page.server');
const customerPdf = await import('../../src/routes/c/[token]/quote.pdf/+server');

const TERMS = 'Bramblefield terms: the balance is due on the day the last room is finished.';

/**
 * A kitchen with old sheet vinyl (1962 house: the asbestos caution), a hole, a low spot and new
 * underlayment panels (fasteners, leveller bags), and a tiled bath over measured joists.
 */
async function quotedJob(store: TestStore) {
	const { floors } = await makePriceBook(store.id);
	const customer = await makeCustomer(store.id, 'Ottilie Farrow');
	const site = await makeSite(store.id, customer.id);
	const kitchen = {
		...emptyRoom('k', 'Kitchen'),
		shape: { kind: 'rect' as const, width: "12'", length: "14'" },
		floor: { productId: floors['lvp-grey'], layout: 'straight' as const },
		remove: ['sheet_vinyl' as const],
		underlayment: 'yes' as const
	};
	kitchen.repairs.holes = [{ width: '3"', length: '4"' }];
	kitchen.readings.flatness = [{ span: "6'", gap: '1/4"' }];
	kitchen.install.appliances = '1';
	const bath = {
		...emptyRoom('b', 'Bath'),
		shape: { kind: 'rect' as const, width: "6'", length: "8'" },
		floor: { productId: floors['tile-12'], layout: 'straight' as const },
		remove: ['vinyl_tile' as const],
		joists: {
			size: '2x10' as const,
			species: 'spruce_pine_fir' as const,
			spacing: '16"',
			span: "14'"
		}
	};
	bath.install.toilets = '1';
	const made = await inStore(store.id, async (tx) => {
		const job = await jobs.create(
			tx,
			{ customerId: customer.id, title: 'Kitchen and bath floors' },
			store.owner.id
		);
		if (!job) throw new Error('job not created');
		await sites.setJobSite(tx, job.id, site.id);
		const saved = await measures.save(
			tx,
			job.id,
			{ builtYear: '1962', rooms: [kitchen, bath] },
			0,
			store.owner.id
		);
		if (!saved.ok) throw new Error('measure not saved');
		const built = await buildQuote(tx, job.id, store.owner.id);
		if (!built.ok) throw new Error(`quote not built: ${JSON.stringify(built)}`);
		// The store's own terms; cancellation and next steps left blank: the default wording.
		await savePapers(tx, { terms: TERMS, cancellation: '', nextSteps: '' });
		return { job, quote: built.quote };
	});
	await sendAndAccept(store, made);
	const token = (await readInStore(store.id, (tx) => customerLink(tx, made.job.id))).split(
		'/c/'
	)[1];
	return { ...made, token };
}

async function customerLoad(token: string) {
	return (await customerPage.load({
		params: { token },
		url: new URL(`${TEST_ORIGIN}/c/${token}`),
		setHeaders: () => {}
	} as unknown as Parameters<typeof customerPage.load>[0])) as Exclude<
		Awaited<ReturnType<typeof customerPage.load>>,
		void
	>;
}

describe("the customer's papers", async () => {
	const store = await makeStore('Larkspur Floor Co');
	const made = await quotedJob(store);
	const result = made.quote.result;

	it('the quote has in-house notes to keep back: saw depth, fasteners, bags, joists', () => {
		const all = JSON.stringify(result);
		expect(all).toMatch(/saw blade/);
		expect(all).toMatch(/Underlayment fasteners — \d+/);
		expect(all).toMatch(/50 lb bag/);
		expect(result.findings.some((f) => f.check === 'joist_deflection')).toBe(true);
	});

	it("the page's data carries the papers and homeowner cautions, and no in-house words", async () => {
		const data = await customerLoad(made.token);
		const paper: CustomerQuote = data.quote!.paper;
		expect(paper.papers).toEqual({ ...DEFAULT_PAPERS, terms: TERMS });
		expect(paper.cautions.map((c) => c.kind)).toEqual([
			'old_flooring',
			'clear_rooms',
			'fixtures',
			'rooms_out_of_use',
			'dust'
		]);
		expect(paper.cautions[0].text).toBe(HOMEOWNER_CAUTIONS.old_flooring);
		const prep = paper.groups.find((g) => g.key === 'prep')!.lines.map((l) => l.text);
		expect(prep).toContain('Level low spots in Kitchen so the new floor lies flat.');
		expect(prep).toContain(
			'Close the hole in the subfloor in Kitchen so the new floor has solid support everywhere.'
		);
		expect(paper.totals.totalCents).toBe(made.quote.totalCents);
		expect(paper.totals.depositCents).toBe(made.quote.depositCents);
		expect(paper.rooms.map((r) => [r.name, r.floor])).toEqual([
			['Kitchen', 'Grey vinyl plank, laid straight'],
			['Bath', 'Porcelain tile 12 × 24 in, laid straight']
		]);
		// Everything the page's __data.json would carry, ids and all.
		const json = JSON.stringify(data);
		expect(inHouseWord(json)).toBeUndefined();
		expect(json).not.toMatch(/findings|installerPay|margin|payCents|cureHours/);
	});

	it('the quote PDF says the same, and no in-house words', async () => {
		const { text } = await readInStore(store.id, async (tx) => {
			const quote = await quotes.forCustomer(tx, made.job.id);
			return drawQuotePdf(await quotePdfInput(tx, quote!));
		});
		const all = text.join('\n');
		for (const heading of ['What happens next', 'Cancellation', 'Terms', 'Before the install'])
			expect(text).toContain(heading);
		expect(all.replace(/\s+/g, ' ')).toContain(TERMS);
		expect(all).toContain('Old flooring');
		expect(all).toMatch(/can contain asbestos/);
		expect(all).toContain('Level low spots in Kitchen so the new floor lies flat.');
		expect(all).toMatch(/12' 0" × 14' 0"/);
		expect(inHouseWord(all)).toBeUndefined();

		const response = await customerPdf.GET({
			params: { token: made.token }
		} as unknown as Parameters<typeof customerPdf.GET>[0]);
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toBe('application/pdf');
		expect((await response.arrayBuffer()).byteLength).toBeGreaterThan(1000);
	});

	it('the work order carries the in-house notes instead', async () => {
		const order = await readInStore(store.id, (tx) =>
			readWorkOrder(tx, made.job.id, { kind: 'store' })
		);
		const json = JSON.stringify(order);
		expect(json).toMatch(/saw blade/);
		expect(json).toMatch(/fasten every \d+ in on the edges/);
		expect(json).toMatch(/50 lb bag/);
		expect(order!.structure.some((s) => /L\/\d+/.test(s.what))).toBe(true);
		expect(order!.readings.some((r) => r.roomName === 'Kitchen')).toBe(true);
	});
});

describe("the store's papers in Store settings", async () => {
	const store = await makeStore('Quillon Floors');
	const owner = { user: store.owner, role: 'owner' as const, store };
	function post(fields: Record<string, string>) {
		const body = new FormData();
		for (const [k, v] of Object.entries(fields)) body.append(k, v);
		current = memberEvent(owner, '/app/settings?/papers', {}, { method: 'POST', body });
		return settingsPage.actions.papers(current as never);
	}

	it('refuses a text over its bound beside the field, keeping what was typed', async () => {
		const long = 'x'.repeat(4001);
		const answer = await post({ nextSteps: 'Call us.', cancellation: '', terms: long });
		expect(isActionFailure(answer)).toBe(true);
		if (!isActionFailure(answer)) return;
		expect(answer.status).toBe(400);
		const data = answer.data as unknown as {
			papers: { values: Record<string, string>; errors: Record<string, string[]> };
		};
		expect(data.papers.errors).toEqual({ terms: ['Keep it under 4,000 characters'] });
		expect(data.papers.values.nextSteps).toBe('Call us.');
	});

	it('saves the words, shows them in the form, and blank keeps the default', async () => {
		expect(
			await post({ nextSteps: '  We ring you the next day.  ', cancellation: '', terms: '' })
		).toEqual({ papersSaved: true });
		current = memberEvent(owner, '/app/settings', {});
		const page = (await settingsPage.load(current as never)) as {
			papers: { values: Record<string, string>; defaults: typeof DEFAULT_PAPERS };
		};
		expect(page.papers.values).toEqual({
			nextSteps: 'We ring you the next day.',
			cancellation: '',
			terms: ''
		});
		expect(page.papers.defaults).toEqual(DEFAULT_PAPERS);
	});
});
