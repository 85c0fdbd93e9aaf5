// The hostile-input suite: every form action, every `+server.ts` method (the JSON API as its
// OpenAPI document describes it) and every page load, sent the hostile corpus (malformed JSON,
// wrong types, NaN and Infinity, 1e308, negatives, 100,000 items, unknown fields, __proto__ and
// constructor keys and names, NUL and control characters, SQL and script, 5 MB, another store's
// ids) as each role of one store and as nobody. The app runs in this process (Vite, as
// `app-server.ts` serves it), so `Object.prototype` checked here is the server's own.
// It asserts: no 5xx, no row of the other store in any answer, no figure the role may not see,
// and no prototype touched. It prints how many requests it sent, by status.
import { appendFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { parse as parseDevalue, unflatten } from 'devalue';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signLink } from '$lib/server/customer-link';
import { saveStoreAccess } from '$lib/server/db/queries/access';
import * as priceBook from '$lib/server/db/queries/price-book';
import { customer, job, site } from '$lib/server/db/schema';
import { inStore } from '$lib/server/db/tenant';
import { bookJob } from '$lib/server/schedule/book';
import { makeStatement } from '$lib/server/statements/build';
import { startApp, type App, type Visitor } from './app-server';
import {
	addMember,
	auth,
	makeCustomer,
	makeJob,
	makePaidJob,
	makeSite,
	makeStore,
	sessionOf,
	unique,
	type TestStore
} from './factories';
import { seedChangeOrder } from './change-order-jobs';
import { CATALOGUE, keyOf, type Fixture, type Role, type Target } from './hostile/catalogue';
import { formVariants, jsonVariants, loadVariants, type Variant } from './hostile/corpus';

/** In every text row of the other store; never in any answer to this store's people. */
const MARKER = 'Zq7OtherStoreMarker';
const ROLES: Role[] = ['owner', 'manager', 'sales', 'installer'];
type Who = Role | 'nobody';
const WHO: Who[] = [...ROLES, 'nobody'];
const CONCURRENCY = 6;
const REQUEST_TIMEOUT_MS = 60_000;

let app: App;
type Rows = Record<Fixture, string>;
let mine: Rows;
let theirs: Rows;
let people: Record<Role, string>;
let visitors: Record<Who, Visitor>;

async function seed(store: TestStore, marker: string): Promise<Rows> {
	const paid = await makePaidJob(store);
	// Change order 1 of the job, awaiting review: the desk's change-order page has its forms.
	await seedChangeOrder(store, paid);
	const doomedCustomer = await makeCustomer(store.id, `Doomed ${marker}`);
	const doomedJob = await makeJob(store.id, store.owner.id, paid.customer.id);
	const doomedSite = await makeSite(store.id, paid.customer.id);
	const items = await inStore(store.id, (tx) => priceBook.list(tx, 'floor'));
	const doomedItem = await inStore(store.id, (tx) =>
		priceBook.create(tx, {
			section: 'floor',
			code: '',
			name: `Doomed ${marker}`,
			data: items[0].data
		})
	);
	const member = await addMember(store.id, 'installer', `Spare ${marker}`);
	const members = await auth.api.listMembers({
		headers: await sessionOf(store.owner.email),
		query: { organizationId: store.id }
	});
	const spare = members.members.find((m) => m.userId === member.id)!;
	// An installer of the store's own, with a booking and a statement (issue 10's desk half).
	const crew = await addMember(store.id, 'installer', `Crew ${marker}`);
	const booked = await makePaidJob(store);
	const boss = { id: store.owner.id, storeName: store.name };
	const booking = await inStore(store.id, (tx) =>
		bookJob(
			tx,
			booked.job.id,
			{ installerId: crew.id, startsOn: '2027-01-11', days: 1, arrivesAt: null, notes: '' },
			boss
		)
	);
	const statement = await inStore(store.id, (tx) =>
		makeStatement(
			tx,
			{ installerId: crew.id, periodStart: '2026-11-01', periodEnd: '2026-11-30' },
			{ id: store.owner.id, timeZone: 'UTC' }
		)
	);
	if (!booking.ok || !statement.ok) throw new Error('crew fixtures not made');
	const invitation = await auth.api.createInvitation({
		headers: await sessionOf(store.owner.email),
		body: { email: `${unique('invitee')}@test.example`, role: 'sales', organizationId: store.id }
	});
	if (marker) {
		await inStore(store.id, async (tx) => {
			await tx
				.update(customer)
				.set({
					name: `Customer ${marker}`,
					notes: marker,
					email: `${marker.toLowerCase()}@other.example`
				})
				.where(eq(customer.organizationId, store.id));
			await tx
				.update(job)
				.set({ title: `Job ${marker}`, notes: marker })
				.where(eq(job.organizationId, store.id));
			await tx
				.update(site)
				.set({ address: `1 ${marker} Lane`, notes: marker })
				.where(eq(site.organizationId, store.id));
		});
		await inStore(store.id, async (tx) => {
			for (const item of await priceBook.list(tx))
				await priceBook.update(tx, item.id, { name: `${item.name} ${marker}` });
		});
	}
	return {
		store: store.id,
		job: paid.job.id,
		quoteVersion: String(paid.quote.version),
		customer: paid.customer.id,
		site: paid.site.id,
		priceItem: items[0].id,
		doomedJob: doomedJob.id,
		doomedCustomer: doomedCustomer.id,
		doomedSite: doomedSite.id,
		doomedPriceItem: doomedItem.id,
		token: '',
		invitation: invitation.id,
		member: spare.id,
		installer: crew.id,
		booking: booking.bookingId,
		statement: statement.statementId
	};
}

