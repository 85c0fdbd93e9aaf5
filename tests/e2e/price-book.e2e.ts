import type { Page } from '@playwright/test';
import { makeStore, personOf } from './factories';
import { expect, signInAs, test } from './fixtures';

const section = (page: Page, name: string) =>
	page.locator('section').filter({ has: page.getByRole('heading', { name, exact: true }) });

// The manager's tests change the price book: each in a store of its own with the demo's book.
test.describe(() => {
	test.beforeEach(async ({ context }) => {
		const store = await makeStore({ people: ['manager'], priceBook: true });
		await signInAs(context, personOf(store, 'manager'));
	});

	test('the demo manager adds a floor product, and an empty price is refused by its field', async ({
		page
	}) => {
		await page.goto('/app/price-book');
		await expect(page.getByRole('heading', { name: 'Price book' })).toBeVisible();
		await page.getByRole('link', { name: 'Add a floor product' }).click();
		await expect(page.getByRole('heading', { name: 'New floor product' })).toBeVisible();

		await page.getByLabel('Product name').fill('Ashwood plank 6 in');
		await page.getByLabel('Kind of floor').selectOption('hardwood');
		// Only the fields a hardwood uses are offered.
		await expect(page.getByLabel('Roll width')).toHaveCount(0);
		await page.getByLabel('Carton coverage, ft²').fill('20');
		await page.getByLabel('Board width').fill('6 in');
		await page.getByLabel('Material priced').selectOption('carton');
		await page.getByLabel('Material price, $ per carton').fill('');
		await page.getByLabel('Install price, $ per ft²').fill('4.50');
		await page.getByLabel('Installer pay, $ per ft²').fill('2.90');
		await page.getByRole('button', { name: 'Add to the price book' }).click();

		await expect(page.getByText('Nothing was saved: see the fields marked below.')).toBeVisible();
		const price = page.getByLabel('Material price, $ per carton');
		await expect(price).toHaveAttribute('aria-invalid', 'true');
		await expect(page.getByText('Enter the material price, e.g. 12.50')).toBeVisible();
		// What was typed is kept.
		await expect(page.getByLabel('Product name')).toHaveValue('Ashwood plank 6 in');
		await expect(page.getByLabel('Board width')).toHaveValue('6 in');

		// Nothing was saved meanwhile.
		const before = await page.request.get('/api/v1/price-items?section=floor');
		expect(
			(await before.json()).rows.some((r: { name: string }) => r.name === 'Ashwood plank 6 in')
		).toBe(false);

		await price.fill('119.00');
		await page.getByRole('button', { name: 'Add to the price book' }).click();
		await expect(page).toHaveURL(/\/app\/price-book\?added=/);
		const floors = section(page, 'Floors');
		const row = floors.getByRole('row', { name: /Ashwood plank 6 in/ });
		await expect(row).toContainText('$119.00 per carton');
		await expect(row).toContainText('$4.50');
		await expect(row).toContainText('Added');
	});

	test('the demo manager deletes a prep price, adds it again and edits a price', async ({
		page
	}) => {
		await page.goto('/app/price-book');
		const prep = section(page, 'Prep services');
		await prep.getByRole('link', { name: /Grind or plane high spots/ }).click();
		await expect(page.getByRole('heading', { name: 'Grind or plane high spots' })).toBeVisible();
		await page.getByRole('button', { name: 'Delete this line' }).click();
		// It asks first, in a dialog that holds the focus.
		const ask = page.getByRole('alertdialog', { name: 'Delete this price?' });
		await expect(ask.getByRole('button', { name: 'Keep it' })).toBeFocused();
		await ask.getByRole('button', { name: 'Delete the line' }).click();
		await expect(page).toHaveURL(/\/app\/price-book#prep$/);
		await expect(prep.getByRole('link', { name: /Grind or plane high spots/ })).toHaveCount(0);

		await prep.getByRole('link', { name: 'Add grind or plane high spots' }).click();
		await expect(page.getByRole('heading', { name: 'New prep price' })).toBeVisible();
		await expect(page.getByLabel('Prep service')).toHaveValue('grind');
		await expect(page.getByLabel('Priced')).toHaveValue('each');
		await page.getByLabel(/Customer price/).fill('52.00');
		await page.getByRole('button', { name: 'Add to the price book' }).click();
		await expect(page.getByText('Enter the installer pay, e.g. 12.50')).toBeVisible();
		await page.getByLabel(/Installer pay/).fill('34');
		await page.getByRole('button', { name: 'Add to the price book' }).click();
		await expect(page).toHaveURL(/\/app\/price-book\?added=/);
		await expect(prep.getByRole('row', { name: /Grind or plane high spots/ })).toContainText(
			'$52.00 each'
		);

		// Edit: the transition price changes; the page says quotes keep what they were built with.
		await prep.getByRole('link', { name: /Transition strips/ }).click();
		await page.getByLabel(/Customer price/).fill('27.50');
		await page.getByRole('button', { name: 'Save changes' }).click();
		await expect(page.getByText(/Saved\. Quotes already built keep/)).toBeVisible();
		await page.goto('/app/price-book');
		await expect(prep.getByRole('row', { name: /Transition strips/ })).toContainText('$27.50 each');
	});

	test('a line is deactivated and reactivated from the list', async ({ page }) => {
		await page.goto('/app/price-book');
		const removal = section(page, 'Removal of existing floors');
		await expect(removal.getByText(/asbestos/)).toBeVisible();
		const row = removal.getByRole('row', { name: /Carpet and pad/ });
		await row.getByRole('button', { name: /Deactivate/ }).click();
		await expect(row).toContainText('Inactive');
		await row.getByRole('button', { name: /Reactivate/ }).click();
		await expect(row).toContainText('In use');
	});
});

test.describe(() => {
	test.use({ signedInAs: 'sales' });

	test('the demo salesperson reads the price book at sell prices and cannot change it', async ({
		page,
		baseURL
	}) => {
		await page.goto('/app/price-book');
		await expect(page.getByRole('heading', { name: 'Price book' })).toBeVisible();
		await expect(page.getByRole('columnheader', { name: 'Material' })).toBeVisible();
		await expect(page.getByRole('columnheader', { name: /Installer pay/ })).toHaveCount(0);
		await expect(page.getByRole('link', { name: 'Add a floor product' })).toHaveCount(0);
		await expect(page.getByRole('button', { name: /Deactivate/ })).toHaveCount(0);
		expect((await page.goto('/app/price-book/new/floor'))?.status()).toBe(403);
		const api = await page.request.get('/api/v1/price-items');
		expect(api.status()).toBe(200);
		expect(JSON.stringify(await api.json())).not.toMatch(/costCents|payCents/);
		const write = await page.request.post('/api/v1/price-items', {
			headers: { origin: baseURL!, 'content-type': 'application/json' },
			data: { section: 'supply', code: 'fastener', name: 'Screws', data: {} }
		});
		expect(write.status()).toBe(403);
	});
});
