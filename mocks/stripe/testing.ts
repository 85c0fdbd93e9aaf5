import { mkdtempSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { setupServer } from 'msw/node';
import Stripe from 'stripe';
import { createStripeFake, type StripeFake, type StripeFakeOptions } from './index';

export const TEST_WEBHOOK_SECRET = 'whsec_test_fake_endpoint_secret';

/** What a test webhook endpoint received: the event, or why it refused it. */
export interface Received {
	status: number;
	event: Stripe.Event | null;
	error: string | null;
	signature: string;
}

/**
 * A webhook endpoint for tests: a real HTTP server that checks each delivery with the SDK's
 * `stripe.webhooks.constructEvent` (raw body, 300 s tolerance), answering 400 or 200 as an app should.
 */
export async function webhookEndpoint(secret = TEST_WEBHOOK_SECRET) {
	const sdk = new Stripe('sk_test_endpoint', { maxNetworkRetries: 0 });
	const received: Received[] = [];
	let answer: number | null = null;
	const server: Server = createServer((req: IncomingMessage, res) => {
		const chunks: Buffer[] = [];
		req.on('data', (c: Buffer) => chunks.push(c));
		req.on('end', () => {
			const raw = Buffer.concat(chunks);
			const signature = String(req.headers['stripe-signature'] ?? '');
			let status = 200;
			let event: Stripe.Event | null = null;
			let error: string | null = null;
			try {
				event = sdk.webhooks.constructEvent(raw, signature, secret, 300);
				if (answer) status = answer;
			} catch (e) {
				status = 400;
				error = (e as Error).message;
			}
			received.push({ status, event, error, signature });
			res.writeHead(status, { 'content-type': 'application/json' });
			res.end(JSON.stringify(error ? { error } : { received: true }));
		});
	});
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const { port } = server.address() as AddressInfo;
	return {
		url: `http://127.0.0.1:${port}/api/webhooks/stripe`,
		received,
		/** Makes the endpoint answer this status to valid deliveries (null: 200 again). */
		failWith(status: number | null) {
			answer = status;
		},
		close: () => new Promise<void>((resolve) => server.close(() => resolve()))
	};
}

/**
 * The fake behind msw with the real SDK client (`maxNetworkRetries: 0`), for tests. Requests
 * nothing handles are errors, as tests want.
 */
export function stripeFakeForTests(options: Partial<StripeFakeOptions> = {}) {
	const fake: StripeFake = createStripeFake({
		dataDir:
			options.dataDir === undefined
				? mkdtempSync(path.join(tmpdir(), 'stripe-fake-'))
				: options.dataDir,
		origin: options.origin ?? 'http://127.0.0.1:4173',
		webhookUrl: options.webhookUrl ?? null,
		webhookSecret: options.webhookSecret ?? TEST_WEBHOOK_SECRET,
		deliveryTimeoutMs: options.deliveryTimeoutMs
	});
	const server = setupServer(...fake.handlers);
	server.listen({ onUnhandledRequest: 'error' });
	const stripe = new Stripe('sk_test_local_fake', { maxNetworkRetries: 0 });
	return {
		fake,
		server,
		stripe,
		async close() {
			await fake.settled();
			server.close();
		}
	};
}
