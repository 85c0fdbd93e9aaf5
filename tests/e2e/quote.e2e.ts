import { createHmac } from 'node:crypto';
import sharp from 'sharp';
import { demoJob, makeStore, personOf } from './factories';
import { expect, newPage, signInAs, test } from './fixtures';
import { freshEmail, lastMailLink } from './helpers';

/** A copy of the demo store of the test's own: its name, price book and a salesperson. */
const ownStore = () =>
	makeStore({ name: 'Tallow Creek Floors', people: ['sales'], priceBook: true });

test('a salesperson builds and sends the quote; the customer accepts it from the e-mailed link', async ({
	page,
	context,
	browser
}) => {
	// Building, sending and accepting through the pages: slow on a loaded machine.
	test.slow();
	const store = await ownStore();
	// Greta's own address, so the newest mail to it is this test's.
	const greta = freshEmail('greta.oakhurst');
	await demoJob(store, 'Kitchen and hall, vinyl plank', { customerEmail: greta });
	await signInAs(context, personOf(store, 'sales'));
	await page.goto('/app/jobs?q=Kitchen and hall');
	await page.getByRole('link', { name: /Kitchen and hall, vinyl plank/ }).click();
	await page.getByRole('link', { name: 'Open the quote' }).click();
	await expect(page.getByRole('heading', { name: 'No quote yet' })).toBeVisible();
	await page.getByRole('button', { name: 'Build the quote' }).click();

	await expect(page.getByText('Draft: not sent')).toBeVisible();
	// The demo kitchen: an L of 12 × 8 ft and 5 × 6 ft, less a 4 × 2 1/2 ft island: 96 + 30 − 10 = 116 ft².
	await expect(page.getByRole('img', { name: /Kitchen, 116 ft², drawn to scale/ })).toBeVisible();
	// The 1962 house: tear-out of old sheet vinyl carries the asbestos caution (TRADE.md, "Cautions to show").
	await expect(page.getByText(/can contain asbestos/).first()).toBeVisible();
	const total = await page.getByTestId('quote-total').innerText();
	expect(total).toMatch(/^\$[\d,]+\.\d\d$/);

	await expect(page.getByLabel("Customer's e-mail")).toHaveValue(greta);
	await page.getByRole('button', { name: 'Send the quote' }).click();
	await expect(page.getByText('Sent. The customer has the link by e-mail.')).toBeVisible();
	await expect(page.getByText('Sent to the customer').first()).toBeVisible();

	const customer = await newPage(browser, { viewport: { width: 390, height: 844 } });
	const link = await lastMailLink(customer, greta);
	expect(link).toMatch(/\/c\/[\w-]+\.[\w-]+$/);
	await customer.goto(link);
	await expect(customer.getByText('Tallow Creek Floors').first()).toBeVisible();
	await expect(
		customer.getByRole('heading', { name: 'Kitchen and hall, vinyl plank' })
	).toBeVisible();
	await expect(customer.getByTestId('quote-total')).toHaveText(total);
	// The customer never sees installer pay or the store's margin.
	await expect(customer.getByText('Installer pay')).toHaveCount(0);
	await expect(customer.getByText('For the store only')).toHaveCount(0);

	await customer.getByRole('button', { name: 'Accept the quote' }).click();
	await expect(customer.getByText('Type your full name to accept')).toBeVisible();
	await customer.getByLabel('Type your full name').fill('Greta Oakhurst');
	await customer.getByRole('button', { name: 'Accept the quote' }).click();
	await expect(customer.getByText('You accepted this quote')).toBeVisible();
	await expect(customer.getByText('Accepted by Greta Oakhurst')).toBeVisible();
	const pdf = await customer.request.get(`${new URL(link).pathname}/quote.pdf`);
	expect(pdf.headers()['content-type']).toBe('application/pdf');
	expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');

	await page.reload();
	await expect(page.getByText('Accepted by the customer').first()).toBeVisible();
	await page.getByRole('link', { name: /Kitchen and hall, vinyl plank/ }).click();
	await expect(page.getByText('Accepted', { exact: true }).first()).toBeVisible();
	await expect(page.getByText('Accepted by Greta Oakhurst (version 1)')).toBeVisible();
});