/**
 * The page a form is taken from. A GET that meets a connection reset (a kept-alive socket the
 * loaded server closed as it was reused) is asked again once: drawing the form is the harness's
 * own step, not a request under test.
 */
async function drawPage(url: string, cookie: Record<string, string>): Promise<Response> {
	const ask = () => fetch(url, { headers: { ...cookie, accept: 'text/html' }, redirect: 'manual' });
	try {
		return await ask();
	} catch (e) {
		if ((e as { cause?: { code?: string } }).cause?.code !== 'ECONNRESET') throw e;
		return ask();
	}
}

async function signInEveryone() {
	const signed = await Promise.all(ROLES.map((r) => app.signIn(people[r])));
	visitors = {
		owner: signed[0],
		manager: signed[1],
		sales: signed[2],
		installer: signed[3],
		nobody: app.anonymous
	};
}

beforeAll(async () => {
	app = await startApp();
	const store = await makeStore('Larkspur Floor Co');
	const other = await makeStore('Fenwick Tile Works');
	people = {
		owner: store.owner.email,
		manager: (await addMember(store.id, 'manager', 'Ada Quill')).email,
		sales: (await addMember(store.id, 'sales', 'Bo Sable')).email,
		installer: (await addMember(store.id, 'installer', 'Cy Marten')).email
	};
	mine = await seed(store, '');
	theirs = await seed(other, MARKER);
	const secret = process.env.BETTER_AUTH_SECRET ?? '';
	const expiresAt = new Date(Date.now() + 86_400_000);
	mine.token = signLink({ storeId: store.id, jobId: mine.job, expiresAt }, secret);
	// The other store's job under this store's signed link: a link is for one store's job only.
	theirs.token = signLink({ storeId: store.id, jobId: theirs.job, expiresAt }, secret);
	await signInEveryone();
	// The first request compiles the app's server modules.
	await visitors.owner.page('/app');
}, 300_000);

afterAll(async () => {
	await app?.close();
});

