import type { APIRequestContext } from '@playwright/test';
import { expect, test } from './fixtures';

// The local Stripe fake end to end: a Checkout Session made through the SDK inside the server,
// the fake's hosted page, and events delivered over HTTP to /api/webhooks/stripe, where the SDK
// checks their signatures.

interface Event {
	id: string;
	type: string;
	data: { object: { id: string; payment_intent?: string | null } };
}
interface Delivery {
	event: string;
	type: string;
	status: number | null;
	ok: boolean;
	kind: string;
}

async function startSession(request: APIRequestContext, amount = 125_000) {
	const response = await request.post('/dev/stripe/checkout-sessions', {
		data: {
			amount,
			currency: 'usd',
			name: 'Deposit for the Marlow Lane kitchen',
			metadata: { store_name: 'Tallow Creek Floors', purpose: 'deposit' }
		}
	});
	expect(response.status()).toBe(200);
	return (await response.json()) as { id: string; url: string };
}

async function eventsOf(request: APIRequestContext, type: string, objectId: string) {
	const response = await request.get(`/dev/stripe/events?type=${type}`);
	const { data } = (await response.json()) as { data: Event[] };
	return data.filter((e) => e.data.object.id === objectId);
}

async function deliveriesOf(request: APIRequestContext, eventId: string) {
	const response = await request.get(`/dev/stripe/deliveries?event=${eventId}`);
	return ((await response.json()) as { data: Delivery[] }).data;
}

test('paying with the succeeding card returns to success_url and delivers signed events the endpoint accepts', async ({
	page,
	request
}) => {
	const session = await startSession(request);
	await page.goto(session.url);
	await expect(page.getByRole('heading', { name: 'Pay Tallow Creek Floors' })).toBeVisible();
	await expect(page.getByText('Deposit for the Marlow Lane kitchen')).toBeVisible();
	await expect(page.getByTestId('total')).toHaveText('$1,250.00');

	await page.getByLabel('E-mail for the receipt').fill('ada.quill@example.example');
	await page.getByRole('radio', { name: /4242 4242 4242 4242/ }).check();
	await page.getByRole('button', { name: 'Pay $1,250.00' }).click();

	await expect(page).toHaveURL(new RegExp(`/dev/stripe\\?paid=${session.id}$`));
	await expect(page.getByText(`${session.id} is paid`)).toBeVisible();

	const [completed] = await eventsOf(request, 'checkout.session.completed', session.id);
	expect(completed).toBeDefined();
	const deliveries = await deliveriesOf(request, completed.id);
	expect(deliveries.map((d) => [d.status, d.ok, d.kind])).toEqual([[200, true, 'automatic']]);

	// The same page again says it is paid and offers no second payment.
	await page.goto(session.url);
	await expect(page.getByText('This payment is done')).toBeVisible();
	await expect(page.getByRole('button', { name: /^Pay/ })).toHaveCount(0);
});

test('a declined card shows the decline and leaves the session open for another try', async ({
	page,
	request
}) => {
	const session = await startSession(request, 40_000);
	await page.goto(session.url);
	await page.getByLabel('E-mail for the receipt').fill('ada.quill@example.example');
	await page.getByRole('radio', { name: /4000 0000 0000 0002/ }).check();
	await page.getByRole('button', { name: 'Pay $400.00' }).click();

	await expect(page.getByRole('alert')).toContainText('Your card was declined.');
	await expect(page.getByRole('alert')).toContainText('Nothing was charged');
	await expect(page).toHaveURL(new RegExp(`/dev/checkout/${session.id}`));
	await expect(page.getByLabel('E-mail for the receipt')).toHaveValue('ada.quill@example.example');
	await expect(page.getByRole('button', { name: 'Pay $400.00' })).toBeEnabled();

	const failed = (
		await (await request.get('/dev/stripe/events?type=payment_intent.payment_failed')).json()
	).data as Event[];
	expect(failed.length).toBeGreaterThan(0);
	expect(await eventsOf(request, 'checkout.session.completed', session.id)).toHaveLength(0);

	await page.getByRole('radio', { name: /4242 4242 4242 4242/ }).check();
	await page.getByRole('button', { name: 'Pay $400.00' }).click();
	await expect(page).toHaveURL(/\/dev\/stripe\?paid=/);
});

test('two tabs paying the same session make one charge', async ({ browser, request }) => {
	const session = await startSession(request, 20_000);
	const context = await browser.newContext();
	const [first, second] = [await context.newPage(), await context.newPage()];
	for (const tab of [first, second]) {
		await tab.goto(session.url);
		await tab.getByLabel('E-mail for the receipt').fill('ada.quill@example.example');
	}
	await first.getByRole('button', { name: 'Pay $200.00' }).click();
	await expect(first).toHaveURL(/\/dev\/stripe\?paid=/);
	await second.getByRole('button', { name: 'Pay $200.00' }).click();
	await expect(
		second.getByText('This payment was already made; nothing more was charged.')
	).toBeVisible();

	const [completed] = await eventsOf(request, 'checkout.session.completed', session.id);
	const intent = completed.data.object.payment_intent;
	const charges = (await (await request.get('/dev/stripe/events?type=charge.succeeded')).json())
		.data as Event[];
	expect(
		charges.filter((e) => (e.data.object as { payment_intent?: string }).payment_intent === intent)
	).toHaveLength(1);
	await context.close();
});

test('the endpoint refuses a wrong or stale signature with 400, and takes a redelivery', async ({
	page,
	request
}) => {
	const session = await startSession(request, 10_000);
	await page.goto(session.url);
	await page.getByLabel('E-mail for the receipt').fill('ada.quill@example.example');
	await page.getByRole('button', { name: 'Pay $100.00' }).click();
	await expect(page).toHaveURL(/\/dev\/stripe\?paid=/);
	const [completed] = await eventsOf(request, 'checkout.session.completed', session.id);

	const deliver = async (body: object) => {
		const response = await request.post('/dev/stripe/deliveries', {
			data: { events: [completed.id], ...body }
		});
		expect(response.status()).toBe(200);
		return ((await response.json()) as { data: Delivery[] }).data;
	};
	expect((await deliver({ badSignature: true })).map((d) => d.status)).toEqual([400]);
	expect((await deliver({ lateBy: 301 })).map((d) => d.status)).toEqual([400]);
	expect((await deliver({ times: 2 })).map((d) => d.status)).toEqual([200, 200]);

	const forged = await request.post('/api/webhooks/stripe', {
		data: { id: 'evt_forged', object: 'event', type: 'checkout.session.completed' },
		headers: { 'stripe-signature': `t=${Math.floor(Date.now() / 1000)},v1=${'0'.repeat(64)}` }
	});
	expect(forged.status()).toBe(400);
	const unsigned = await request.post('/api/webhooks/stripe', { data: { id: 'evt_unsigned' } });
	expect(unsigned.status()).toBe(400);

	const unknown = await request.post('/dev/stripe/deliveries', { data: { events: ['evt_nope'] } });
	expect(unknown.status()).toBe(404);
});
