// The app itself, served by Vite in this process, for tests that must read what a browser gets:
// a page's `__data.json` through the real hooks, guards and loads, or an endpoint's answer.
// Starting it takes a while (the server modules are compiled on the first request), so a file
// that uses it starts it once in `beforeAll`.
import { createServer as createNetServer, type AddressInfo } from 'node:net';
import path from 'node:path';
import { unflatten } from 'devalue';
import { createServer, type ViteDevServer } from 'vite';
import { createAuth } from '$lib/server/create-auth';
import { db } from '$lib/server/db';
import { TEST_PASSWORD } from './factories';

export interface Answer {
	status: number;
	text: string;
	json: () => unknown;
}

/** What a page's server loads sent, merged from its layouts down, or where it went instead. */
export type PageData =
	| { kind: 'data'; data: Record<string, unknown> }
	| { kind: 'redirect'; location: string }
	| { kind: 'error'; status: number; message: string };

export interface Visitor {
	/** The session cookie it sends (empty for someone signed out). */
	cookie: string;
	/** The page's `__data.json`, decoded. */
	page(pathname: string): Promise<PageData>;
	request(pathname: string, init?: RequestInit): Promise<Answer>;
	/** A form action as `use:enhance` posts it (JSON answer). */
	action(pathname: string, fields: Record<string, string>): Promise<Answer>;
}

export interface App {
	origin: string;
	/** Someone with no session. */
	anonymous: Visitor;
	/** A visitor signed in with the app's own session cookie. */
	signIn(email: string, password?: string): Promise<Visitor>;
	/** A module of the app as the server runs it (the same instance its routes use). */
	module(id: string): Promise<Record<string, unknown>>;
	close(): Promise<void>;
}

/** A port nobody listens on right now. */
async function freePort(): Promise<number> {
	const probe = createNetServer();
	await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
	const { port } = probe.address() as AddressInfo;
	await new Promise((resolve) => probe.close(resolve));
	return port;
}

export async function startApp(): Promise<App> {
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	// The app reads its environment when the server starts: auth answers this origin only.
	process.env.ORIGIN = origin;
	const server: ViteDevServer = await createServer({
		configFile: path.resolve('vite.config.ts'),
		logLevel: 'error',
		server: { host: '127.0.0.1', port, strictPort: true, hmr: false, watch: null }
	});
	await server.listen();
	const signer = createAuth({
		db,
		baseURL: origin,
		secret: process.env.BETTER_AUTH_SECRET ?? '',
		sendMail: async () => ({ id: '' })
	});

	const visitor = (cookie: string): Visitor => {
		const request = async (pathname: string, init: RequestInit = {}): Promise<Answer> => {
			const headers = new Headers(init.headers);
			if (cookie) headers.set('cookie', cookie);
			headers.set('origin', origin);
			const response = await fetch(`${origin}${pathname}`, {
				...init,
				headers,
				redirect: 'manual'
			});
			const text = await response.text();
			return { status: response.status, text, json: () => JSON.parse(text) };
		};
		return {
			cookie,
			request,
			async page(pathname) {
				const [route, query = ''] = pathname.split('?');
				const answer = await request(
					`${route.replace(/\/$/, '')}/__data.json${query ? `?${query}` : ''}`
				);
				const body = answer.json() as {
					type: string;
					location?: string;
					nodes?: ({
						type: string;
						data?: unknown[];
						error?: { message: string };
						status?: number;
					} | null)[];
				};
				if (body.type === 'redirect') return { kind: 'redirect', location: body.location! };
				const data: Record<string, unknown> = {};
				for (const node of body.nodes ?? []) {
					if (node?.type === 'error') {
						return {
							kind: 'error',
							status: node.status ?? 500,
							message: node.error?.message ?? ''
						};
					}
					if (node?.type === 'data') Object.assign(data, unflatten(node.data!));
				}
				return { kind: 'data', data };
			},
			action(pathname, fields) {
				return request(pathname, {
					method: 'POST',
					headers: {
						'content-type': 'application/x-www-form-urlencoded',
						accept: 'application/json',
						'x-sveltekit-action': 'true'
					},
					body: new URLSearchParams(fields).toString()
				});
			}
		};
	};

	return {
		origin,
		anonymous: visitor(''),
		async signIn(email, password = TEST_PASSWORD) {
			// A session made on the server side with the app's own secret, so the cookie is the one
			// the app would set; it skips the HTTP sign-in and its per-address limit.
			const { headers } = await signer.api.signInEmail({
				body: { email, password },
				returnHeaders: true
			});
			const cookie = headers
				.getSetCookie()
				.map((c) => c.split(';')[0])
				.join('; ');
			if (!cookie) throw new Error(`${email} could not sign in`);
			return visitor(cookie);
		},
		module: (id) => server.ssrLoadModule(id),
		async close() {
			const db = await server.ssrLoadModule('/src/lib/server/db/index.ts');
			await server.close();
			await (db.pool as { end: () => Promise<void> }).end();
		}
	};
}
