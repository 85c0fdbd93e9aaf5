// Issue 10, end to end on a phone: the manager books a sold job for an installer (the e-mail
// carries the calendar file); the installer opens the work order, checks in, records an extra
// hole and 40 ft² more underlayment with a photo while offline, reloads with no signal and still
// has the draft, comes back online and the report arrives once; the manager sends the change
// order; the customer approves it and pays by the test card; the installer completes the job
// with a photo; the customer signs off and pays the balance; the installer's statement shows the
// base pay plus the extra.
import type { Page } from '@playwright/test';
import sharp from 'sharp';
import { customerLink, demoJob, makeStore, personOf } from './factories';
import { expect, newPage, pageAs, signInAs, test } from './fixtures';
import { freshEmail } from './helpers';

const PHONE = { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true };

async function photo(color: string) {
	return sharp({ create: { width: 1000, height: 750, channels: 3, background: color } })
		.jpeg()
		.toBuffer();
}

/** Pays on the Stripe fake's checkout page with the succeeding test card. */
async function payWithTestCard(customer: Page) {
	await customer.waitForURL(/\/dev\/checkout\/cs_\w+/);
	await customer.getByRole('radio', { name: /Succeeds/ }).check();
	await customer.getByRole('button', { name: /^Pay / }).click();
	await customer.waitForURL(/\/c\/.+\?paid=cs_/);
}

