import { expect, test } from '@playwright/test';
import { demoEmail, signIn } from './helpers';

test('an installer on a phone sees only their jobs, in each of their stores', async ({ page }) => {
	await signIn(page, demoEmail('installer'));
	await expect(page).toHaveURL(/\/field$/);
	const jobs = page.getByRole('main').getByRole('link');
	await expect(jobs.filter({ hasText: 'Bathroom tile' })).toBeVisible();
	await expect(jobs.filter({ hasText: 'Sunroom laminate' })).toBeVisible();
	// Dev's jobs in the same store are not Rosa's.
	await expect(page.getByText('Laundry sheet vinyl')).toHaveCount(0);

	const target = jobs.filter({ hasText: 'Bathroom tile' });
	const box = await target.boundingBox();
	expect(box!.height).toBeGreaterThanOrEqual(48);
	await target.click();
	await expect(page.getByRole('heading', { name: 'Bathroom tile' })).toBeVisible();
	await page.getByRole('button', { name: 'Start work on site' }).click();
	await expect(page.getByText('In progress')).toBeVisible();

	await page.getByRole('link', { name: 'Stores' }).click();
	await page
		.getByRole('listitem')
		.filter({ hasText: 'Hollin Vale Tile House' })
		.getByRole('button', { name: 'Work here' })
		.click();
	await expect(page).toHaveURL(/\/field$/);
	await expect(page.getByText('Hollin Vale Tile House').first()).toBeVisible();
	await expect(
		page.getByRole('main').getByRole('link').filter({ hasText: 'Entry hall porcelain' })
	).toBeVisible();
	await expect(page.getByText('Bathroom tile')).toHaveCount(0);
});
