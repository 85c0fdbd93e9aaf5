// What the installers, schedule and statement pages send, through the real hooks, guards and
// loads: an installer's phone pages carry their own pay and never another installer's, a price
// or a margin; desk pages refuse installers; another store's installer or statement is 404; the
// schedule's booking action answers with its warnings; the statement's CSV adds up.
import { jobLabel } from '$lib/jobs/status';
import * as installers from '$lib/server/db/queries/installers';
import { inStore } from '$lib/server/db/tenant';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type App, type PageData, type Visitor } from './app-server';
import { makePaidJob, makeStore, type TestStore } from './factories';
import { makeInstaller } from './field-factories';

let app: App;
let store: TestStore;
let other: TestStore;
let ana: Awaited<ReturnType<typeof makeInstaller>>;
let ben: Awaited<ReturnType<typeof makeInstaller>>;
let owner: Visitor;
let otherOwner: Visitor;
let anaPhone: Visitor;
let anaStatement: string;
let benStatement: string;
let paid: Awaited<ReturnType<typeof makePaidJob>>;

function dataOf(page: PageData): Record<string, unknown> {
	if (page.kind !== 'data') throw new Error(`expected page data, got ${JSON.stringify(page)}`);
	return page.data;
}

async function statementFor(who: string) {
	const answer = await owner.action('/app/statements?/create', {
		installerId: who,
		periodStart: '2026-10-01',
		periodEnd: '2026-10-31'
	});
	const body = answer.json() as { type: string; location?: string };
	expect(body.type).toBe('redirect');
	return body.location!.split('/').pop()!;
}

beforeAll(async () => {
	app = await startApp();
	store = await makeStore('Tamsin Floors');
	other = await makeStore('Ormsby Tile');
	ana = await makeInstaller(store);
	ben = await makeInstaller(store);
	// Ben's own rate: a figure that must never reach Ana.
	await inStore(store.id, (tx) =>
		installers.save(tx, ben.user.id, {
			...ben.profile,
			payRates: [{ ref: { type: 'prep', kind: 'hole_repair' }, payCents: 7_777 }]
		})
	);
	paid = await makePaidJob(store);
	owner = await app.signIn(store.owner.email);
	otherOwner = await app.signIn(other.owner.email);
	anaPhone = await app.signIn(ana.user.email);
	anaStatement = await statementFor(ana.user.id);
	benStatement = await statementFor(ben.user.id);
	await owner.page('/app');
}, 300_000);

afterAll(async () => {
	await app?.close();
});

describe('the installer’s phone', { timeout: 60_000 }, () => {
	it('shows their own profile and rates, never another’s pay or a price', async () => {
		const data = dataOf(await anaPhone.page('/field/profile'));
		const text = JSON.stringify(data);
		expect(data.profile).toMatchObject({ crewSize: 2, daysOff: [7] });
		expect(text).toContain('5500');
		expect(text).not.toContain('7777');
		expect(text).not.toMatch(/priceCents|costCents|margin|labourCents/i);
	});

	it('lists only their own statements', async () => {
		const data = dataOf(await anaPhone.page('/field/statements'));
		const ids = (data.statements as { id: string }[]).map((s) => s.id);
		expect(ids).toEqual([anaStatement]);
		expect(JSON.stringify(data)).not.toContain(benStatement);
	});

	it('keeps installers off the desk pages', async () => {
		for (const path of [
			'/app/installers',
			`/app/installers/${ben.user.id}`,
			'/app/schedule',
			'/app/statements',
			`/app/statements/${benStatement}`
		]) {
			const page = await anaPhone.request(path, { headers: { accept: 'text/html' } });
			expect(page.status, path).toBe(403);
		}
		const csv = await anaPhone.request(`/app/statements/${benStatement}/export.csv`);
		expect(csv.status).toBe(403);
	});
});

describe('the pages themselves', { timeout: 120_000 }, () => {
	it('render as HTML for the people they are for', async () => {
		const html = { headers: { accept: 'text/html' } };
		for (const path of [
			'/app/installers',
			`/app/installers/${ana.user.id}`,
			'/app/schedule?view=month&from=2027-01-01',
			`/app/schedule?job=${paid.job.id}`,
			'/app/statements',
			`/app/statements/${anaStatement}`,
			`/app/jobs/${paid.job.id}`
		]) {
			const page = await owner.request(path, html);
			expect(page.status, path).toBe(200);
			expect(page.text, path).toContain('</html>');
		}
		for (const path of ['/field/profile', '/field/statements']) {
			const page = await anaPhone.request(path, html);
			expect(page.status, path).toBe(200);
		}
		const job = await owner.request(`/app/jobs/${paid.job.id}`, html);
		expect(job.text).toContain(`/app/schedule?job=${paid.job.id}`);
	});
});

