// The built server's perimeter, sent real requests: security headers and the CSP (9.7), control
// characters, bodies and ids refused at the edge (9.8), same-origin redirects (9.6), sign-in
// limits per account and per client address (9.5), the session token kept out of JSON (9.7),
// `__Secure-` cookies and HSTS on https (9.7), and structured logs with request ids (8.8).
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { form, jsonBody, portFor, serve, type Served } from './serve';

const PASSWORD = 'edge-password-1';
const LIMITS = {
	FLUSHLINE_AUTH_LIMIT_ACCOUNT: '3',
	FLUSHLINE_AUTH_LIMIT_ADDRESS: '40',
	FLUSHLINE_AUTH_LIMIT_WINDOW: '600'
};

let server: Served;
let https: Served;
let proxied: Served;

beforeAll(async () => {
	// The limits count per client address in the shared database: start from none, whatever
	// signed in from 127.0.0.1 before (the integration suites use the same test database).
	const owner = new pg.Client({
		connectionString: process.env.DATABASE_OWNER_URL ?? process.env.DATABASE_URL
	});
	await owner.connect();
	await owner.query('delete from auth_limit');
	await owner.end();
	[server, https, proxied] = await Promise.all([
		serve(3, LIMITS),
		serve(4, { ORIGIN: `https://127.0.0.1:${portFor(4)}` }),
		// Behind a proxy the deployment names: adapter-node reads the address it appends.
		serve(5, {
			...LIMITS,
			FLUSHLINE_AUTH_LIMIT_ADDRESS: '5',
			ADDRESS_HEADER: 'x-forwarded-for',
			XFF_DEPTH: '1'
		})
	]);
});

afterAll(async () => {
	await Promise.all([server, https, proxied].filter(Boolean).map((s) => s.stop()));
});

let counter = 0;
const email = (prefix: string) => `${prefix}-${Date.now().toString(36)}-${++counter}@edge.example`;

function withHeaders(init: RequestInit, headers: Record<string, string>): RequestInit {
	return { ...init, headers: { ...(init.headers as Record<string, string>), ...headers } };
}

async function signUp(target: Served, address: string) {
	const response = await target.fetch(
		'/api/auth/sign-up/email',
		jsonBody({ name: 'Edge Person', email: address, password: PASSWORD })
	);
	expect(response.status).toBe(200);
	return response;
}

const signInJson = (target: Served, address: string, password: string, headers = {}) =>
	target.fetch(
		'/api/auth/sign-in/email',
		withHeaders(jsonBody({ email: address, password }), headers)
	);