/** Every route on disk that takes input, as the catalogue names it. */
async function routesOnDisk(): Promise<string[]> {
	const keys: string[] = [];
	const walk = async (dir: string) => {
		for (const entry of readdirSync(dir, { withFileTypes: true })) {
			const file = path.join(dir, entry.name);
			if (entry.isDirectory()) await walk(file);
			else if (entry.name === '+page.server.ts' || entry.name === '+server.ts') {
				const route =
					path
						.dirname(file)
						.slice('src/routes'.length)
						.split(path.sep)
						.filter((s) => s && !/^\(.+\)$/.test(s))
						.map((s) => `/${s}`)
						.join('') || '/';
				const mod = await app.module(`/${file}`);
				if (entry.name === '+server.ts') {
					for (const method of ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'fallback'])
						if (method in mod) keys.push(`${route} ${method}`);
				} else {
					if ('load' in mod) keys.push(`${route} load`);
					for (const name of Object.keys((mod.actions as object | undefined) ?? {}))
						keys.push(`${route} ?/${name}`);
				}
			}
		}
	};
	await walk('src/routes');
	return keys.sort();
}

type Json = Record<string, unknown>;

/** A JSON value shaped by a JSON Schema: the OpenAPI document's request bodies, made concrete. */
function exampleOf(schema: Json | undefined, doc: Json, depth = 0): unknown {
	if (!schema || depth > 12) return null;
	if (schema.$ref) {
		const name = String(schema.$ref).split('/').pop()!;
		const components = (doc.components as { schemas: Record<string, Json> }).schemas;
		return exampleOf(components[name], doc, depth + 1);
	}
	if ('example' in schema) return schema.example;
	if ('default' in schema) return schema.default;
	if ('const' in schema) return schema.const;
	if (Array.isArray(schema.enum)) return schema.enum[0];
	for (const key of ['anyOf', 'oneOf', 'allOf'] as const)
		if (Array.isArray(schema[key])) return exampleOf((schema[key] as Json[])[0], doc, depth + 1);
	const type = Array.isArray(schema.type) ? schema.type[0] : schema.type;
	if (type === 'object' || schema.properties) {
		const out: Json = {};
		for (const [k, v] of Object.entries((schema.properties as Record<string, Json>) ?? {}))
			out[k] = exampleOf(v, doc, depth + 1);
		return out;
	}
	if (type === 'array') return [exampleOf(schema.items as Json, doc, depth + 1)];
	if (type === 'integer' || type === 'number') return Number(schema.minimum ?? 1) || 1;
	if (type === 'boolean') return true;
	if (type === 'string') return 'text';
	return null;
}

/** The request body the OpenAPI document gives a route, with the store's own rows in it. */
function documentedBody(doc: Json, target: Target & { kind: 'endpoint' }): unknown {
	const openApiPath = target.route.replace(/\[(\w+)\]/g, '{$1}');
	const operation = (doc.paths as Record<string, Record<string, Json>>)[openApiPath]?.[
		target.method.toLowerCase()
	];
	const content = (operation?.requestBody as Json | undefined)?.content as
		Record<string, Json> | undefined;
	const media = content?.['application/json'];
	if (!media) return undefined;
	const body = 'example' in media ? media.example : exampleOf(media.schema as Json, doc);
	return JSON.parse(
		JSON.stringify(body)
			.replaceAll('"text"', '"Sample"')
			.replace(/"customerId":"[^"]*"/g, `"customerId":"${mine.customer}"`)
	);
}

const decode = (html: string) =>
	html
		.replaceAll('&quot;', '"')
		.replaceAll('&#39;', "'")
		.replaceAll('&lt;', '<')
		.replaceAll('&gt;', '>')
		.replaceAll('&amp;', '&');
const attr = (tag: string, name: string) =>
	new RegExp(`\\s${name}="([^"]*)"`).exec(tag)?.[1] ?? null;

/** The fields of a page's forms posting to one action, as the page draws them. */
function harvest(html: string, action: string): [string, string][] {
	const fields = new Map<string, string>();
	for (const [, open, inner] of html.matchAll(/<form\b([^>]*)>([\s\S]*?)<\/form>/g)) {
		const to = decode(attr(open, 'action') ?? '');
		const name = to.includes('?/') ? to.slice(to.indexOf('?/') + 2).split('&')[0] : 'default';
		if (name !== action) continue;
		for (const [tag, kind] of inner.matchAll(/<(input|textarea|select|button)\b[^>]*>/g)) {
			const field = attr(tag, 'name');
			if (!field || fields.has(decode(field))) continue;
			let value = attr(tag, 'value');
			if (kind === 'textarea') value = '';
			if (kind === 'select') {
				const rest = inner.slice(inner.indexOf(tag));
				value =
					/<option\b[^>]*\svalue="([^"]*)"[^>]*selected/.exec(rest)?.[1] ??
					/<option\b[^>]*\svalue="([^"]*)"/.exec(rest)?.[1] ??
					'';
			}
			if (attr(tag, 'type') === 'checkbox' && value === null) value = 'on';
			fields.set(decode(field), decode(value ?? ''));
		}
	}
	return [...fields];
}