describe('the desk', { timeout: 60_000 }, () => {
	it('answers 404 for another store’s installer and statement', async () => {
		expect(await otherOwner.page(`/app/installers/${ana.user.id}`)).toMatchObject({
			kind: 'error',
			status: 404
		});
		expect(await otherOwner.page(`/app/statements/${anaStatement}`)).toMatchObject({
			kind: 'error',
			status: 404
		});
		expect((await otherOwner.request(`/app/statements/${anaStatement}/export.csv`)).status).toBe(
			404
		);
		const line = await otherOwner.action(`/app/statements/${anaStatement}?/line`, {
			kind: 'chargeback',
			amount: '5.00',
			reason: 'Not theirs'
		});
		expect(line.status).toBe(404);
	});

	it('saves a profile with the form and refuses a bad rate beside its field', async () => {
		const page = dataOf(await owner.page(`/app/installers/${ana.user.id}`));
		const rates = page.rates as { key: string }[];
		const hole = rates.findIndex((r) => r.key === 'prep:hole_repair');
		expect(hole).toBeGreaterThanOrEqual(0);
		const bad = await owner.action(`/app/installers/${ana.user.id}?/save`, {
			crewSize: '3',
			[`rates.${hole}.key`]: 'prep:hole_repair',
			[`rates.${hole}.pay`]: '0,5'
		});
		expect(bad.json()).toMatchObject({ type: 'failure', status: 400 });
		expect(JSON.stringify(bad.json())).toContain(`rates.${hole}.pay`);
		const good = await owner.action(`/app/installers/${ana.user.id}?/save`, {
			crewSize: '3',
			'kinds.laminate': 'on',
			'output.laminate': '500',
			'off.d6': 'on',
			'off.d7': 'on',
			[`rates.${hole}.key`]: 'prep:hole_repair',
			[`rates.${hole}.pay`]: '60.25'
		});
		expect(good.json(), JSON.stringify(good.json())).toMatchObject({ type: 'success' });
		const saved = dataOf(await anaPhone.page('/field/profile')).profile as Record<string, unknown>;
		expect(saved).toMatchObject({
			crewSize: 3,
			floorKinds: ['laminate'],
			sqFtPerDay: { laminate: 500 },
			daysOff: [6, 7]
		});
		expect(JSON.stringify(saved)).toContain('6025');
	});

	it('books from the schedule and tells of a weekday off', async () => {
		// 2027-01-10 is a Sunday: Ben's factory profile has Sundays off.
		const answer = await owner.action('/app/schedule?/book', {
			jobId: paid.job.id,
			installerId: ben.user.id,
			startsOn: '2027-01-10',
			days: '1'
		});
		const body = JSON.stringify(answer.json());
		expect(body).toContain('Booked');
		expect(body).toContain('a day this installer does not work');
		const week = dataOf(await owner.page('/app/schedule?view=week&from=2027-01-10'));
		const shown = week.bookings as { label: string; installerId: string }[];
		expect(shown).toContainEqual(
			expect.objectContaining({ label: jobLabel(paid.job.number), installerId: ben.user.id })
		);
		// Ana is not booked on it and sees nothing of it.
		expect(JSON.stringify(dataOf(await anaPhone.page('/field/profile')))).not.toContain(
			paid.job.id
		);
	});

	it('adds a chargeback and exports the statement as CSV, to the cent', async () => {
		const added = await owner.action(`/app/statements/${anaStatement}?/line`, {
			kind: 'chargeback',
			amount: '12.34',
			reason: '=Scuffed base'
		});
		expect(added.json()).toMatchObject({ type: 'success' });
		const csv = await owner.request(`/app/statements/${anaStatement}/export.csv`);
		expect(csv.status).toBe(200);
		const rows = csv.text.trim().split('\n');
		expect(rows[0]).toContain('amount');
		expect(rows[1]).toContain('chargeback');
		expect(rows[1]).toContain("'=Scuffed base");
		expect(rows[1].endsWith('-12.34')).toBe(true);
		expect(rows[rows.length - 1]).toMatch(/total.*-12\.34$/);
	});
});
