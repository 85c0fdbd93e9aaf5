// The job page on a 390 px phone, as the demo's manager reads it (read only): one big next step
// at the top, the rooms drawn with every leg of the L labelled, nothing scrolling sideways, the
// next step reached from the keyboard, and a screenshot kept in test-results/.
import { expect, test } from './fixtures';

test.use({ signedInAs: 'manager', viewport: { width: 390, height: 844 } });

async function openJob(page: import('@playwright/test').Page, title: string) {
	await page.goto(`/app/jobs?q=${encodeURIComponent(title)}`);
	await page
		.getByRole('link', { name: new RegExp(title) })
		.first()
		.click();
	await expect(page.getByRole('heading', { level: 1, name: new RegExp(title) })).toBeVisible();
}

test('the job page on a phone: the next step first, the L kitchen with its legs', async ({
	page
}) => {
	await openJob(page, 'Kitchen and hall, vinyl plank');
	const next = page.getByRole('region', { name: 'Next' });
	await expect(next).toBeVisible();
	// The one big button, in the store's primary colour, above everything else in the story.
	const button = next.getByTestId('next-action');
	await expect(button).toBeVisible();
	const box = await button.boundingBox();
	expect(box!.height).toBeGreaterThanOrEqual(48);
	const measure = page.getByRole('region', { name: 'Site measure' });
	expect(box!.y).toBeLessThan((await measure.boundingBox())!.y);

	// The kitchen is an L (12 × 8 ft and 5 × 6 ft): six walls, 12, 8, 7, 6, 5 and 14 ft.
	const kitchen = measure.getByRole('img', { name: /^Kitchen/ });
	await expect(kitchen).toBeVisible();
	const walls = kitchen.getByTestId('wall-lengths').locator('text');
	await expect(walls).toHaveCount(6);
	const labels = (await walls.allTextContents()).map((t) => t.trim());
	expect([...labels].sort()).toEqual(
		[`12' 0"`, `8' 0"`, `7' 0"`, `6' 0"`, `5' 0"`, `14' 0"`].sort()
	);
	// The hall is a plain rectangle: its width and length.
	await expect(
		measure.getByRole('img', { name: /^Hall/ }).getByTestId('wall-lengths').locator('text')
	).toHaveCount(2);

	// Nothing scrolls sideways at 390 px.
	const overflow = await page.evaluate(
		() => document.documentElement.scrollWidth - document.documentElement.clientWidth
	);
	expect(overflow).toBeLessThanOrEqual(0);

	// The next step is reached from the keyboard, before the story's sections.
	let reached = false;
	for (let i = 0; i < 40 && !reached; i++) {
		await page.keyboard.press('Tab');
		reached = await button.evaluate((el) => el === document.activeElement);
	}
	expect(reached).toBe(true);

	await page.screenshot({ path: 'test-results/job-story-phone.png', fullPage: true });
});

test('a completed job on a phone says what is left and shows the store its figures', async ({
	page
}) => {
	await openJob(page, 'Laundry sheet vinyl');
	await expect(page.getByRole('region', { name: 'Next' })).toBeVisible();
	await expect(page.getByRole('region', { name: 'Completion' })).toContainText('Completed');
	// A manager sees costs: margin, installer pay and the engine's days.
	const figures = page.getByRole('region', { name: 'The store’s side' });
	await expect(figures).toContainText('Margin');
	await expect(figures).toContainText('Install days the engine worked out');
	const overflow = await page.evaluate(
		() => document.documentElement.scrollWidth - document.documentElement.clientWidth
	);
	expect(overflow).toBeLessThanOrEqual(0);
	await page.screenshot({ path: 'test-results/job-story-completed-phone.png', fullPage: true });
});