function resolve(target: Target, rows: Rows, override?: string) {
	let pathname = target.route;
	for (const [name, param] of Object.entries(target.params ?? {})) {
		const value =
			override ?? (typeof param === 'string' ? rows[param] : (param as { fixed: string }).fixed);
		pathname = pathname.replace(`[${name}]`, override ? value : encodeURIComponent(value));
	}
	return pathname;
}

/** Every value naming one of this store's rows swapped for the other store's row. */
function swapper() {
	const pairs = (Object.keys(mine) as Fixture[])
		.filter((k) => mine[k].length > 3)
		.map((k) => [mine[k], theirs[k]] as const);
	const swap = (text: string) => {
		for (const [a, b] of pairs) text = text.replaceAll(a, b);
		return text;
	};
	return {
		fields: (fields: [string, string][]) => fields.map(([k, v]): [string, string] => [k, swap(v)]),
		json: (body: unknown) => (body === undefined ? body : JSON.parse(swap(JSON.stringify(body))))
	};
}

/** Keys of what the store pays or keeps, with a figure in them. */
function hiddenFigures(value: unknown, pattern: RegExp, out: string[] = []): string[] {
	if (Array.isArray(value)) for (const v of value) hiddenFigures(v, pattern, out);
	else if (value && typeof value === 'object') {
		for (const [k, v] of Object.entries(value)) {
			const figure =
				(typeof v === 'number' && v !== 0) ||
				(v !== null && typeof v === 'object' && !Array.isArray(v));
			if (pattern.test(k) && figure) out.push(k);
			hiddenFigures(v, pattern, out);
		}
	}
	return out;
}

/** What a browser would make of an answer: JSON, an action's data, a page's data. */
function decoded(text: string, type: string): unknown {
	if (!type.includes('json')) return undefined;
	const values: unknown[] = [];
	for (const line of text.split('\n').filter(Boolean)) {
		let value: Json;
		try {
			value = JSON.parse(line) as Json;
		} catch {
			continue;
		}
		if (typeof value?.data === 'string' && (value.type === 'success' || value.type === 'failure'))
			values.push(parseDevalue(value.data));
		else if (Array.isArray(value?.nodes))
			for (const node of value.nodes as ({ data?: unknown[] } | null)[])
				values.push(node?.data ? unflatten(node.data) : null);
		else if (value?.type === 'chunk' && Array.isArray(value.data))
			values.push(unflatten(value.data));
		else values.push(value);
	}
	return values;
}

/** Store-side figures (costs, installer pay, margins, card fees) a role may not see. */
const HIDDEN_FROM: Partial<Record<Who, RegExp>> = {
	sales: /^(cost|pay|fee|margin|installerPay)/i,
	installer: /^(cost|fee|margin)/i,
	nobody: /^(cost|pay|fee|margin|installerPay)/i
};
const HIDDEN_IN_TEXT: Partial<Record<Who, RegExp>> = {
	sales: /"?\b(cost\w*|pay\w*|fees?Cents|margin\w*)"?\s*:\s*-?[1-9]/,
	installer: /"?\b(cost\w*|fees?Cents|margin\w*)"?\s*:\s*-?[1-9]/,
	nobody: /"?\b(cost\w*|fees?Cents|margin\w*|installerPay\w*)"?\s*:\s*-?[1-9]/
};

interface Sent {
	target: string;
	variant: string;
	who: Who;
	status: number;
}

const sent: Sent[] = [];
const findings: string[] = [];