test('a customer can ask for changes instead; the job goes back to draft', async ({
	page,
	context,
	browser
}) => {
	const store = await ownStore();
	await demoJob(store, 'Basement carpet');
	await signInAs(context, personOf(store, 'sales'));
	await page.goto('/app/jobs?q=Basement');
	await page.getByRole('link', { name: /Basement carpet/ }).click();
	await page.getByRole('link', { name: 'Open the quote' }).click();
	const link = await page.getByLabel("The customer's link").inputValue();
	const customer = await newPage(browser);
	await customer.goto(link);
	// The slab's RH readings are over the 75 % limit (ASTM F710 / F2170, secondary): the customer
	// reads the prep it calls for in plain words, never the readings and their limits.
	await expect(customer.getByText(/for moisture|moisture barrier/).first()).toBeVisible();
	await expect(customer.getByText(/\bRH\b/)).toHaveCount(0);
	await customer.getByRole('button', { name: 'Ask for changes instead' }).click();
	await customer
		.getByLabel('What should change?')
		.fill('Could we use the berber instead of the plush?');
	await customer.getByRole('button', { name: 'Send to Tallow Creek Floors' }).click();
	await expect(customer.getByText('You asked for changes')).toBeVisible();
	await page.reload();
	await expect(page.getByText('The customer asked for changes').first()).toBeVisible();
	await expect(page.getByText('Could we use the berber instead of the plush?')).toBeVisible();
});

test('a forged or expired customer link shows a clear page and no data', async ({ page }) => {
	const forged = await page.goto(
		'/c/eyJzIjoieCIsImoiOiJ5IiwiZSI6NDEwMjQ0NDgwMH0.not-the-signature'
	);
	expect(forged?.status()).toBe(404);
	await expect(page.getByRole('heading', { name: 'This link cannot be opened' })).toBeVisible();
	await expect(page.getByText('Tallow Creek Floors')).toHaveCount(0);

	// A correctly signed link whose time is up (signed as the server signs, with its secret).
	const secret = process.env.BETTER_AUTH_SECRET!;
	const payload = Buffer.from(JSON.stringify({ s: 'any', j: 'any', e: 1_000_000_000 })).toString(
		'base64url'
	);
	const key = createHmac('sha256', secret).update('flushline customer link v1').digest();
	const signature = createHmac('sha256', key).update(payload).digest('base64url');
	const expired = await page.goto(`/c/${payload}.${signature}`);
	expect(expired?.status()).toBe(410);
	await expect(page.getByRole('heading', { name: 'This link has expired' })).toBeVisible();
});

test("the customer's page and PDF carry the store's logo", async ({ page, context, browser }) => {
	// A logo upload, the customer's page and the PDF: slow on a loaded machine.
	test.slow();
	const store = await ownStore();
	await demoJob(store, 'Living room oak');
	await signInAs(context, store.people[0]);
	await page.goto('/app/settings');
	const png = await sharp({
		create: { width: 320, height: 120, channels: 3, background: { r: 169, g: 101, b: 44 } }
	})
		.png()
		.toBuffer();
	await page
		.getByLabel('Logo file')
		.setInputFiles({ name: 'logo.png', mimeType: 'image/png', buffer: png });
	await page.getByRole('button', { name: 'Upload the logo' }).click();
	await expect(page.getByRole('img', { name: 'Tallow Creek Floors logo' })).toBeVisible();

	await page.goto('/app/jobs?q=Living room oak');
	await page.getByRole('link', { name: /Living room oak/ }).click();
	await page.getByRole('link', { name: 'Open the quote' }).click();
	const link = await page.getByLabel("The customer's link").inputValue();
	const customer = await newPage(browser);
	await customer.goto(link);
	await expect(customer.getByRole('img', { name: 'Tallow Creek Floors logo' })).toBeVisible();
	const served = await customer.request.get(`${new URL(link).pathname}/logo`);
	expect(served.headers()['content-type']).toBe('image/png');
	const pdf = await customer.request.get(`${new URL(link).pathname}/quote.pdf`);
	// An embedded image is an XObject of subtype Image in the PDF.
	expect((await pdf.body()).toString('latin1')).toMatch(/\/Subtype\s*\/Image/);
	// A forged link gets no logo either.
	expect((await customer.request.get('/c/not.valid/logo')).status()).toBe(404);

	await page.goto('/app/settings');
	await page.getByRole('button', { name: 'Remove the logo' }).click();
	await expect(page.getByText('No logo yet')).toBeVisible();
});
