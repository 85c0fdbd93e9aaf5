// What a person types or chooses before the page's JavaScript has arrived (a slow phone) is kept
// when the page comes alive (src/lib/early-input.ts). Each test holds the page's scripts back,
// uses the page as the server sent it, then lets the scripts in and checks nothing was lost.
import type { Page } from '@playwright/test';
import { demoCustomer, makeStore, personOf } from './factories';
import { expect, signInAs, test } from './fixtures';
import { notLiveYet, untilLive } from './helpers';

/** Holds back the app's scripts until the returned function is called. */
async function holdScripts(page: Page) {
	let release!: () => void;
	const held = new Promise<void>((resolve) => (release = resolve));
	await page.route(/\/_app\/immutable\/.+\.js$/, async (route) => {
		await held;
		await route.continue();
	});
	return release;
}

test('a job started with "A new address…" chosen before the page is live goes to that address', async ({
	page,
	context
}) => {
	const store = await makeStore({ people: ['sales'] });
	await demoCustomer(store, 'Ivo Thistlewood');
	await signInAs(context, personOf(store, 'sales'));

	const release = await holdScripts(page);
	await page.goto('/app/jobs/new', { waitUntil: 'domcontentloaded' });
	await page.getByLabel('Customer').selectOption({ label: 'Ivo Thistlewood' });
	await page.getByLabel('Job title').fill('Porch laminate');
	await page.getByLabel('Site').selectOption('new');
	await page.getByLabel('Street address').fill('88 Copse End');
	await page.getByLabel('Year built').fill('2004');
	// All of that happened before the page was live.
	await notLiveYet(page);

	release();
	await untilLive(page);
	// Live now: the customer's own sites have come, and the choice and the address stayed.
	await expect(
		page.getByLabel('Site').getByRole('option', { name: /3 Larkspur Court/ })
	).toBeAttached();
	await expect(page.getByLabel('Customer')).toHaveValue(/.+/);
	await expect(page.getByLabel('Site')).toHaveValue('new');
	await expect(page.getByText('The new address', { exact: true })).toBeVisible();
	await expect(page.getByLabel('Street address')).toHaveValue('88 Copse End');

	await page.getByRole('button', { name: 'Start the job' }).click();
	await expect(page.getByRole('heading', { name: /Porch laminate/ })).toBeVisible();
	const site = page.getByRole('region', { name: 'Site', exact: true });
	await expect(site).toContainText('88 Copse End');
	await expect(site).toContainText('Built 2004');
});

test('a kind of floor chosen before the page is live keeps its fields and what was typed', async ({
	page,
	context
}) => {
	const store = await makeStore({ people: ['manager'] });
	await signInAs(context, personOf(store, 'manager'));

	const release = await holdScripts(page);
	await page.goto('/app/price-book/new/floor', { waitUntil: 'domcontentloaded' });
	// Without scripts every field shows; the person picks hardwood and types its board width.
	await page.getByLabel('Kind of floor').selectOption('hardwood');
	await page.getByLabel('Board width').fill('6 in');
	await notLiveYet(page);

	release();
	await untilLive(page);
	await expect(page.getByLabel('Kind of floor')).toHaveValue('hardwood');
	// Only a hardwood's fields are offered, and the width typed is still there.
	await expect(page.getByLabel('Roll width')).toHaveCount(0);
	await expect(page.getByLabel('Board width')).toHaveValue('6 in');
});

test.describe(() => {
	test.use({ signedInAs: 'sales' });

	test('a search typed and a box ticked before the page is live are what is searched', async ({
		page
	}) => {
		const release = await holdScripts(page);
		await page.goto('/app/jobs', { waitUntil: 'domcontentloaded' });
		await page.getByRole('searchbox', { name: 'Search' }).fill('Ruskin');
		await page.getByLabel('Sold by me').check();
		await notLiveYet(page);

		release();
		await untilLive(page);
		await expect(page.getByRole('searchbox', { name: 'Search' })).toHaveValue('Ruskin');
		await expect(page.getByLabel('Sold by me')).toBeChecked();

		await page.getByRole('button', { name: 'Show' }).click();
		await expect(page).toHaveURL(/q=Ruskin.*mine=1/);
		// Hana Ruskin's two jobs: the one Priya sold is shown, Jonah's is not.
		await expect(page.getByRole('row', { name: /Living room oak/ })).toBeVisible();
		await expect(page.getByRole('row', { name: /Upstairs landing carpet/ })).toHaveCount(0);
	});

	test('a calculator sent empty before the page is live comes back pointing at the first missing field', async ({
		page
	}) => {
		const release = await holdScripts(page);
		await page.goto('/app/calculators?c=leveller', { waitUntil: 'domcontentloaded' });
		const area = page.getByLabel('Area to level');
		await area.focus();
		await page.keyboard.press('Enter');
		// The plain post came back with the server's answer, still before the page is live.
		await expect(area).toHaveAttribute('aria-invalid', 'true');
		await notLiveYet(page);

		release();
		await untilLive(page);
		await expect(area).toBeFocused();
		await expect(area).toHaveAccessibleDescription(/Enter the area to level/);
	});
});