async function send(target: Target, variant: Variant, who: Who, base: string) {
	let pathname =
		variant.params === 'other'
			? resolve(target, theirs)
			: variant.params
				? resolve(target, mine, variant.params)
				: base;
	if (target.kind === 'load') pathname = `${pathname.replace(/\/$/, '')}/__data.json`;
	if (target.kind === 'action') pathname += target.name === 'default' ? '' : `?/${target.name}`;
	if (variant.query) pathname += `${pathname.includes('?') ? '&' : '?'}${variant.query}`;
	const method =
		target.kind === 'endpoint' ? target.method : target.kind === 'action' ? 'POST' : 'GET';
	const headers: Record<string, string> = {};
	if (variant.contentType) headers['content-type'] = variant.contentType;
	if (target.kind === 'action') {
		headers.accept = 'application/json';
		headers['x-sveltekit-action'] = 'true';
	}
	const label = `${keyOf(target)} [${variant.name}] as ${who}`;
	const t0 = Date.now();
	let status: number;
	let text: string;
	let type: string;
	try {
		const response = await fetch(`${app.origin}${pathname}`, {
			method,
			headers: { ...headers, ...cookieOf(who), origin: app.origin },
			body: variant.body as BodyInit | undefined,
			redirect: 'manual',
			signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS)
		});
		status = response.status;
		type = response.headers.get('content-type') ?? '';
		text = await response.text();
	} catch (e) {
		findings.push(`${label}: no answer (${(e as Error).message})`);
		sent.push({ target: keyOf(target), variant: variant.name, who, status: 0 });
		return;
	}
	sent.push({ target: keyOf(target), variant: variant.name, who, status });
	if (process.env.HOSTILE_LOG)
		appendFileSync(process.env.HOSTILE_LOG, `${Date.now() - t0} ms ${status} ${label}\n`);
	if (status >= 500) findings.push(`${label}: ${status} ${text.slice(0, 300)}`);
	if (text.includes(MARKER)) findings.push(`${label}: the other store's row is in the answer`);
	const pattern = HIDDEN_FROM[who];
	// The OpenAPI document's examples are the invented sample price book, the same for everyone.
	const describesTheApi = target.route === '/api/v1/openapi.json';
	if (pattern && status < 300 && !describesTheApi) {
		const keys = hiddenFigures(decoded(text, type), pattern);
		if (keys.length) findings.push(`${label}: shows ${[...new Set(keys)].join(', ')}`);
		else if (!type.includes('json') && HIDDEN_IN_TEXT[who]!.test(text))
			findings.push(`${label}: shows ${HIDDEN_IN_TEXT[who]!.exec(text)![1]}`);
	}
}

const cookieOf = (who: Who): Record<string, string> =>
	visitors[who].cookie ? { cookie: visitors[who].cookie } : {};

async function pool<T>(items: T[], run: (item: T) => Promise<void>) {
	let next = 0;
	await Promise.all(
		Array.from({ length: CONCURRENCY }, async () => {
			while (next < items.length) await run(items[next++]);
		})
	);
}

/** What the prototypes carry besides their own built-ins: nothing, unless something wrote there. */
const PROTOTYPES = {
	Object: Object.prototype,
	Array: Array.prototype,
	Function: Function.prototype,
	String: String.prototype
};
const BUILT_INS = Object.fromEntries(
	Object.entries(PROTOTYPES).map(([k, p]) => [k, Object.getOwnPropertyNames(p).sort()])
);
function pollution() {
	return Object.entries(PROTOTYPES).flatMap(([k, p]) =>
		Object.getOwnPropertyNames(p)
			.filter((name) => !BUILT_INS[k].includes(name))
			.map((name) => `${k}.prototype.${name}`)
	);
}

