// The schedule (issue 10): a manager books a sold job from the job page, the engine's days are
// proposed, the booking shows on the week and the installer and the customer each get an e-mail
// with the calendar file; moving it by the form (the keyboard way) sends the update.
import { demoJob, makeStore, personOf } from './factories';
import { expect, signInAs, test } from './fixtures';
import { freshEmail } from './helpers';

test('a manager books a sold job; the e-mails carry the calendar file; a move sends the update', async ({
	page,
	context
}) => {
	test.slow();
	const store = await makeStore({
		people: ['manager', { role: 'installer', name: 'Ilse Brackwater' }],
		priceBook: true
	});
	const customerEmail = freshEmail('carpet');
	const job = await demoJob(store, 'Two bedrooms, carpet', { customerEmail });
	const installer = personOf(store, 'installer');
	await signInAs(context, personOf(store, 'manager'));

	await page.goto(`/app/jobs/${job.id}`);
	await page.getByRole('link', { name: 'Book install days' }).click();
	await expect(
		page.getByRole('heading', { name: /Book: J-\d+ Two bedrooms, carpet/ })
	).toBeVisible();
	await expect(page.getByText(/The engine proposes \d+ days?/)).toBeVisible();
	const choice = page
		.getByLabel('Installer', { exact: true })
		.locator('option', { hasText: 'Ilse Brackwater' });
	await page
		.getByLabel('Installer', { exact: true })
		.selectOption((await choice.getAttribute('value'))!);
	await page.getByLabel('First day').fill('2027-03-02');
	await page.getByLabel('Arrival').fill('08:00');
	await page.getByRole('button', { name: 'Book', exact: true }).click();
	await expect(
		page.getByText('Booked. The installer and the customer are e-mailed.')
	).toBeVisible();

	await page.goto('/app/schedule?view=week&from=2027-03-02');
	const row = page.getByRole('row', { name: /Ilse Brackwater/ });
	// One link a day booked.
	await expect(
		row.getByRole('link', { name: new RegExp(`J-${job.number}`) }).first()
	).toBeVisible();

	// The keyboard way to move it: open the booking, change the first day, send the form.
	await row
		.getByRole('link', { name: new RegExp(`J-${job.number}`) })
		.first()
		.focus();
	await page.keyboard.press('Enter');
	await expect(page.getByRole('heading', { name: /Move or cancel/ })).toBeVisible();
	await page.getByLabel('First day').fill('2027-03-09');
	await page.getByRole('button', { name: 'Move the booking' }).click();
	await expect(page.getByText('Moved. The new dates are e-mailed.')).toBeVisible();

	await page.goto('/dev/outbox');
	for (const to of [customerEmail, installer.email]) {
		const mails = page.getByRole('listitem').filter({ hasText: `To ${to}` });
		await expect(mails).toHaveCount(2);
		await expect(mails.first().getByRole('link', { name: 'install.ics' })).toBeVisible();
		await mails.first().getByText('Show install.ics').click();
		await expect(mails.first().getByText(/SEQUENCE:2/)).toBeVisible();
		await expect(mails.first().getByText(/DTSTART;VALUE=DATE:20270309/)).toBeVisible();
	}
});
