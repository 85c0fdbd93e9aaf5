// An installer on a phone works out cartons as they type, and sees why a length cannot be read.
import { expect, test } from './fixtures';

test.use({ signedInAs: 'installer' });

test('an installer types a carton calculation and the answer follows every keystroke', async ({
	page
}) => {
	await page.goto('/field');
	await page
		.getByRole('navigation', { name: 'Installer' })
		.getByRole('link', { name: 'Calculators' })
		.click();
	await expect(page).toHaveURL(/\/field\/calculators$/);
	const link = page.getByRole('link', { name: /^Cartons/ });
	expect((await link.boundingBox())!.height).toBeGreaterThanOrEqual(48);
	await link.click();
	await expect(page.getByRole('heading', { name: 'Cartons', level: 1 })).toBeVisible();

	const area = page.getByLabel('Floor area');
	expect((await area.boundingBox())!.height).toBeGreaterThanOrEqual(48);
	const answer = page.getByTestId('calc-headline');
	await area.pressSequentially('120');
	await page.getByLabel('Area one carton covers').pressSequentially('20.5');
	// 120 ft² × 1.10 ÷ 20.5 ft² = 6.44 → 7 cartons
	await expect(answer).toHaveText('7 cartons');
	await expect(area).toHaveAccessibleDescription(/Read as 120 ft²/);
	// One more keystroke: 1200 ft² × 1.10 ÷ 20.5 = 64.4 → 65; no button pressed, no page load.
	await area.press('End');
	await area.pressSequentially('0');
	await expect(answer).toHaveText('65 cartons');
	await page.getByLabel('Layout').selectOption('herringbone');
	// The store's 20 % for herringbone: 1200 × 1.20 ÷ 20.5 = 70.2 → 71
	await expect(answer).toHaveText('71 cartons');
	await expect(page.getByText('Rule:')).toBeVisible();
	await expect(
		page.getByText(/Confirm with the flooring maker’s installation instructions/)
	).toBeVisible();
	// No prices on a calculator.
	await expect(page.getByRole('main')).not.toContainText('$');
});

test('a length that cannot be read says why, beside its field, and nothing breaks', async ({
	page
}) => {
	await page.goto('/field/calculators?c=area');
	const width = page.getByLabel('Width');
	await width.pressSequentially(`12' 6 1/0"`);
	await expect(width).toHaveAttribute('aria-invalid', 'true');
	await expect(width).toHaveAccessibleDescription(/a fraction's bottom cannot be 0/);
	await expect(page.getByText(/Cannot read "6 1\/0"/)).toBeVisible();

	// Fixing it draws the room to scale.
	await width.fill(`12' 6 1/2"`);
	await page.getByLabel('Length').fill('3810 mm');
	await expect(width).not.toHaveAttribute('aria-invalid', 'true');
	// 150.5 in × 150 in (3810 mm ÷ 25.4, exact) = 22,575 in² ÷ 144 = 156.77 ft²
	await expect(page.getByTestId('calc-headline')).toHaveText('156.77 ft²');
	await expect(
		page.getByRole('img', { name: /drawn to scale, 12' 6 1\/2" by 12' 6"/ })
	).toBeVisible();
});

// The engine comes to an open calculator when its form is first touched; with no signal it comes
// from the service worker's precache, and the answer still follows the keystrokes.
test('with no signal, an open calculator still answers as it is typed', async ({
	page,
	context
}) => {
	await page.goto('/field/calculators?c=cartons');
	await page.evaluate(async () => {
		await navigator.serviceWorker.ready;
	});
	await page.reload();
	expect(await page.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(true);

	await context.setOffline(true);
	await page.reload();
	await expect(page.getByRole('heading', { name: 'Cartons', level: 1 })).toBeVisible();
	await page.getByLabel('Floor area').pressSequentially('120');
	await page.getByLabel('Area one carton covers').pressSequentially('20.5');
	// 120 ft² × 1.10 ÷ 20.5 ft² = 6.44 → 7 cartons
	await expect(page.getByTestId('calc-headline')).toHaveText('7 cartons');
	await context.setOffline(false);
});
