// Issue 11, "Done when": the main screens of each role, kept as screenshots under test-results/
// (the desk of each role, a job page, the measure page, the installer's day and the customer's
// quote on a phone), the desk's groups checked against the demo store's seeded jobs, and an
// accessibility check (axe-core) on each main page of each role with no serious or critical
// violation. Reads the demo store only; it writes nothing.
import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';
import { JOBS } from '../../scripts/seed';
import { pool } from '../../src/lib/server/db';
import type { JobStatus } from '../../src/lib/jobs/status';
import { customerLink } from './factories';
import { expect, newPage, pageAs, test, type DemoLogin } from './fixtures';

const PHONE = { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true };
const SHOTS = 'test-results/screens';

/** Where a seeded job in its final state belongs on the desk (PRODUCT.md's states). */
const GROUP_OF: Partial<Record<JobStatus, string>> = {
	draft: 'quote', // measured (the seed measures every job), no quote sent yet
	quoted: 'waiting',
	accepted: 'deposits',
	sold: 'book', // sold and not booked (the seed books only the jobs it schedules)
	completed: 'balances' // the seed's completed job has its balance to pay
};

/** Seeded jobs sold by each demo salesperson: the seed deals them out in turn. */
const SELLERS = ['sales', 'jonah'] as const;

function expectedGroups(seller?: (typeof SELLERS)[number]) {
	const groups = new Map<string, string[]>();
	JOBS.forEach((j, n) => {
		if (seller && SELLERS[n % 2] !== seller) return;
		const kind = GROUP_OF[j.path.at(-1) ?? 'draft'];
		if (!kind) return;
		groups.set(kind, [...(groups.get(kind) ?? []), j.title]);
	});
	return groups;
}

async function demoIds(title: string) {
	const client = await pool.connect();
	try {
		const stores = await client.query<{ id: string }>(
			`select id from organization where slug = 'tallow-creek-floors'`
		);
		const store = stores.rows[0]?.id;
		if (!store) throw new Error('The demo store is not seeded');
		// Store rows are read inside the store (row-level security), as the app reads them.
		await client.query('begin');
		await client.query(`select set_config('app.store_id', $1, true)`, [store]);
		const jobs = await client.query<{ id: string }>(
			'select id from job where organization_id = $1 and title = $2',
			[store, title]
		);
		await client.query('commit');
		if (!jobs.rows[0]) throw new Error(`The demo job ${title} is not seeded`);
		return { store: { id: store }, job: { id: jobs.rows[0].id } };
	} finally {
		client.release();
	}
}

/** Fails on any serious or critical accessibility violation of the page as it is now. */
async function accessible(page: Page, what: string) {
	const result = await new AxeBuilder({ page }).analyze();
	const bad = result.violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.map(
			(v) =>
				`${what}: ${v.id} (${v.impact}) ${v.help}\n  ${v.nodes
					.slice(0, 3)
					.map((n) => n.target.join(' '))
					.join('\n  ')}`
		);
	expect(bad, bad.join('\n')).toEqual([]);
}

async function checkDesk(page: Page, seller?: (typeof SELLERS)[number]) {
	await page.goto('/app');
	await expect(page.getByRole('heading', { level: 1, name: 'Desk' })).toBeVisible();
	const expected = expectedGroups(seller);
	const shown = page.locator('[data-testid^="day-"][data-testid$="-total"]');
	await expect(shown.first()).toBeVisible();
	for (const kind of ['measure', 'quote', 'waiting', 'deposits', 'book', 'balances']) {
		const group = page.getByTestId(`day-${kind}`);
		if ((await group.count()) === 0) {
			// A group the role does not act on (a salesperson does not book installs).
			expect(kind === 'book' && seller !== undefined, `the ${kind} group is missing`).toBe(true);
			continue;
		}
		const titles = expected.get(kind) ?? [];
		await expect(page.getByTestId(`day-${kind}-total`)).toHaveText(String(titles.length));
		for (const title of titles) await expect(group).toContainText(title);
	}
	// Nothing cancelled needs anyone, and a salesperson's groups hold only the jobs they sell.
	const groups = page.locator(
		'section[aria-labelledby="your-move"], section[aria-labelledby="customers-move"]'
	);
	await expect(groups).toHaveCount(2);
	for (const [n, j] of JOBS.entries()) {
		const elsewhere = j.path.at(-1) === 'cancelled' || (seller && SELLERS[n % 2] !== seller);
		if (elsewhere) {
			await expect(groups.first()).not.toContainText(j.title);
			await expect(groups.last()).not.toContainText(j.title);
		}
	}
}