describe('headers (9.7)', () => {
	it('every page has a nonce CSP without inline scripts, and no framing', async () => {
		const response = await server.fetch('/sign-in');
		expect(response.status).toBe(200);
		const csp = response.headers.get('content-security-policy') ?? '';
		const scriptSrc = /script-src ([^;]*)/.exec(csp)?.[1] ?? '';
		expect(scriptSrc).toMatch(/'self'/);
		expect(scriptSrc).toMatch(/'nonce-[^']+'/);
		expect(scriptSrc).not.toContain('unsafe-inline');
		expect(scriptSrc).not.toContain('unsafe-eval');
		expect(csp).toContain("frame-ancestors 'none'");
		expect(csp).toContain("object-src 'none'");
		const nonce = /'nonce-([^']+)'/.exec(scriptSrc)![1];
		const html = await response.text();
		for (const tag of html.match(/<script[^>]*>/g) ?? []) {
			expect(tag).toContain(`nonce="${nonce}"`);
		}
	});

	it('every answer (page, JSON, redirect, refusal) carries the same protections', async () => {
		const answers = [
			await server.fetch('/sign-in'),
			await server.fetch('/api/v1/me'),
			await server.fetch('/app'),
			await server.fetch('/api/v1/customers/__proto__'),
			await server.fetch('/no-such-page')
		];
		expect(answers.map((r) => r.status)).toEqual([200, 401, 303, 404, 404]);
		for (const r of answers) {
			expect(r.headers.get('x-content-type-options')).toBe('nosniff');
			expect(r.headers.get('referrer-policy')).toBe('same-origin');
			expect(r.headers.get('permissions-policy')).toContain('camera=(self)');
			expect(r.headers.get('permissions-policy')).toContain('microphone=()');
			expect(r.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
			expect(r.headers.get('x-request-id')).toMatch(/^[0-9a-f-]{36}$/);
			// plain http: no HSTS, which browsers would ignore anyway
			expect(r.headers.get('strict-transport-security')).toBeNull();
		}
	});

	it('on an https origin: __Secure- cookies, Secure, and HSTS', async () => {
		const response = await signUp(https, email('secure'));
		const cookies = response.headers.getSetCookie();
		const session = cookies.find((c) => c.includes('session_token='));
		expect(session).toMatch(/^__Secure-better-auth\.session_token=/);
		expect(session).toMatch(/;\s*Secure/i);
		expect(session).toMatch(/;\s*HttpOnly/i);
		expect(response.headers.get('strict-transport-security')).toMatch(/max-age=\d{7,}/);
	});

	it('the sign-in answer keeps the session token out of its JSON body', async () => {
		const address = email('token');
		const up = await signUp(server, address);
		expect(await up.json()).not.toHaveProperty('token');
		const response = await signInJson(server, address, PASSWORD);
		expect(response.status).toBe(200);
		const body = await response.json();
		expect(body.user.email).toBe(address);
		expect(body).not.toHaveProperty('token');
		expect(response.headers.getSetCookie().join()).toMatch(/session_token=.+HttpOnly/i);
	});
});

describe('input at the edge (9.8)', () => {
	it('refuses control characters in the address and the query', async () => {
		const page = await server.fetch('/sign-in?note=a%00b');
		expect(page.status).toBe(400);
		expect(page.headers.get('content-type')).toContain('text/html');
		expect(await page.text()).toContain('control character');

		const api = await server.fetch('/api/v1/customers?q=a%00b');
		expect(api.status).toBe(400);
		expect((await api.json()).issues[0]).toMatchObject({ path: 'q' });

		expect((await server.fetch('/app/jobs/%00')).status).toBe(400);
		expect((await server.fetch('/app/jobs/a%1bb')).status).toBe(400);
		expect((await server.fetch('/app/%E0%A4%A')).status).toBe(400);
	});

	it('refuses control characters in JSON strings and keys, naming the field', async () => {
		const value = await server.fetch('/api/v1/customers', jsonBody('{"name":"Ada\\u0000"}'));
		expect(value.status).toBe(400);
		expect((await value.json()).issues[0]).toMatchObject({ path: 'name' });

		const nested = await server.fetch(
			'/api/v1/jobs/x/measure',
			jsonBody('{"draft":{"rooms":[{"name":"Hall\\u0007"}]}}', 'PUT')
		);
		expect(nested.status).toBe(400);
		expect((await nested.json()).issues[0].path).toBe('draft.rooms.0.name');

		const key = await server.fetch('/api/v1/customers', jsonBody('{"na\\u0000me":"Ada"}'));
		expect(key.status).toBe(400);
	});

	it('lets tabs and line breaks through in values (a note), so the route decides', async () => {
		const response = await server.fetch(
			'/api/v1/customers',
			jsonBody({ name: 'Ada', notes: 'Side door.\r\n\tDog in the yard.' })
		);
		expect(response.status).toBe(401); // past the edge; refused only for want of a session
	});

	it('refuses a body that says JSON and is not, with a 400', async () => {
		for (const body of ['{bad', '', '[1,', '\u0000']) {
			const response = await server.fetch('/api/v1/customers', jsonBody(body));
			if (body === '') expect(response.status).toBe(401);
			else expect(response.status, JSON.stringify(body)).toBe(400);
		}
	});

	it('refuses control characters in form fields: a page without JavaScript, JSON for enhance', async () => {
		const plain = await server.fetch(
			'/sign-in',
			form({ email: 'a\u0000@edge.example', password: 'x' })
		);
		expect(plain.status).toBe(400);
		expect(await plain.text()).toContain('control character');

		const enhanced = await server.fetch(
			'/sign-in',
			withHeaders(form({ email: 'a@edge.example', password: 'x\u0008' }), {
				'x-sveltekit-action': 'true',
				accept: 'application/json'
			})
		);
		expect(enhanced.status).toBe(400);
		expect(await enhanced.json()).toMatchObject({ type: 'error', error: { message: /control/ } });

		const name = await server.fetch('/sign-in', form({ 'email\u0001': 'a@edge.example' }));
		expect(name.status).toBe(400);
	});

	it('answers ids that are not our ids\u2019 shape with 404, never 500', async () => {
		for (const path of [
			'/api/v1/jobs/__proto__',
			'/api/v1/customers/constructor',
			'/api/v1/price-items/prototype',
			'/app/jobs/__proto__',
			'/app/customers/%3Cscript%3E',
			'/c/__proto__',
			'/invite/constructor'
		]) {
			expect((await server.fetch(path)).status, path).toBe(404);
		}
	});
});

