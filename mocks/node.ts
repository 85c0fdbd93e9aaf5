import type { RequestHandler } from 'msw';
import { setupServer } from 'msw/node';
import { resendHandlers } from './resend';
import { createStripeFake, setCurrentStripeFake } from './stripe';

type SetupServer = ReturnType<typeof setupServer>;

export interface FakeOptions {
	/** Where the fakes keep what they accepted (the outbox, the Stripe objects). */
	dataDir: string;
	mail: boolean;
	/** The Stripe fake's settings; absent while a real Stripe key is set. */
	stripe?: { origin: string; webhookUrl: string; webhookSecret: string };
}

const key = Symbol.for('flushline.fakes');
type WithFakes = typeof globalThis & { [key]?: SetupServer };

/**
 * Starts the msw interceptor with the fakes asked for, once per process. Requests no fake
 * handles pass through untouched.
 */
export function startFakes(options: FakeOptions): SetupServer {
	const g = globalThis as WithFakes;
	if (g[key]) return g[key];
	const handlers: RequestHandler[] = [];
	if (options.mail) handlers.push(...resendHandlers(options.dataDir));
	if (options.stripe) {
		const fake = createStripeFake({ dataDir: options.dataDir, ...options.stripe });
		setCurrentStripeFake(fake);
		handlers.push(...fake.handlers);
	}
	const server = setupServer(...handlers);
	server.listen({ onUnhandledRequest: 'bypass' });
	g[key] = server;
	return server;
}