test('a sold job booked, reported from the phone offline, changed, paid, signed off and paid out', async ({
	page: phone,
	context,
	browser
}) => {
	// Four people and three trips through the checkout: minutes on a loaded machine.
	test.setTimeout(480_000);
	const store = await makeStore({
		people: ['manager', { role: 'installer', name: 'Wren Halloway' }],
		priceBook: true,
		stripe: true
	});
	const customerEmail = freshEmail('handoff');
	const job = await demoJob(store, 'Two bedrooms, carpet', { customerEmail });
	const installer = personOf(store, 'installer');
	const today = new Date().toISOString().slice(0, 10);

	// The manager books the job for Wren, starting today.
	const page = await pageAs(browser, personOf(store, 'manager'), PHONE);
	await page.goto(`/app/jobs/${job.id}`);
	await page.getByRole('link', { name: 'Book install days' }).click();
	await expect(page.getByText(/The engine proposes \d+ days?/)).toBeVisible();
	const choice = page
		.getByLabel('Installer', { exact: true })
		.locator('option', { hasText: 'Wren Halloway' });
	await page
		.getByLabel('Installer', { exact: true })
		.selectOption((await choice.getAttribute('value'))!);
	await page.getByLabel('First day').fill(today);
	await page.getByRole('button', { name: 'Book', exact: true }).click();
	await expect(
		page.getByText('Booked. The installer and the customer are e-mailed.')
	).toBeVisible();
	await page.goto('/dev/outbox');
	const booking = page.getByRole('listitem').filter({ hasText: `To ${installer.email}` });
	await expect(booking.first().getByRole('link', { name: 'install.ics' })).toBeVisible();

	// Wren, on the phone (the test's own page and its service worker): the day's job and its
	// work order.
	await signInAs(context, installer);
	const wren = phone;
	await wren.goto('/field');
	await wren
		.getByRole('link', { name: /Two bedrooms, carpet/ })
		.first()
		.click();
	await expect(wren.getByRole('heading', { name: 'Two bedrooms, carpet' })).toBeVisible();
	// Opened afresh, as from the booking e-mail: the page the service worker will keep.
	await wren.goto(`/field/jobs/${job.id}`);
	await expect(wren.getByRole('heading', { name: 'Rooms', exact: true })).toBeVisible();
	await expect(wren.getByRole('img', { name: /^Main bedroom, / })).toBeVisible();
	await expect(wren.getByRole('heading', { name: 'Order of work', exact: true })).toBeVisible();
	await expect(wren.getByRole('heading', { name: 'Cautions', exact: true })).toBeVisible();
	await expect(wren.getByRole('link', { name: 'Work order (PDF)' })).toBeVisible();
	const pdf = await wren.request.get(`/field/jobs/${job.id}/work-order.pdf`);
	expect(pdf.headers()['content-type']).toBe('application/pdf');

	await wren.getByRole('button', { name: 'Check in' }).click();
	await expect(wren.getByRole('heading', { name: 'Field report' })).toBeVisible();
	await wren.evaluate(async () => {
		await navigator.serviceWorker.ready;
	});
	await wren.reload();
	await expect(wren.getByTestId('waiting')).toHaveText('All sent');

	// No signal from here: an extra hole with its photo, and 40 ft² more underlayment.
	await context.setOffline(true);
	const found = wren.getByRole('form', { name: 'What you found' });
	await found
		.getByLabel('Item')
		.selectOption({ label: 'Close subfloor hole (blocking/backing and infill)' });
	await found.getByLabel(/Amount found/).fill('1');
	await found.getByLabel('Note').fill('Soft spot by the closet');
	await found
		.getByLabel('Photo')
		.setInputFiles({ name: 'hole.jpg', mimeType: 'image/jpeg', buffer: await photo('#6b3f1d') });
	await found.getByRole('button', { name: 'Save' }).click();
	// The item and its photo are on the phone (and the form cleared) before the next one.
	await expect(wren.getByTestId('waiting')).toHaveText('2 waiting to send');
	await expect(found.getByLabel(/Amount found/)).toHaveValue('');
	await found.getByLabel('Item').selectOption({ label: 'Install underlayment panels' });
	const sold = Number(
		/Sold: ([\d.,]+)/.exec(await found.getByText(/^Sold:/).innerText())![1].replace(/,/g, '')
	);
	await found.getByLabel(/Amount found/).fill(String(sold + 40));
	await found.getByRole('button', { name: 'Save' }).click();
	await expect(wren.getByTestId('waiting')).toHaveText('3 waiting to send');

	await wren.reload();
	await expect(wren.getByRole('heading', { name: 'Two bedrooms, carpet' })).toBeVisible();
	await expect(wren.getByTestId('waiting')).toHaveText('3 waiting to send');
	await expect(wren.getByRole('list', { name: 'Found' }).getByRole('listitem')).toHaveCount(2);

	await context.setOffline(false);
	await expect(wren.getByTestId('waiting')).toHaveText('All sent', { timeout: 30_000 });
	await wren.getByRole('button', { name: 'Send the report to the store' }).click();
	await expect(
		wren.getByText('Sent. The store will review the difference from what was sold.')
	).toBeVisible();
	// Sent however flaky the network was: one of each on the server.
	const data = await (await wren.request.get(`/field/jobs/${job.id}/__data.json`)).text();
	expect(data.match(/Soft spot by the closet/g)?.length).toBe(1);

	// The manager sends the change order to the customer.
	await page.goto(`/app/jobs/${job.id}`);
	await page.getByRole('link', { name: /CO-1/ }).first().click();
	await expect(page.getByRole('heading', { name: 'Change order CO-1' })).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Photos from the site' })).toBeVisible();
	await page.getByRole('button', { name: 'Send CO-1' }).click();
	await expect(page.getByText(/sent to the customer|with the customer/i).first()).toBeVisible();

	// The customer approves it and pays by the test card.
	const link = customerLink(store, job);
	const customer = await newPage(browser, PHONE);
	await customer.goto(link);
	const co = customer.getByRole('region', { name: 'Change order CO-1' });
	await expect(co.getByRole('img').first()).toBeVisible();
	await co.getByLabel('Type your full name').fill('Otto Vanterpool');
	await co.getByRole('button', { name: 'Approve CO-1' }).click();
	await expect(customer.getByText(/Approved by Otto Vanterpool/)).toBeVisible();
	await customer
		.getByRole('region', { name: 'Change order CO-1' })
		.getByRole('button', { name: /^Pay .* by card$/ })
		.click();
	await payWithTestCard(customer);

	// Wren sees the decision, and finishes the job with a photo.
	await wren.reload();
	await expect(wren.getByRole('region', { name: 'Extras' })).toContainText('Approved');
	const finish = wren.locator('form[action="?/complete"]');
	await finish
		.getByLabel('Photo of the finished floor')
		.setInputFiles({ name: 'done.jpg', mimeType: 'image/jpeg', buffer: await photo('#b08a5a') });
	await finish.getByLabel('Walk-through with the customer').fill('Walked both rooms, all good');
	await expect(wren.getByTestId('waiting')).toHaveText('All sent', { timeout: 30_000 });
	await finish.getByRole('button', { name: 'Mark complete' }).click();
	await expect(wren.getByText('Job marked complete.')).toBeVisible();

	// The customer signs off and pays the balance.
	await customer.goto(link);
	await customer
		.getByRole('region', { name: 'The work is finished' })
		.getByLabel('Type your full name')
		.fill('Otto Vanterpool');
	await customer.getByRole('button', { name: 'Sign off the work' }).click();
	await expect(customer.getByText(/Signed off by Otto Vanterpool/)).toBeVisible();
	await customer.getByRole('button', { name: 'Pay the balance by card' }).click();
	await payWithTestCard(customer);
	await expect(customer.getByText('Payment received')).toBeVisible();

	// The manager makes Wren's statement for this month so far: the base pay plus the extra.
	await page.goto('/app/statements');
	const who = page.getByLabel('Installer', { exact: true });
	await who.selectOption(
		(await who.locator('option', { hasText: 'Wren Halloway' }).getAttribute('value'))!
	);
	await page.getByLabel('First day').fill(`${today.slice(0, 8)}01`);
	await page.getByLabel('Last day').fill(today);
	await page.getByRole('button', { name: 'Make the statement' }).click();
	await expect(page.getByRole('heading', { name: 'Wren Halloway' })).toBeVisible();
	const lines = page.getByRole('region', { name: 'Lines' });
	await expect(lines.getByText(/Install/).first()).toBeVisible();
	await expect(lines.getByText(/CO-1|Extra/).first()).toBeVisible();

	// And Wren sees it on the phone.
	await wren.goto('/field/statements');
	const statement = wren.getByRole('listitem').first();
	await statement.locator('summary').click();
	await expect(statement).toContainText('Install');
	await expect(statement).toContainText(/Extra/);
});