describe('redirects (9.6)', () => {
	it('after sign-in, only same-origin paths; anything else goes home', async () => {
		const address = email('redirect');
		await signUp(server, address);
		const cases: [string, string][] = [
			['/\t/evil.example', '/app'],
			['//evil.example', '/app'],
			['/\\evil.example', '/app'],
			['https://evil.example/app', '/app'],
			['/app/customers?sort=name', '/app/customers?sort=name']
		];
		for (const [target, expected] of cases) {
			const response = await server.fetch(
				'/sign-in',
				form({ email: address, password: PASSWORD, redirectTo: target })
			);
			expect(response.status, JSON.stringify(target)).toBe(303);
			expect(response.headers.get('location'), JSON.stringify(target)).toBe(expected);
		}
	});

	it('the sign-in page carries only a same-origin target into its form', async () => {
		const evil = await server.fetch('/sign-in?redirectTo=https%3A%2F%2Fevil.example%2F');
		expect(evil.status).toBe(200);
		expect(await evil.text()).not.toContain('evil.example');
		const own = await server.fetch('/sign-in?redirectTo=%2Fapp%2Fjobs');
		expect(await own.text()).toMatch(/name="redirectTo" value="\/app\/jobs"/);
	});
});

describe('sign-in limits (9.5)', () => {
	it('limit one account through the HTTP route, whatever X-Forwarded-For says', async () => {
		const address = email('account');
		await signUp(server, address);
		for (let i = 1; i <= 3; i++) {
			const wrong = await signInJson(server, address, 'wrong-password-1', {
				'x-forwarded-for': `203.0.113.${i}`
			});
			expect(wrong.status).toBe(401);
		}
		const limited = await signInJson(server, address, 'wrong-password-1', {
			'x-forwarded-for': '203.0.113.99'
		});
		expect(limited.status).toBe(429);
		expect(Number(limited.headers.get('retry-after'))).toBeGreaterThan(0);
		expect((await limited.json()).message).toMatch(/Too many attempts\. Wait \d+ minutes/);
		// Locked for the window, even with the right password.
		expect((await signInJson(server, address, PASSWORD)).status).toBe(429);
	});

	it('limit one account through the sign-in form, with the message on the page', async () => {
		const address = email('form');
		await signUp(server, address);
		for (let i = 0; i < 3; i++) {
			const wrong = await server.fetch(
				'/sign-in',
				form({ email: address, password: 'wrong-password-1' })
			);
			expect(wrong.status).toBe(401);
		}
		const limited = await server.fetch('/sign-in', form({ email: address, password: PASSWORD }));
		expect(limited.status).toBe(429);
		expect(await limited.text()).toContain('Too many attempts');
	});

	it('count only failures per account: a success clears them', async () => {
		const address = email('clears');
		await signUp(server, address);
		for (let round = 0; round < 2; round++) {
			for (let i = 0; i < 2; i++) {
				expect((await signInJson(server, address, 'wrong-password-1')).status).toBe(401);
			}
			expect((await signInJson(server, address, PASSWORD)).status).toBe(200);
		}
	});

	it('limit password-reset requests per account (no mail flood)', async () => {
		const address = email('reset');
		await signUp(server, address);
		for (let i = 0; i < 3; i++) {
			const asked = await server.fetch('/forgot-password', form({ email: address }));
			expect(asked.status).toBe(200);
		}
		const limited = await server.fetch('/forgot-password', form({ email: address }));
		expect(limited.status).toBe(429);
		expect(await limited.text()).toContain('Too many attempts');
	});

	it('limit one client address as the named proxy gives it, across accounts and kinds', async () => {
		const from = (ip: string) => ({ 'x-forwarded-for': ip });
		for (let i = 0; i < 5; i++) {
			const r = await signInJson(
				proxied,
				email('nobody'),
				'wrong-password-1',
				from('198.51.100.7')
			);
			expect(r.status).toBe(401);
		}
		const limited = await signInJson(proxied, email('nobody'), 'x', from('198.51.100.7'));
		expect(limited.status).toBe(429);
		// Every way in shares the address's count: sign-up, reset, invitations.
		const signUpLimited = await proxied.fetch(
			'/api/auth/sign-up/email',
			withHeaders(
				jsonBody({ name: 'N', email: email('n'), password: PASSWORD }),
				from('198.51.100.7')
			)
		);
		expect(signUpLimited.status).toBe(429);
		const resetLimited = await proxied.fetch(
			'/api/auth/request-password-reset',
			withHeaders(jsonBody({ email: email('n') }), from('198.51.100.7'))
		);
		expect(resetLimited.status).toBe(429);
		// The organization plugin's own routes are closed over HTTP (invitations are accepted on
		// /invite/<id>, through auth.api, where the same limit hooks run).
		const inviteClosed = await proxied.fetch(
			'/api/auth/organization/accept-invitation',
			withHeaders(jsonBody({ invitationId: 'x'.repeat(32) }), from('198.51.100.7'))
		);
		expect(inviteClosed.status).toBe(404);
		// Another address has its own count.
		const other = await signInJson(
			proxied,
			email('nobody'),
			'wrong-password-1',
			from('198.51.100.8')
		);
		expect(other.status).toBe(401);
	});

	it('without a named proxy, a made-up X-Forwarded-For does not get a fresh count', async () => {
		let status = 0;
		for (let i = 0; i < 45 && status !== 429; i++) {
			const r = await signInJson(server, email('spray'), 'wrong-password-1', {
				'x-forwarded-for': `192.0.2.${i}`
			});
			status = r.status;
		}
		expect(status).toBe(429);
	});
});

describe('logs (8.8)', () => {
	it('are JSON lines with the request id, and no personal data from the address', async () => {
		const response = await server.fetch(
			'/api/v1/customers?q=ada.lovelace%40edge.example&phone=555-201-7788&page=2'
		);
		const id = response.headers.get('x-request-id')!;
		await new Promise((r) => setTimeout(r, 200));
		const lines = server
			.output()
			.split('\n')
			.filter((l) => l.startsWith('{'))
			.map((l) => JSON.parse(l));
		const line = lines.find((l) => l.requestId === id);
		expect(line).toMatchObject({
			level: 'info',
			method: 'GET',
			status: 401,
			path: '/api/v1/customers?q=[redacted]&phone=[redacted]&page=2'
		});
		expect(server.output()).not.toContain('ada.lovelace');
		expect(server.output()).not.toContain('201-7788');
		expect(server.output()).not.toMatch(/@edge\.example/);
	});
});
