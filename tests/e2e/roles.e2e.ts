import { expect, test } from './fixtures';
import { demoEmail, signIn } from './helpers';

const expected = {
	owner: [
		'Desk',
		'Jobs',
		'Customers',
		'Price book',
		'Payments',
		'Schedule',
		'Installers',
		'Statements',
		'Calculators',
		'Team',
		'Store settings'
	],
	manager: [
		'Desk',
		'Jobs',
		'Customers',
		'Price book',
		'Payments',
		'Schedule',
		'Installers',
		'Statements',
		'Calculators'
	],
	sales: ['Desk', 'Jobs', 'Customers', 'Price book', 'Calculators']
} as const;

for (const [role, links] of Object.entries(expected)) {
	test.describe(() => {
		test.use({ signedInAs: role as keyof typeof expected });

		test(`the demo ${role} signs in and sees the ${role}'s navigation`, async ({ page }) => {
			await page.goto('/app');
			await expect(page).toHaveURL(/\/app$/);
			await expect(page.getByRole('heading', { name: 'Desk' })).toBeVisible();
			await expect(
				page.getByRole('navigation', { name: 'Main' }).last().getByRole('link')
			).toHaveText([...links]);
		});
	});
}

// Through the sign-in form on purpose: where a role lands after signing in.
test('the demo installer lands on their own screens and is refused the desk', async ({ page }) => {
	await signIn(page, demoEmail('installer'));
	await expect(page).toHaveURL(/\/field$/);
	await expect(page.getByRole('heading', { name: 'My jobs' })).toBeVisible();
	const refused = await page.goto('/app/customers');
	expect(refused?.status()).toBe(403);
	await expect(page.getByText('your role in this store is Installer')).toBeVisible();
});

test.describe(() => {
	test.use({ signedInAs: 'manager' });

	test('a manager is refused the team and the settings, with a clear page', async ({ page }) => {
		for (const path of ['/app/team', '/app/settings']) {
			const response = await page.goto(path);
			expect(response?.status()).toBe(403);
			await expect(page.getByRole('heading', { name: 'Not open to your role' })).toBeVisible();
		}
	});
});

test('a page needing sign-in sends you to sign in and back', async ({ page }) => {
	await page.goto('/app/jobs?status=sold');
	await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Fapp%2Fjobs%3Fstatus%3Dsold/);
	await page.getByLabel('E-mail').fill(demoEmail('sales'));
	await page.getByLabel('Password').fill('flushline-demo-1');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/app\/jobs\?status=sold$/);
	await expect(page.getByRole('row', { name: /Two bedrooms, carpet/ })).toBeVisible();
});
