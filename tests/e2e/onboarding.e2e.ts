import { expect, test } from './fixtures';
import { freshEmail, lastMailLink } from './helpers';

test('an owner starts a store and invites a salesperson, who joins with the sales navigation', async ({
	page
}) => {
	const owner = freshEmail('owner');
	const seller = freshEmail('seller');

	await page.goto('/sign-up');
	await page.getByLabel('Your name').fill('Wren Halloway');
	await page.getByLabel('E-mail').fill(owner);
	await page.getByLabel('Password').fill('plank-and-joist-7');
	await page.getByRole('button', { name: 'Create login' }).click();
	await expect(page).toHaveURL(/\/stores$/);

	await page.getByLabel('Store name').fill('Juniper Lane Floors');
	await page.getByRole('button', { name: 'Create the store' }).click();
	await expect(page).toHaveURL(/\/app$/);
	const ownerNav = page.getByRole('navigation', { name: 'Main' }).last();
	await expect(ownerNav.getByRole('link', { name: 'Team' })).toBeVisible();
	await expect(ownerNav.getByRole('link', { name: 'Store settings' })).toBeVisible();

	await ownerNav.getByRole('link', { name: 'Team' }).click();
	// The desk's "E-mail that has not gone out" section is a label too: wait for the team page.
	await expect(page).toHaveURL(/\/app\/team$/);
	await page.getByLabel('E-mail', { exact: true }).fill(seller);
	await page.getByLabel('Role', { exact: true }).selectOption('sales');
	await page.getByRole('button', { name: 'Send the invitation' }).click();
	await expect(page.getByText(`Invitation sent to ${seller}`)).toBeVisible();
	await expect(
		page.getByRole('region', { name: 'Open invitations' }).getByText(seller)
	).toBeVisible();
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/sign-in/);

	const link = await lastMailLink(page, seller);
	expect(link).toMatch(/\/invite\/[\w-]+$/);
	await page.goto(link);
	await expect(page.getByRole('heading', { name: 'Join Juniper Lane Floors' })).toBeVisible();
	// Signed out, the link shows the store's name only; the rest once signed in as the invitee.
	await expect(page.getByText('as Sales')).toHaveCount(0);
	await page.getByRole('link', { name: 'Create a login' }).click();
	await page.getByLabel('Your name').fill('Tamsin Yew');
	await page.getByLabel('E-mail').fill(seller);
	await page.getByLabel('Password').fill('counter-sales-42');
	await page.getByRole('button', { name: 'Create login' }).click();

	await expect(page).toHaveURL(new RegExp(new URL(link).pathname));
	await expect(page.getByText('as Sales')).toBeVisible();
	await page.getByRole('button', { name: 'Accept and join' }).click();
	await expect(page).toHaveURL(/\/app$/);
	await expect(page.getByText('Tamsin Yew · Sales')).toBeVisible();
	const salesNav = page.getByRole('navigation', { name: 'Main' }).last();
	await expect(salesNav.getByRole('link')).toHaveText([
		'Desk',
		'Jobs',
		'Customers',
		'Price book',
		'Calculators'
	]);

	const refused = await page.goto('/app/settings');
	expect(refused?.status()).toBe(403);
	await expect(page.getByRole('heading', { name: 'Not open to your role' })).toBeVisible();
	await expect(page.getByText('Store settings is open to Owner only')).toBeVisible();
});
