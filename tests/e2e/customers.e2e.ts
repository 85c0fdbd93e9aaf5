import type { Page } from '@playwright/test';
import { demoCustomer, makeJob, makeStore, personOf } from './factories';
import { expect, pageAs, signInAs, test } from './fixtures';
import { untilLive } from './helpers';

const names = (page: Page) =>
	page.getByRole('table', { name: 'Customers' }).locator('tbody tr td:first-child');

// Reads the demo store's dozen customers, as the demo salesperson.
test.describe(() => {
	test.use({ signedInAs: 'sales' });

	test('the customers table searches, sorts and pages through the API, and its URL reopens the same view', async ({
		page,
		browser
	}) => {
		await page.goto('/app/customers?pageSize=2');
		// The demo's dozen customers, by name: Beatrix, Cosmo, Dagny, Emrys, Felix, …
		await expect(names(page)).toHaveText(['Beatrix Fallowfield', 'Cosmo Penhallow']);
		await expect(page.getByText(/Page 1 of \d+/)).toBeVisible();

		// Once the page is live, the next page comes from the JSON API, and the URL follows. (A click
		// before the scripts have loaded is a plain link: the server renders page 2 instead.)
		await untilLive(page);
		const next = page.waitForResponse((r) => r.url().includes('/api/v1/customers?'));
		await page.getByRole('link', { name: 'Next' }).click();
		expect((await next).status()).toBe(200);
		await expect(names(page)).toHaveText(['Dagny Wexcombe', 'Emrys Calloway']);
		await expect(page).toHaveURL(/[?&]page=2/);

		// Sorting by a column goes back to the first page.
		await page.getByRole('button', { name: /^Name/ }).click();
		await expect(page).toHaveURL(/sort=name&dir=desc&page=1/);
		await expect(names(page)).toHaveText(['Otto & Lil Vanterpool', 'Marisol Quenby']);
		await expect(page.getByRole('columnheader', { name: /Name/ })).toHaveAttribute(
			'aria-sort',
			'descending'
		);

		await page.getByRole('button', { name: /^Added/ }).click();
		await expect(page).toHaveURL(/sort=created&dir=desc/);
		await expect(names(page).first()).toHaveText('Gideon Marlowe');

		await page.getByRole('searchbox', { name: 'Search customers' }).fill('ruskin');
		await expect(page).toHaveURL(/q=ruskin/);
		await expect(names(page)).toHaveText(['Hana Ruskin']);
		await expect(page.getByText('1 customer matching “ruskin”')).toBeVisible();

		// The link reopens the same view, rendered by the server, with or without JavaScript.
		const url = page.url();
		await page.goto(url);
		await expect(names(page)).toHaveText(['Hana Ruskin']);
		await expect(page.getByRole('searchbox', { name: 'Search customers' })).toHaveValue('ruskin');

		const plain = await pageAs(browser, 'sales', { javaScriptEnabled: false });
		await plain.goto(url.replace('q=ruskin', 'q=o'));
		await expect(names(plain).first()).toHaveText('Gideon Marlowe');
		await expect(plain.getByRole('columnheader', { name: /Added/ })).toHaveAttribute(
			'aria-sort',
			'descending'
		);
	});
});

test('a second site is added to a customer, a job starts there and moves to the other site', async ({
	page,
	context
}) => {
	// Greta at 27 Alder Way with a job there, in a store of the test's own.
	const store = await makeStore({ people: ['sales'] });
	const greta = await demoCustomer(store, 'Greta Oakhurst');
	await makeJob(store, { customer: greta, title: 'Kitchen and hall, vinyl plank' });
	await signInAs(context, personOf(store, 'sales'));
	await page.goto('/app/customers?q=Oakhurst');
	await page.getByRole('link', { name: 'Greta Oakhurst' }).click();
	const sites = page.getByRole('region', { name: 'Sites' });
	await expect(sites.getByRole('listitem', { name: 'Home' })).toContainText('27 Alder Way');

	await sites.getByText('Add a site').click();
	const add = page.locator('form[action="?/addSite"]');
	await add.getByLabel('Label').fill('Rental');
	await add.getByRole('button', { name: 'Add the site' }).click();
	await expect(add.getByText('Enter the street address')).toBeVisible();
	await expect(add.getByLabel('Label')).toHaveValue('Rental');

	await add.getByLabel('Street address').fill('4 Weaver Court');
	await add.getByLabel('Town').fill('Bramblefield');
	await add.getByLabel('Year built').fill('1988');
	await add.getByLabel('Subfloor').fill('OSB');
	await add.getByRole('button', { name: 'Add the site' }).click();
	await expect(sites.getByText('Site saved.')).toBeVisible();
	const rental = sites.getByRole('listitem', { name: 'Rental' });
	await expect(rental).toContainText('4 Weaver Court, Bramblefield');
	await expect(rental).toContainText('Built 1988');
	await expect(rental).toContainText('Subfloor: OSB');
	// The first site has jobs, so it is kept: it offers no delete.
	await expect(
		sites.getByRole('listitem', { name: 'Home' }).getByRole('button', { name: 'Delete this site' })
	).toHaveCount(0);

	const start = page.locator('form[action="?/startJob"]');
	await start.getByLabel('Job title').fill('Rental hallway');
	await start.getByLabel('Site').selectOption({ label: 'Rental: 4 Weaver Court, Bramblefield' });
	await start.getByRole('button', { name: 'Start the job' }).click();
	await expect(page.getByRole('heading', { name: /Rental hallway/ })).toBeVisible();
	const site = page.getByRole('region', { name: 'Site', exact: true });
	await expect(site).toContainText('Rental: 4 Weaver Court, Bramblefield');
	await expect(site).toContainText('Built 1988');

	await site.getByLabel('Move to').selectOption({ label: 'Home: 27 Alder Way, Bramblefield' });
	await site.getByRole('button', { name: 'Save the site' }).click();
	await expect(site.getByText('Site saved.')).toBeVisible();
	await expect(site).toContainText('Built 1962');
});

test('a job started from the jobs page goes to a new address of its customer', async ({
	page,
	context
}) => {
	const store = await makeStore({ people: ['sales'] });
	await demoCustomer(store, 'Ivo Thistlewood');
	await signInAs(context, personOf(store, 'sales'));
	await page.goto('/app/jobs/new');
	await page.getByLabel('Customer').selectOption({ label: 'Ivo Thistlewood' });
	await page.getByLabel('Job title').fill('Porch laminate');
	await page.getByLabel('Site').selectOption('new');
	await page.getByRole('button', { name: 'Start the job' }).click();
	await expect(page.getByText('Enter the street address')).toBeVisible();
	await page.getByLabel('Street address').fill('88 Copse End');
	await page.getByLabel('Year built').fill('2004');
	await page.getByRole('button', { name: 'Start the job' }).click();
	await expect(page.getByRole('heading', { name: /Porch laminate/ })).toBeVisible();
	await expect(page.getByRole('region', { name: 'Site', exact: true })).toContainText(
		'88 Copse End'
	);
});
