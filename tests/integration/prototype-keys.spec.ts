// Field names and JSON keys that would reach a prototype (`__proto__`, `constructor.prototype`),
// sent to every form that reads nested fields and to every JSON route that takes a body, called
// as SvelteKit calls them (a request event whose locals are what the hooks put there). Each
// answer is a refusal (4xx) or an ordinary success, and Object.prototype is untouched after.
import { inStore, readInStore } from '$lib/server/db/tenant';
import { isActionFailure, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import * as customers from '$lib/server/db/queries/customers';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { mergeSettings } from '$lib/server/db/queries/settings';
import { defaultSettings } from '$lib/estimating';
import { emptyRoom } from '$lib/measure/draft';
import { tradeSettingsToForm } from '$lib/schemas/store-settings';
import { makeJob, makeStore, memberEvent, type Member, type TestStore } from './factories';

let current: Partial<RequestEvent> | undefined;
vi.mock('$app/server', () => ({ getRequestEvent: () => current }));

const settingsPage = await import('../../src/routes/app/settings/+page.server');
const customerNew = await import('../../src/routes/app/customers/new/+page.server');
const priceBookNew = await import('../../src/routes/app/price-book/new/[section]/+page.server');
const paymentsPage = await import('../../src/routes/app/jobs/[id]/payments/+page.server');
const calculatorsPage = await import('../../src/routes/app/calculators/+page.server');
const measurePage = await import('../../src/routes/app/jobs/[id]/measure/+page.server');
const apiCustomers = await import('../../src/routes/api/v1/customers/+server');
const apiCustomer = await import('../../src/routes/api/v1/customers/[id]/+server');
const apiSites = await import('../../src/routes/api/v1/customers/[id]/sites/+server');
const apiJobs = await import('../../src/routes/api/v1/jobs/+server');
const apiJob = await import('../../src/routes/api/v1/jobs/[id]/+server');
const apiMoves = await import('../../src/routes/api/v1/jobs/[id]/moves/+server');
const apiMeasure = await import('../../src/routes/api/v1/jobs/[id]/measure/+server');
const apiCalc = await import('../../src/routes/api/v1/calc/[name]/+server');
const apiPreview = await import('../../src/routes/api/v1/estimates/preview/+server');
const apiPriceItems = await import('../../src/routes/api/v1/price-items/+server');

function event(who: Member, path: string, params: Record<string, string>, init?: RequestInit) {
	const e = memberEvent(who, path, params, init);
	current = e;
	return e;
}

/** Field names that write through a prototype when split on dots and followed. */
const HOSTILE_FIELDS: [string, string][] = [
	['__proto__.polluted', 'yes'],
	['constructor.prototype.polluted', 'yes'],
	['taxes.0.__proto__.polluted', 'yes'],
	['toString.polluted', 'yes'],
	['rooms.0.__proto__.polluted', 'yes'],
	['rooms.0.constructor.prototype.polluted', 'yes']
];

type Action = (e: RequestEvent) => unknown;

/** Posts a form to an action: its answer, a redirect it threw, or the status of an error it threw. */
async function post(
	who: Member,
	action: Action,
	path: string,
	params: Record<string, string>,
	fields: [string, string][]
) {
	const form = new FormData();
	for (const [k, v] of fields) form.append(k, v);
	const e = event(who, path, params, { method: 'POST', body: form });
	try {
		return await action(e);
	} catch (thrown) {
		if (isRedirect(thrown)) return thrown;
		const status = (thrown as { status?: number }).status;
		if (status && status >= 400 && status < 500) return { thrownStatus: status };
		throw thrown;
	}
}

/** What the prototypes carry besides their own built-ins (none, unless something was polluted). */
const BUILT_IN = Object.getOwnPropertyNames(Object.prototype).sort();
function pollution() {
	return {
		object: Object.getOwnPropertyNames(Object.prototype).filter((k) => !BUILT_IN.includes(k)),
		toString: Object.getOwnPropertyNames(Object.prototype.toString).filter(
			(k) => !['length', 'name'].includes(k)
		),
		probe: ({} as Record<string, unknown>).polluted
	};
}

beforeEach(() => {
	expect(pollution()).toEqual({ object: [], toString: [], probe: undefined });
});
afterEach(() => {
	const found = pollution();
	// Clean up first, so one failure does not spill into the next test.
	for (const k of found.object) delete (Object.prototype as Record<string, unknown>)[k];
	for (const k of found.toString)
		delete (Object.prototype.toString as unknown as Record<string, unknown>)[k];
	expect(found).toEqual({ object: [], toString: [], probe: undefined });
});

/** A refusal (4xx) or an ordinary success: never a crash, never a 5xx. */
function expectRefusedOrDone(answer: unknown) {
	if (isActionFailure(answer)) expect(answer.status).toBeLessThan(500);
	else if (answer && typeof answer === 'object' && 'thrownStatus' in answer)
		expect((answer as { thrownStatus: number }).thrownStatus).toBeLessThan(500);
	else expect(answer).toBeDefined();
}

let store: TestStore;
let owner: Member;

beforeAll(async () => {
	store = await makeStore('Prototype Floors');
	owner = { user: store.owner, role: 'owner', store };
});

describe('forms that read nested field names', () => {
	it('store settings: refuses the form, saves nothing and writes nothing onto Object.prototype', async () => {
		const before = await readInStore(store.id, (tx) => tradeSettings.read(tx));
		const valid = Object.entries(
			tradeSettingsToForm(before.settings, before.quoteValidDays, before.currency)
		);
		const forbidden = HOSTILE_FIELDS.filter(([name]) =>
			/__proto__|prototype|constructor/.test(name)
		);
		for (const hostile of forbidden) {
			const answer = await post(owner, settingsPage.actions.trade as Action, '/app/settings', {}, [
				...valid,
				['deposit.percent', '45'],
				hostile
			]);
			expect(isActionFailure(answer) && answer.status, hostile[0]).toBe(400);
			const trade = (answer as { data: { trade: { errors: Record<string, string[]> } } }).data
				.trade;
			expect(trade.errors._form?.[0]).toMatch(/is not allowed|is also/);
		}
		expect((await readInStore(store.id, (tx) => tradeSettings.read(tx))).settings.deposit).toEqual(
			before.settings.deposit
		);
		// A name through an inherited property is an ordinary (unknown) field: saved, nothing written.
		const answer = await post(owner, settingsPage.actions.trade as Action, '/app/settings', {}, [
			...valid,
			['toString.polluted', 'yes']
		]);
		expect(answer).toEqual({ tradeSaved: true });
	});

	it('store settings: a name that is both a value and a group is refused, not a 500', async () => {
		const before = await readInStore(store.id, (tx) => tradeSettings.read(tx));
		const valid = Object.entries(
			tradeSettingsToForm(before.settings, before.quoteValidDays, before.currency)
		);
		for (const hostile of [
			['deposit.percent.x', '1'],
			['taxRounding.x', '1'],
			['taxes.length', '99999999'],
			['taxes.99999999.rate', '1']
		] as [string, string][]) {
			const answer = await post(owner, settingsPage.actions.trade as Action, '/app/settings', {}, [
				['taxes.0.name', 'Sales tax'],
				['taxes.0.rate', '6'],
				...valid,
				hostile
			]);
			expect(isActionFailure(answer) && answer.status, hostile[0]).toBe(400);
		}
	});

	it('every other form: a refusal or an ordinary success, Object.prototype untouched', async () => {
		const job = await makeJob(store.id, store.owner.id);
		const room = emptyRoom('r1', 'Hall');
		const forms: [string, Action, string, Record<string, string>, [string, string][]][] = [
			[
				'store profile',
				settingsPage.actions.profile as Action,
				'/app/settings',
				{},
				[['name', 'Prototype Floors']]
			],
			[
				'new customer',
				customerNew.actions.default as Action,
				'/app/customers/new',
				{},
				[['name', 'Ivy Marsh']]
			],
			[
				'new price-book line',
				priceBookNew.actions.default as Action,
				'/app/price-book/new/prep',
				{ section: 'prep' },
				[
					['kind', 'level'],
					['basis', 'sqft'],
					['price', '2.50'],
					['pay', '1.25']
				]
			],
			[
				'record a payment',
				paymentsPage.actions.record as Action,
				`/app/jobs/${job.id}/payments`,
				{ id: job.id },
				[
					['purpose', 'deposit'],
					['method', 'cash'],
					['amount', '10']
				]
			],
			[
				'refund',
				paymentsPage.actions.refund as Action,
				`/app/jobs/${job.id}/payments`,
				{ id: job.id },
				[
					['paymentId', 'nope'],
					['amount', '10'],
					['reason', 'other']
				]
			],
			[
				'calculator without JavaScript',
				calculatorsPage.actions.default as Action,
				'/app/calculators',
				{},
				[
					['calculator', 'cartons'],
					['areaSqFt', '120'],
					['coverageSqFt', '20'],
					['layout', 'straight']
				]
			],
			[
				'measure without JavaScript',
				measurePage.actions.save as Action,
				`/app/jobs/${job.id}/measure`,
				{ id: job.id },
				[
					['baseVersion', '0'],
					['_draft', JSON.stringify({ builtYear: '', rooms: [room] })],
					['rooms.0.shape.width', "12'"],
					['op', 'add:rooms.0.constructor']
				]
			]
		];
		for (const [what, action, path, params, fields] of forms) {
			for (const hostile of HOSTILE_FIELDS) {
				const answer = await post(owner, action, path, params, [...fields, hostile]);
				expectRefusedOrDone(answer);
				expect(pollution().object, `${what} with ${hostile[0]}`).toEqual([]);
			}
		}
	});
});

describe('the JSON API', () => {
	/** JSON with a key JSON.parse keeps as an own property (an object literal would not). */
	const withKey = (body: Record<string, unknown>, path: string[], key: string) => {
		const text = JSON.stringify(body);
		const inner = JSON.stringify({ polluted: 'yes', prototype: { polluted: 'yes' } });
		if (!path.length) return text.replace(/^\{/, `{"${key}":${inner},`);
		// Put the key inside the object at `path` (the path exists in `body`).
		const marker = '"__here__":1';
		let at: Record<string, unknown> = body;
		for (const p of path) at = at[p] as Record<string, unknown>;
		at.__here__ = 1;
		const out = JSON.stringify(body).replace(marker, `"${key}":${inner}`);
		delete at.__here__;
		return out;
	};

	it('refuses a body with __proto__, constructor or prototype keys at any depth, naming where', async () => {
		const customer = await inStore(store.id, (tx) =>
			customers.create(tx, {
				name: 'Rowan Ash',
				email: null,
				phone: null,
				notes: ''
			})
		);
		const job = await makeJob(store.id, store.owner.id, customer.id);
		type Handler = (e: RequestEvent) => Promise<Response>;
		const routes: [
			string,
			Handler,
			string,
			Record<string, string>,
			Record<string, unknown>,
			string[]
		][] = [
			['POST', apiCustomers.POST as Handler, '/api/v1/customers', {}, { name: 'Ivy Marsh' }, []],
			[
				'PATCH',
				apiCustomer.PATCH as Handler,
				`/api/v1/customers/${customer.id}`,
				{ id: customer.id },
				{ notes: 'x' },
				[]
			],
			[
				'POST',
				apiSites.POST as Handler,
				`/api/v1/customers/${customer.id}/sites`,
				{ id: customer.id },
				{ address: '4 Quarry Lane' },
				[]
			],
			[
				'POST',
				apiJobs.POST as Handler,
				'/api/v1/jobs',
				{},
				{ customerId: customer.id, title: 'Hall' },
				[]
			],
			[
				'PATCH',
				apiJob.PATCH as Handler,
				`/api/v1/jobs/${job.id}`,
				{ id: job.id },
				{ title: 'Hall' },
				[]
			],
			[
				'POST',
				apiMoves.POST as Handler,
				`/api/v1/jobs/${job.id}/moves`,
				{ id: job.id },
				{ to: 'cancelled' },
				[]
			],
			[
				'PUT',
				apiMeasure.PUT as Handler,
				`/api/v1/jobs/${job.id}/measure`,
				{ id: job.id },
				{ baseVersion: 0, draft: { builtYear: '', rooms: [emptyRoom('r1', 'Hall')] } },
				['draft', 'rooms', '0']
			],
			[
				'POST',
				apiCalc.POST as Handler,
				'/api/v1/calc/cartons',
				{ name: 'cartons' },
				{ areaSqFt: 120, coverageSqFt: 20, layout: 'straight' },
				[]
			],
			[
				'POST',
				apiPreview.POST as Handler,
				'/api/v1/estimates/preview',
				{},
				{ job: { rooms: [] }, settings: { ...defaultSettings } },
				['settings', 'underlayment', 'schedules']
			],
			[
				'POST',
				apiPriceItems.POST as Handler,
				'/api/v1/price-items',
				{},
				{
					section: 'removal',
					code: 'vinyl_sheet',
					name: 'Tear out',
					data: { basis: 'sqft', priceCents: 60, payCents: 40 }
				},
				['data']
			]
		];
		for (const [method, handler, path, params, body, at] of routes) {
			for (const key of ['__proto__', 'constructor', 'prototype']) {
				const e = event(owner, path, params, {
					method,
					headers: { 'content-type': 'application/json' },
					body: withKey(structuredClone(body), at, key)
				});
				const answer = await handler(e);
				const what = `${method} ${path} with ${[...at, key].join('.')}`;
				expect(answer.status, what).toBe(400);
				const refusal = (await answer.json()) as { issues: { path: string }[] };
				expect(
					refusal.issues.map((i) => i.path),
					what
				).toEqual([[...at, key].join('.')]);
				expect(pollution().object, what).toEqual([]);
			}
		}
	});
});

describe('stored settings', () => {
	it('a stored __proto__ key does not become the settings’ prototype', () => {
		const saved = JSON.parse(
			'{"__proto__":{"polluted":"yes"},"constructor":{"prototype":{"x":1}}}'
		);
		const merged = mergeSettings(defaultSettings, saved) as unknown as Record<string, unknown>;
		expect(Object.getPrototypeOf(merged)).toBe(Object.prototype);
		expect(merged.polluted).toBeUndefined();
		expect(Object.hasOwn(merged, 'constructor')).toBe(false);
	});
});
