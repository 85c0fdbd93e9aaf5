// Issue 9.3: the local fakes run only when switched on on purpose (FLUSHLINE_FAKES=1); a server
// with no keys and no switch refuses to start, naming the keys; /dev/* is 404 while they are off.
import { afterAll, describe, expect, it } from 'vitest';
import { jsonBody, serve, type Served } from './serve';

const running: Served[] = [];
afterAll(async () => {
	await Promise.all(running.map((s) => s.stop()));
});

const DEV_PAGES = [
	'/dev/outbox',
	'/dev/stripe',
	'/dev/stripe/events',
	'/dev/stripe/deliveries',
	'/dev/checkout/cs_test_anything'
];

describe('the local fakes', () => {
	it('are never on because a key is missing: the server refuses to start and names the keys', async () => {
		const server = await serve(0, { FLUSHLINE_FAKES: undefined });
		running.push(server);
		expect(await server.exited).not.toBe(0);
		expect(server.output()).toMatch(/Missing RESEND_API_KEY \(e-mail\) and STRIPE_SECRET_KEY/);
		expect(server.output()).toContain('FLUSHLINE_FAKES=1');
	});

	it('names the one key missing when the other is set', async () => {
		const server = await serve(0, {
			FLUSHLINE_FAKES: undefined,
			STRIPE_SECRET_KEY: 'sk_test_not_a_real_key_for_tests',
			STRIPE_WEBHOOK_SECRET: 'whsec_not_a_real_secret'
		});
		running.push(server);
		expect(await server.exited).not.toBe(0);
		expect(server.output()).toMatch(/Missing RESEND_API_KEY \(e-mail\)\./);
		expect(server.output()).not.toMatch(/Missing[^\n]*STRIPE_SECRET_KEY/);
	});

	it('answer 404 on every /dev address while off (real keys set, no switch)', async () => {
		const server = await serve(1, {
			FLUSHLINE_FAKES: undefined,
			RESEND_API_KEY: 're_not_a_real_key_for_tests',
			STRIPE_SECRET_KEY: 'sk_test_not_a_real_key_for_tests',
			STRIPE_WEBHOOK_SECRET: 'whsec_not_a_real_secret'
		});
		running.push(server);
		for (const page of DEV_PAGES) {
			expect((await server.fetch(page)).status, page).toBe(404);
		}
		const post = await server.fetch(
			'/dev/stripe/checkout-sessions',
			jsonBody({ amount: 5000, currency: 'usd' })
		);
		expect(post.status).toBe(404);
		expect((await server.fetch('/sign-in')).status).toBe(200);
		await server.stop();
	});

	it('answer while switched on, and send the payer back only to this site', async () => {
		const server = await serve(2, { FLUSHLINE_FAKES: '1' });
		running.push(server);
		expect((await server.fetch('/dev/outbox')).status).toBe(200);
		expect((await server.fetch('/dev/stripe')).status).toBe(200);

		for (const success_url of ['https://evil.example/paid', '//evil.example/paid']) {
			const refused = await server.fetch(
				'/dev/stripe/checkout-sessions',
				jsonBody({ amount: 5000, currency: 'usd', success_url })
			);
			expect(refused.status, success_url).toBe(400);
			expect((await refused.json()).issues[0].path).toBe('success_url');
		}
		const made = await server.fetch(
			'/dev/stripe/checkout-sessions',
			jsonBody({
				amount: 5000,
				currency: 'usd',
				success_url: `${server.origin}/dev/stripe?paid={CHECKOUT_SESSION_ID}`
			})
		);
		expect(made.status).toBe(200);
		const { id } = await made.json();
		const page = await server.fetch(`/dev/checkout/${id}`);
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).not.toContain('evil.example');
		await server.stop();
	});
});