describe('the hostile-input suite', () => {
	it('lists every form action, server method and page load on disk', async () => {
		const listed = CATALOGUE.map(keyOf).sort();
		expect(new Set(listed).size).toBe(listed.length);
		expect(listed).toEqual(await routesOnDisk());
	});

	it('covers every operation of the OpenAPI document', async () => {
		const doc = (await visitors.owner.request('/api/v1/openapi.json')).json() as Json;
		const operations = Object.entries(doc.paths as Record<string, Json>).flatMap(([p, item]) =>
			Object.keys(item)
				.filter((m) => m !== 'parameters')
				.map(
					(m) =>
						`${p.replace(/\{(\w+)\}/g, '[$1]').replace(/\/calc\/[a-z-]+$/, '/calc/[name]')} ${m.toUpperCase()}`
				)
		);
		const listed = new Set(CATALOGUE.map(keyOf));
		expect(operations.filter((o) => !listed.has(o))).toEqual([]);
	});

	it(
		'answers the corpus as every role and nobody: no 5xx, no other store, nothing hidden, no prototype touched',
		async () => {
			// Served by the server's own module instances: the prototypes checked here are the server's.
			const sample = (await app.module('/src/lib/estimating/index.ts')).defaultSettings;
			expect(Object.getPrototypeOf(sample)).toBe(Object.prototype);
			expect(pollution()).toEqual([]);

			const doc = (await visitors.owner.request('/api/v1/openapi.json')).json() as Json;
			const swap = swapper();
			const only = process.env.HOSTILE_ONLY;
			const started = Date.now();
			for (const [targetIndex, target] of CATALOGUE.entries()) {
				if (only && !new RegExp(only).test(keyOf(target))) continue;
				const before = sent.length;
				const t0 = Date.now();
				const base = resolve(target, mine);
				let variants: Variant[];
				if (target.kind === 'load') variants = loadVariants(Boolean(target.params));
				else if (target.kind === 'endpoint') {
					const body = documentedBody(doc, target) ?? target.body;
					variants = jsonVariants(body, swap.json, Boolean(target.params), target.method);
				} else {
					const drawnBy = target.drawnBy ?? 'owner';
					const page = await drawPage(`${app.origin}${target.page ?? base}`, cookieOf(drawnBy));
					const drawn = harvest(await page.text(), target.name);
					const fields = new Map(drawn);
					for (const [k, v] of Object.entries(target.fields ?? {}))
						fields.set(k, v in mine ? mine[v as Fixture] : v);
					if (!fields.size) fields.set('name', 'Sample');
					variants = formVariants([...fields], swap.fields, Boolean(target.params));
				}
				// The owner gets the whole corpus; every other role and nobody get the variants marked
				// for everyone, and each other variant goes to one of them in turn as well, so across
				// the catalogue each role is sent every kind of hostile input without sending the
				// whole corpus five times over.
				const others = WHO.filter((w) => w !== 'owner');
				const alsoTo = (i: number) => others[(i + targetIndex) % others.length];
				const jobs = WHO.flatMap((who) =>
					variants
						.filter((v, i) => v.everyone || who === 'owner' || who === alsoTo(i))
						.map((v) => ({ who, v }))
				);
				await pool(jobs, ({ who, v }) => send(target, v, who, base));
				if (process.env.HOSTILE_LOG)
					appendFileSync(
						process.env.HOSTILE_LOG,
						`${keyOf(target)}: ${sent.length - before} requests in ${Date.now() - t0} ms (${Math.round((Date.now() - started) / 1000)} s in all, ${findings.length} findings)\n`
					);
				// A variant may have turned on "salespeople see costs": the checks assume it off.
				await saveStoreAccess(mine.store, { salesSeeCosts: false, salesJobs: 'all' });
				if (target.touchesSessions) {
					await signInEveryone();
				}
			}

			const byStatus: Record<number, number> = {};
			for (const s of sent) byStatus[s.status] = (byStatus[s.status] ?? 0) + 1;
			console.info(
				`hostile-input suite: ${sent.length} requests to ${CATALOGUE.length} targets as ${WHO.join(', ')}; by status: ${JSON.stringify(byStatus)}`
			);
			expect(findings).toEqual([]);
			expect(pollution()).toEqual([]);
			expect({}).not.toHaveProperty('polluted');
			// Still answering after all of it.
			expect((await visitors.owner.request('/api/v1/me')).status).toBe(200);
		},
		30 * 60_000
	);
});