const DESKS: { who: DemoLogin; seller?: (typeof SELLERS)[number] }[] = [
	{ who: 'owner' },
	{ who: 'manager' },
	{ who: 'sales', seller: 'sales' }
];

for (const { who, seller } of DESKS) {
	test(`the desk of the ${who}: the groups hold the seeded jobs; the main pages pass axe`, async ({
		browser
	}) => {
		test.setTimeout(240_000);
		const page = await pageAs(browser, who);
		await checkDesk(page, seller);
		await page.screenshot({ path: `${SHOTS}/desk-${who}.png`, fullPage: true });
		await accessible(page, `/app as ${who}`);

		// The owner's every section; the others' own pages (the same pages, fewer links).
		const pages = {
			owner: [
				'/app/jobs',
				'/app/customers',
				'/app/schedule',
				'/app/installers',
				'/app/statements',
				'/app/payments',
				'/app/price-book',
				'/app/settings',
				'/app/team'
			],
			manager: ['/app/jobs', '/app/schedule'],
			sales: ['/app/jobs', '/app/customers', '/app/calculators']
		}[who as 'owner' | 'manager' | 'sales'];
		for (const path of pages) {
			const response = await page.goto(path);
			expect(response?.status(), path).toBe(200);
			await accessible(page, `${path} as ${who}`);
		}

		// A job in the middle of its story, its measure and its quote (as the owner; the
		// salesperson's job page shows less).
		if (who === 'manager') return;
		const { job } = await demoIds('Bathroom tile');
		await page.goto(`/app/jobs/${job.id}`);
		await expect(page.getByRole('heading', { level: 1 })).toContainText('Bathroom tile');
		await accessible(page, `the job page as ${who}`);
		if (who !== 'owner') return;
		await page.screenshot({ path: `${SHOTS}/job.png`, fullPage: true });
		await page.goto(`/app/jobs/${job.id}/measure`);
		await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
		await accessible(page, 'the measure page');
		await page.screenshot({ path: `${SHOTS}/measure.png`, fullPage: true });
		for (const path of ['quote', 'payments']) {
			await page.goto(`/app/jobs/${job.id}/${path}`);
			await accessible(page, `the job's ${path} page`);
		}
	});
}

test('the desk on a phone: the bar is under 64 px and the menu is a dialog', async ({
	browser
}) => {
	const page = await pageAs(browser, 'manager', PHONE);
	await page.goto('/app');
	const bar = await page.locator('header').first().boundingBox();
	// The bar itself: the section tabs are hidden on a phone.
	expect(bar?.height ?? 999).toBeLessThan(64);
	await page.screenshot({ path: `${SHOTS}/desk-manager-phone.png`, fullPage: true });
	await page.getByRole('button', { name: 'Menu' }).click();
	const menu = page.getByRole('dialog', { name: 'Tallow Creek Floors' });
	await expect(menu.getByRole('link', { name: 'Schedule' })).toBeVisible();
	await accessible(page, 'the phone menu');
	await page.keyboard.press('Escape');
	await expect(menu).toBeHidden();
	await expect(page.getByRole('button', { name: 'Menu' })).toBeFocused();
	// No page of the desk scrolls sideways on a phone.
	for (const path of ['/app', '/app/jobs', '/app/customers', '/app/schedule']) {
		await page.goto(path);
		const wide = await page.evaluate(
			() => document.documentElement.scrollWidth - document.documentElement.clientWidth
		);
		expect(wide, `${path} scrolls sideways`).toBeLessThanOrEqual(0);
	}
});

test("the installer's day on a phone, its work order and pages pass axe", async ({ browser }) => {
	test.setTimeout(180_000);
	const page = await pageAs(browser, 'installer', PHONE);
	await page.goto('/field');
	await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
	await page.screenshot({ path: `${SHOTS}/installer-day.png`, fullPage: true });
	await accessible(page, '/field');
	const firstJob = page.locator('a[href^="/field/jobs/"]').first();
	if ((await firstJob.count()) > 0) {
		await firstJob.click();
		await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
		await page.screenshot({ path: `${SHOTS}/installer-work-order.png`, fullPage: true });
		await accessible(page, 'the work order');
	}
	for (const path of ['/field/profile', '/field/statements', '/field/calculators']) {
		const response = await page.goto(path);
		expect(response?.status(), path).toBe(200);
		await accessible(page, path);
	}
});

test("the customer's quote on a phone passes axe", async ({ browser }) => {
	const { store, job } = await demoIds('Basement carpet');
	const page = await newPage(browser, PHONE);
	await page.goto(customerLink(store, job));
	await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
	await page.screenshot({ path: `${SHOTS}/customer-quote.png`, fullPage: true });
	await accessible(page, 'the customer page');
});
