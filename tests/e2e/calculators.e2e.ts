// The Calculators page for staff: structural answers carry their cautions, and the page works
// without JavaScript through its form action.
import { expect, test } from './fixtures';
import { untilLive } from './helpers';

test.describe(() => {
	test.use({ signedInAs: 'sales' });

	test('the joists calculator says when a floor does not pass and to confirm with a professional', async ({
		page
	}) => {
		await page.goto('/app');
		await page
			.getByRole('navigation', { name: 'Main' })
			.getByRole('link', { name: 'Calculators' })
			.last()
			.click();
		await page.getByRole('link', { name: /^Joist deflection and span/ }).click();
		await expect(page).toHaveURL(/\/app\/calculators\?c=joists$/);
		// Before anything is typed, the caution is already there.
		await expect(
			page.getByText(/a licensed professional before relying on this result/)
		).toBeVisible();
		await page.getByLabel('Spacing, centre to centre').fill('16');
		await page.getByLabel('Span between supports').fill(`14'`);
		await page.getByLabel('Floor going over it').selectOption('stone_tile');
		// 2x10 SPF No.2 at 16 in over 14 ft: L/504 against L/720 for stone (Natural Stone Institute,
		// quoted in NTCA Reference Manual, published).
		await expect(page.getByTestId('calc-headline')).toHaveText(
			'Does not pass: L/504 against L/720'
		);
		const cautions = page.getByRole('alert');
		await expect(
			cautions.filter({ hasText: 'needs a licensed professional and may need a permit' })
		).toBeVisible();
		await expect(
			cautions.filter({ hasText: 'A planning aid, not an engineering design' })
		).toBeVisible();
		await expect(page.getByText(/Sistering each joist full length would pass/)).toBeVisible();
		await expect(page.getByText(/Source: .*AISC Manual Table 3-23/)).toBeVisible();
	});
});

test.describe(() => {
	test.use({ signedInAs: 'manager' });

	test('from the keyboard, sending an empty form names each missing field and focuses the first', async ({
		page
	}) => {
		await page.goto('/app/calculators?c=leveller');
		const area = page.getByLabel('Area to level');
		await area.focus();
		await page.keyboard.press('Enter');
		await expect(area).toBeFocused();
		await expect(area).toHaveAccessibleDescription(/Enter the area to level/);
		await expect(page.getByLabel('Average depth')).toHaveAccessibleDescription(
			/Enter the average depth/
		);
		await page.keyboard.type('10 x 10');
		await page.keyboard.press('Tab');
		await expect(page.getByLabel('Average depth')).toBeFocused();
		await page.keyboard.type('1/4');
		await page.keyboard.press('Tab');
		await page.keyboard.type('0.45');
		// 100 ft² × 1/4 in ÷ 12 = 2.083 ft³ × 1.10 ÷ 0.45 ft³ = 5.09 → 6 bags (TRADE.md Quantities)
		await expect(page.getByTestId('calc-headline')).toHaveText('6 bags');
	});

	test('sent while the calculator is still loading, the focus stays where the typing went on', async ({
		page
	}) => {
		await page.goto('/app/calculators?c=leveller');
		await untilLive(page);
		// Live now; every script asked for from here on (the calculator's engine) is held back.
		let release!: () => void;
		const held = new Promise<void>((resolve) => (release = resolve));
		await page.route(/\/_app\/immutable\/.+\.js$/, async (route) => {
			await held;
			await route.continue();
		});
		const area = page.getByLabel('Area to level');
		await area.focus();
		await page.keyboard.press('Enter');
		await expect(area).toHaveAccessibleDescription(/Enter the area to level/);
		await page.keyboard.type('10 x 10');
		await page.keyboard.press('Tab');
		const depth = page.getByLabel('Average depth');
		await expect(depth).toBeFocused();
		await page.keyboard.type('1/4');

		release();
		await expect(area).toHaveAccessibleDescription(/Read as 100 ft²/);
		// The engine came after the person had moved on: the focus did not jump back.
		await expect(depth).toBeFocused();
		await expect(depth).toHaveValue('1/4');
		await expect(area).toHaveValue('10 x 10');
	});
});

test.describe(() => {
	test.use({ signedInAs: 'installer' });

	test('each role opens only its own Calculators page; the form action answers the same way', async ({
		page,
		baseURL
	}) => {
		expect((await page.request.get('/app/calculators')).status()).toBe(403);
		const posted = await page.request.post('/field/calculators?c=cartons', {
			headers: { origin: baseURL!, accept: 'text/html' },
			form: { calculator: 'cartons', areaSqFt: '120', coverageSqFt: '20.5', layout: 'straight' }
		});
		expect(posted.status()).toBe(200);
		expect(await posted.text()).toContain('7 cartons');
		const refused = await page.request.post('/field/calculators?c=cartons', {
			headers: { origin: baseURL!, accept: 'text/html' },
			form: { calculator: 'cartons', areaSqFt: 'a lot', coverageSqFt: '20.5' }
		});
		expect(refused.status()).toBe(400);
		expect(await refused.text()).toContain('Cannot read "a lot"');
	});
});

test.describe('without JavaScript', () => {
	test.use({ javaScriptEnabled: false, signedInAs: 'owner' });

	test('the form posts, the server works it out, and what was typed stays', async ({ page }) => {
		await page.goto('/app/calculators?c=cartons');
		await page.getByLabel('Floor area').fill('12 x 10');
		await page.getByLabel('Area one carton covers').fill('20.5');
		await page.getByRole('button', { name: 'Work it out' }).click();
		await expect(page.getByTestId('calc-headline')).toHaveText('7 cartons');
		await expect(page.getByLabel('Floor area')).toHaveValue('12 x 10');

		// A missing field is named after sending.
		await page.getByLabel('Area one carton covers').fill('');
		await page.getByRole('button', { name: 'Work it out' }).click();
		await expect(page.getByLabel('Area one carton covers')).toHaveAccessibleDescription(
			/Enter the area one carton covers/
		);

		// Enter in a field works the form out; it does not press the rows' Add button.
		await page.goto('/app/calculators?c=flatness');
		await page.getByLabel('Straightedge length').fill(`10'`);
		await page.getByLabel('Largest gap under it').fill('3/16');
		await page.getByLabel('Largest gap under it').press('Enter');
		// Tile with every edge under 15 in: 1/4 in in 10 ft (ANSI A108.02, secondary, via NTCA)
		await expect(page.getByTestId('calc-headline')).toHaveText(/^Passes/);
		await expect(page.getByRole('group', { name: /^Reading \d/ })).toHaveCount(1);
		await page.goto('/app/calculators?c=area');
		await page.getByLabel('Width').fill(`12'`);
		await page.getByLabel('Length').fill(`10'`);
		await page.getByRole('button', { name: 'Add a cut-out' }).click();
		await page.getByLabel('What').fill('Island');
		await page.getByLabel('Width').last().fill('4');
		await page.getByLabel('Length').last().fill(`2' 6"`);
		await page.getByLabel('From the left').fill(`3' 4"`);
		await page.getByLabel('From the bottom').fill(`3' 4"`);
		await page.getByRole('button', { name: 'Work it out' }).click();
		// 12 × 10 − 4 × 2.5 = 110 ft²
		await expect(page.getByTestId('calc-headline')).toHaveText('110 ft²');
		await expect(page.getByRole('img', { name: /drawn to scale/ })).toBeVisible();
	});
});
