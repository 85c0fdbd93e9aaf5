import sharp from 'sharp';
import { makeStore } from './factories';
import { expect, signInAs, test } from './fixtures';

// Each test changes its store: a store of its own, with the demo's settings and price book.
test.beforeEach(async ({ context }) => {
	const store = await makeStore({ name: 'Tallow Creek Floors', priceBook: true });
	await signInAs(context, store.people[0]);
});

test('the owner changes the tax rate and the deposit rule, and a bad rate is refused by its field', async ({
	page
}) => {
	await page.goto('/app/settings');
	await expect(page.getByRole('heading', { name: 'Trade settings' })).toBeVisible();
	await expect(page.getByLabel('Tax 1 name')).toHaveValue('Bramblefield sales tax');
	await expect(page.getByLabel('Tax 1 rate, %')).toHaveValue('6.5');
	await expect(page.getByText('Store’s choice: there is no published standard.')).toBeVisible();

	await page.getByLabel('Tax 1 rate, %').fill('');
	await page.getByLabel('Deposit, % of the total').fill('40');
	await page.getByRole('button', { name: 'Save trade settings' }).click();
	await expect(page.getByText('Enter the rate, e.g. 6.5')).toBeVisible();
	await expect(page.getByLabel('Tax 1 rate, %')).toHaveAttribute('aria-invalid', 'true');
	await expect(page.getByLabel('Deposit, % of the total')).toHaveValue('40');

	await page.getByLabel('Tax 1 rate, %').fill('7.25');
	await page.getByRole('group', { name: 'Tax 1 applies to' }).getByLabel('Install labour').check();
	await page.getByLabel('Minimum deposit, $').fill('300');
	await page.getByRole('button', { name: 'Save trade settings' }).click();
	await expect(page.getByText('Trade settings saved.')).toBeVisible();

	await page.reload();
	await expect(page.getByLabel('Tax 1 rate, %')).toHaveValue('7.25');
	await expect(
		page.getByRole('group', { name: 'Tax 1 applies to' }).getByLabel('Install labour')
	).toBeChecked();
	await expect(page.getByLabel('Deposit, % of the total')).toHaveValue('40');
	await expect(page.getByLabel('Minimum deposit, $')).toHaveValue('300.00');
});

test('the owner uploads a logo, a file that is not an image is refused, and the logo is removed', async ({
	page
}) => {
	await page.goto('/app/settings');
	await expect(page.getByText('No logo yet')).toBeVisible();

	await page.getByLabel('Logo file').setInputFiles({
		name: 'logo.png',
		mimeType: 'image/png',
		buffer: Buffer.from('this is text, not a picture')
	});
	await page.getByRole('button', { name: 'Upload the logo' }).click();
	await expect(page.getByText('The file is not a PNG or JPEG image')).toBeVisible();

	const png = await sharp({
		create: { width: 1000, height: 300, channels: 4, background: '#8a4f27' }
	})
		.png()
		.toBuffer();
	await page.getByLabel('Logo file').setInputFiles({
		name: 'tallow.png',
		mimeType: 'image/png',
		buffer: png
	});
	await page.getByRole('button', { name: 'Upload the logo' }).click();
	await expect(page.getByText('Logo saved.')).toBeVisible();
	const img = page.getByRole('img', { name: 'Tallow Creek Floors logo' });
	await expect(img).toBeVisible();
	const served = await page.request.get((await img.getAttribute('src'))!);
	expect(served.headers()['content-type']).toBe('image/png');
	const meta = await sharp(await served.body()).metadata();
	expect(meta.width).toBe(600);

	await page.getByRole('button', { name: 'Remove the logo' }).click();
	await expect(page.getByText('Logo removed.')).toBeVisible();
	await expect(page.getByText('No logo yet')).toBeVisible();
	expect((await page.request.get('/api/v1/store/logo')).status()).toBe(404);
});
