// Logins and sessions for the browser tests, made in the test process through better-auth's own
// API (the same `createAuth` as the server, the same database and secret): no sign-in form, no
// HTTP request, so the sign-in limits never count them. The server reads the session cookie as
// it reads any other. `npm test` (scripts/test.js) passes the secret and the origin.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import demo from '../../../scripts/demo-people.json' with { type: 'json' };
import { createAuth } from '../../../src/lib/server/create-auth';
import { db } from '../../../src/lib/server/db';

export const ORIGIN = process.env.ORIGIN ?? `http://127.0.0.1:${process.env.PORT ?? 4173}`;

/** A login: the demo's own, or one a factory made. */
export interface Login {
	email: string;
	password: string;
}

/** Playwright's storage state: the session's cookies for the origin. */
export interface SignedIn {
	cookies: {
		name: string;
		value: string;
		domain: string;
		path: string;
		expires: number;
		httpOnly: boolean;
		secure: boolean;
		sameSite: 'Strict' | 'Lax' | 'None';
	}[];
	origins: [];
}

let built: ReturnType<typeof createAuth> | undefined;

/** better-auth as the server builds it; e-mail it would send is dropped (tests read the outbox). */
export function auth() {
	const secret = process.env.BETTER_AUTH_SECRET;
	if (!secret || !process.env.DATABASE_URL) {
		throw new Error('Run the browser tests through `npm test` (see DEVELOPERS.md)');
	}
	built ??= createAuth({ db, baseURL: ORIGIN, secret, sendMail: async () => ({ id: 'e2e' }) });
	return built;
}

const SAME_SITE = { strict: 'Strict', lax: 'Lax', none: 'None' } as const;

/** Set-Cookie lines as Playwright cookies for the origin. */
function cookiesOf(lines: string[]): SignedIn['cookies'] {
	const domain = new URL(ORIGIN).hostname;
	return lines.map((line) => {
		const [pair, ...attributes] = line.split(';').map((part) => part.trim());
		const at = pair.indexOf('=');
		const attribute = (name: string) =>
			attributes.find((a) => a.toLowerCase().startsWith(name))?.split('=')[1];
		const maxAge = Number(attribute('max-age'));
		const sameSite = attribute('samesite')?.toLowerCase() as keyof typeof SAME_SITE | undefined;
		return {
			name: pair.slice(0, at),
			value: pair.slice(at + 1),
			domain,
			path: attribute('path') ?? '/',
			expires: Number.isFinite(maxAge) ? Math.floor(Date.now() / 1000) + maxAge : -1,
			httpOnly: attributes.some((a) => a.toLowerCase() === 'httponly'),
			secure: attributes.some((a) => a.toLowerCase() === 'secure'),
			sameSite: SAME_SITE[sameSite ?? 'lax'] ?? 'Lax'
		};
	});
}

/** A new session of the login, as the cookies a browser would keep after signing in. */
export async function newSession(login: Login): Promise<SignedIn> {
	const { headers } = await auth().api.signInEmail({
		body: { email: login.email, password: login.password },
		returnHeaders: true
	});
	const cookies = cookiesOf(headers.getSetCookie());
	if (!cookies.length) throw new Error(`No session for ${login.email}`);
	return { cookies, origins: [] };
}

/** The demo's logins by a short name: each role's first person, Jonah, Dev, Hollin Vale's owner. */
export const DEMO_LOGINS = {
	owner: 'owner@tallowcreek.example',
	manager: 'manager@tallowcreek.example',
	sales: 'sales@tallowcreek.example',
	jonah: 'jonah@tallowcreek.example',
	installer: 'installer@tallowcreek.example',
	dev: 'dev@tallowcreek.example',
	hollinOwner: 'owner@hollinvale.example'
} as const;

export type DemoLogin = keyof typeof DEMO_LOGINS;

export const DEMO_PASSWORD = demo.password;

/** Where the setup project keeps a demo login's saved sign-in (git ignores `.data/`). */
export function demoStatePath(login: DemoLogin) {
	return path.resolve('.data', 'e2e-auth', `${login}.json`);
}

/** A demo login's saved sign-in, made once per run by the setup project. */
export function demoState(login: DemoLogin): SignedIn {
	return JSON.parse(readFileSync(demoStatePath(login), 'utf8'));
}
