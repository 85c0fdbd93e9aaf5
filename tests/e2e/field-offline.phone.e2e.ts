import sharp from 'sharp';
import { demoJob, makeStore, personOf } from './factories';
import { expect, signInAs, test } from './fixtures';

// The installer's report survives no signal: an item and its photo are kept on the phone the
// moment they are saved, a reload with no network still shows them (the service worker serves
// the page, IndexedDB the draft), and back online they arrive once.
test('a field report recorded offline survives a reload and arrives once', async ({
	page,
	context
}) => {
	const store = await makeStore({
		people: [{ role: 'installer', name: 'Rosa Imbrie' }],
		priceBook: true
	});
	const rosa = personOf(store, 'installer');
	const job = await demoJob(store, 'Bathroom tile', { installer: rosa });
	await signInAs(context, rosa);

	await page.goto(`/field/jobs/${job.id}`);
	await page.getByRole('button', { name: 'Check in' }).click();
	await expect(page.getByRole('heading', { name: 'Field report' })).toBeVisible();
	// The service worker is active for /field; the page is then fetched through it once.
	await page.evaluate(async () => {
		await navigator.serviceWorker.ready;
	});
	await page.reload();
	expect(await page.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(true);
	await expect(page.getByTestId('waiting')).toHaveText('All sent');

	await context.setOffline(true);
	const found = page.getByRole('form', { name: 'What you found' });
	await found
		.getByLabel('Item')
		.selectOption({ label: 'Close subfloor hole (blocking/backing and infill)' });
	await found.getByLabel(/Amount found/).fill('1');
	await found.getByLabel('Note').fill('Rotted by the tub');
	const photo = await sharp({
		create: { width: 1200, height: 900, channels: 3, background: '#8a4f27' }
	})
		.jpeg()
		.toBuffer();
	await found
		.getByLabel('Photo')
		.setInputFiles({ name: 'hole.jpg', mimeType: 'image/jpeg', buffer: photo });
	await found.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByTestId('waiting')).toHaveText('2 waiting to send');

	await page.reload();
	await expect(page.getByRole('heading', { name: 'Bathroom tile' })).toBeVisible();
	await expect(page.getByTestId('waiting')).toHaveText('2 waiting to send');
	const list = page.getByRole('list', { name: 'Found' });
	await expect(list.getByRole('listitem')).toHaveCount(1);
	await expect(list).toContainText('Waiting');

	await context.setOffline(false);
	await expect(page.getByTestId('waiting')).toHaveText('All sent', { timeout: 20_000 });
	await page.reload();
	await expect(list.getByRole('listitem')).toHaveCount(1);
	await expect(list).toContainText('Sent');
	await expect(page.getByRole('img', { name: /^Site,/ })).toHaveCount(1);
	// Saved twice by a flaky network or not, the server has one of each.
	const answer = await page.request.get(`/field/jobs/${job.id}/__data.json`);
	expect((await answer.text()).match(/Rotted by the tub/g)?.length).toBe(1);
});

// A photo whose answer is lost (the server stored it, then the connection dropped, as when a
// server is killed or a balancer cuts it): the phone keeps it waiting, sends it again by itself
// while it has signal, and the server answers the stored photo instead of storing a second.
test.describe('an upload whose answer is lost', () => {
	// Routed in the page, not by the service worker (which plays no part in sending).
	test.use({ serviceWorkers: 'block' });

	test('the phone sends the photo again and the job has it once', async ({ page, context }) => {
		const store = await makeStore({
			people: [{ role: 'installer', name: 'Tamsin Orrell' }],
			priceBook: true
		});
		const tamsin = personOf(store, 'installer');
		const job = await demoJob(store, 'Bathroom tile', { installer: tamsin });
		await signInAs(context, tamsin);
		await page.goto(`/field/jobs/${job.id}`);
		await page.getByRole('button', { name: 'Check in' }).click();
		await expect(page.getByRole('heading', { name: 'Field report' })).toBeVisible();

		const answers: number[] = [];
		await page.route(`**/api/v1/field/jobs/${job.id}/photos`, async (route) => {
			if (route.request().method() !== 'POST') return route.fallback();
			const response = await route.fetch();
			answers.push(response.status());
			if (answers.length === 1) return route.abort('connectionreset');
			return route.fulfill({ response });
		});

		const found = page.getByRole('form', { name: 'What you found' });
		await found
			.getByLabel('Item')
			.selectOption({ label: 'Close subfloor hole (blocking/backing and infill)' });
		await found.getByLabel(/Amount found/).fill('1');
		await found.getByLabel('Note').fill('Soft under the vanity');
		const photo = await sharp({
			create: { width: 900, height: 600, channels: 3, background: '#5b4636' }
		})
			.jpeg()
			.toBuffer();
		await found
			.getByLabel('Photo')
			.setInputFiles({ name: 'vanity.jpg', mimeType: 'image/jpeg', buffer: photo });
		await found.getByRole('button', { name: 'Save' }).click();

		await expect(page.getByTestId('waiting')).toHaveText('1 waiting to send');
		await expect(page.getByTestId('waiting')).toHaveText('All sent', { timeout: 30_000 });
		expect(answers).toEqual([201, 200]);
		await page.reload();
		await expect(page.getByRole('img', { name: /^Site,/ })).toHaveCount(1);
	});
});
