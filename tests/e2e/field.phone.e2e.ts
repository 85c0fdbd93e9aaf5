import { addPerson, demoJob, makeJob, makeCustomer, makeStore, personOf } from './factories';
import { expect, signInAs, test } from './fixtures';

test('an installer on a phone sees only their jobs, in each of their stores', async ({
	page,
	context
}) => {
	// Two stores of the test's own, as in the demo: Rosa installs for both, Dev for the first.
	const store = await makeStore({
		name: 'Tallow Creek Floors',
		people: [
			{ role: 'installer', name: 'Rosa Imbrie' },
			{ role: 'installer', name: 'Dev Kalloway' }
		],
		priceBook: true
	});
	const rosa = personOf(store, 'installer');
	await demoJob(store, 'Bathroom tile', { installer: rosa });
	await demoJob(store, 'Sunroom laminate', { installer: rosa });
	await demoJob(store, 'Laundry sheet vinyl', { installer: personOf(store, 'installer', 1) });
	const second = await makeStore({ name: 'Hollin Vale Tile House' });
	await makeJob(second, {
		customer: await makeCustomer(second, { name: 'Pim Arkwright' }),
		title: 'Entry hall porcelain',
		installer: await addPerson(second, 'installer', { login: rosa })
	});
	await signInAs(context, rosa);
	await page.goto('/field');
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
	await page.getByRole('button', { name: 'Check in' }).click();
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
