// The customer's quote on a phone (390 px): the papers a homeowner reads (the prep in plain words,
// the cautions that concern them, the store's next steps, cancellation policy and terms), with
// headings in order, nothing wider than the screen, the answer form reached by the keyboard, and
// none of the installer's notes.
import { IN_HOUSE } from '../../src/lib/papers/testing';
import { customerLink, demoJob, makeStore } from './factories';
import { expect, test } from './fixtures';

test.use({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });

test("the customer's papers read on a phone, in order, by keyboard", async ({ page }) => {
	const store = await makeStore({ priceBook: true });
	const job = await demoJob(store, 'Basement carpet');
	await page.goto(customerLink(store, job));

	for (const name of [
		'Your rooms',
		'Getting the floor ready',
		'The price',
		'Before the install',
		'What happens next',
		'Cancellation',
		'Terms'
	]) {
		await expect(page.getByRole('heading', { name, exact: true })).toBeVisible();
	}
	await expect(page.getByText(/You can cancel without charge/)).toBeVisible();
	await expect(page.getByText(/for moisture|moisture barrier/).first()).toBeVisible();

	// None of the installer's notes: readings and limits, fasteners, saw depth, bag sizes.
	const text = await page.locator('main').innerText();
	expect(IN_HOUSE.exec(text)?.[0]).toBeUndefined();

	// Headings in order (h1, then h2s and h3s, never a level skipped), nothing wider than the phone.
	const levels = await page
		.locator('main')
		.locator('h1, h2, h3, h4')
		.evaluateAll((hs) => hs.map((h) => Number(h.tagName[1])));
	expect(levels[0]).toBe(1);
	levels.forEach((level, i) => {
		if (i) expect(level - levels[i - 1]).toBeLessThanOrEqual(1);
	});
	const wide = await page.evaluate(() => document.documentElement.scrollWidth - innerWidth);
	expect(wide).toBeLessThanOrEqual(0);

	// The keyboard reaches the name field that accepts the quote.
	let reached = false;
	for (let i = 0; i < 60 && !reached; i++) {
		await page.keyboard.press('Tab');
		reached = await page.evaluate(
			() => (document.activeElement as HTMLInputElement | null)?.name === 'name'
		);
	}
	expect(reached).toBe(true);
});
