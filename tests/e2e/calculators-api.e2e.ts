// The calculator, preview and OpenAPI routes through HTTP, signed in by posting the sign-in form:
// the engine's own answers with the store's settings, and refusals as JSON with their status.
import { expect, test, type APIRequestContext } from '@playwright/test';
import Ajv2020 from 'ajv/dist/2020.js';
import { calculatorExamples } from '../../src/lib/calculators/examples';
import { estimate, type StoreSettings } from '../../src/lib/estimating';
import { sampleJob, samplePriceBook } from '../../src/lib/estimating/sample';
import { calculators, type CalculatorName } from '../../src/lib/schemas/estimate';
import { pool } from '../../src/lib/server/db';
import { priceBookFor } from '../../src/lib/server/db/queries/price-book';
import { read as readSettings } from '../../src/lib/server/db/queries/settings';
import { readInStore } from '../../src/lib/server/db/tenant';
import { demoEmail, signInRequest } from './helpers';

let sales: APIRequestContext;
let installer: APIRequestContext;
let anonymous: APIRequestContext;
let storeId: string;
let settings: StoreSettings;

const json = { 'content-type': 'application/json', accept: 'application/json' };
const names = Object.keys(calculators) as CalculatorName[];

/** The calculator run here, as the route should: the body parsed, the store's settings. */
function expected(name: CalculatorName, body: unknown) {
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	const run = calculators[name].run as (i: any, s: StoreSettings) => unknown;
	return JSON.parse(JSON.stringify(run(calculators[name].input.parse(body), settings)));
}

test.beforeAll(async ({ playwright, baseURL }) => {
	const context = () => playwright.request.newContext({ baseURL });
	[sales, installer, anonymous] = await Promise.all([context(), context(), context()]);
	await signInRequest(sales, baseURL!, demoEmail('sales'));
	await signInRequest(installer, baseURL!, demoEmail('installer'));
	storeId = (await (await sales.get('/api/v1/me')).json()).store.id;
	settings = (await readInStore(storeId, readSettings)).settings;
});

test.afterAll(async () => {
	await Promise.all([sales, installer, anonymous].map((c) => c.dispose()));
	await pool.end();
});

test("every calculator answers a valid body with the engine's own answer", async () => {
	for (const name of names) {
		const response = await sales.post(`/api/v1/calc/${name}`, {
			headers: json,
			data: calculatorExamples[name]
		});
		expect(response.status(), name).toBe(200);
		expect(await response.json(), name).toEqual(expected(name, calculatorExamples[name]));
	}
	// Installers may use them too: calculators carry no prices.
	const field = await installer.post('/api/v1/calc/cartons', {
		headers: json,
		data: calculatorExamples.cartons
	});
	expect(field.status()).toBe(200);
	expect(await field.json()).toEqual(expected('cartons', calculatorExamples.cartons));
});

test('the answers agree with published and worked figures', async () => {
	// Cartons (common practice arithmetic, the store's 10 % straight waste):
	// 120 ft² × 1.10 = 132 ft² ÷ 20.5 ft² a carton = 6.44 → 7 cartons covering 143.5 ft².
	const cartons = await (
		await sales.post('/api/v1/calc/cartons', { headers: json, data: calculatorExamples.cartons })
	).json();
	expect(cartons).toMatchObject({ cartons: 7, neededSqFt: 132, suppliedSqFt: 143.5 });

	// IRC 2012 Table R502.3.1(2) (secondary): 2x10 Spruce-Pine-Fir No.2 at 16 in o.c., 40 psf live,
	// 10 psf dead, L/360: 15-5. The engine's exact span rounds to it; its own text rounds down.
	const joists = await (
		await sales.post('/api/v1/calc/joists', {
			headers: json,
			data: { size: '2x10', species: 'spruce_pine_fir', spacingIn: 16, spanIn: 168, ratio: 360 }
		})
	).json();
	expect(Math.round(joists.maxSpanIn)).toBe(15 * 12 + 5);
	expect(joists.maxSpanText).toBe(`15' 4"`);
	expect(joists.cautions.join(' ')).toContain('licensed professional');
	// Under ceramic tile the floor needs L/360 (NTCA Reference Manual, published): 14 ft passes.
	const tile = await (
		await sales.post('/api/v1/calc/joists', { headers: json, data: calculatorExamples.joists })
	).json();
	expect(tile).toMatchObject({ pass: true, checks: [{ limit: 360 }, {}] });
});

test('a bad body is 400 with the path of each bad field; nothing else answers', async ({
	baseURL
}) => {
	const bad = await sales.post('/api/v1/calc/joists', {
		headers: json,
		data: { size: '2x9', spacingIn: -16, spanIn: 'long' }
	});
	expect(bad.status()).toBe(400);
	const body = await bad.json();
	expect(body.message).toBe('Some fields are not valid');
	expect(body.issues.map((i: { path: string }) => i.path).sort()).toEqual([
		'size',
		'spacingIn',
		'spanIn',
		'species'
	]);
	const nested = await sales.post('/api/v1/calc/flatness', {
		headers: json,
		data: { floorKind: 'ceramic_tile', subfloor: 'wood', readings: [{ spanIn: 120, gapIn: -1 }] }
	});
	expect(nested.status()).toBe(400);
	expect((await nested.json()).issues[0].path).toBe('readings.0.gapIn');

	const unknown = await sales.post('/api/v1/calc/carpet-tiles', { headers: json, data: {} });
	expect(unknown.status()).toBe(404);
	expect((await unknown.json()).message).toContain('carpet-tiles');
	expect((await sales.post('/api/v1/calc/constructor', { headers: json, data: {} })).status()).toBe(
		404
	);

	const noSession = await anonymous.post('/api/v1/calc/cartons', {
		headers: json,
		data: calculatorExamples.cartons
	});
	expect(noSession.status()).toBe(401);
	expect(await noSession.json()).toEqual({ message: 'Sign in first' });

	const notJson = await sales.post('/api/v1/calc/cartons', {
		headers: { 'content-type': 'text/plain', origin: baseURL! },
		data: 'areaSqFt=120'
	});
	expect(notJson.status()).toBe(415);
});

test("the preview prices a job with the store's own settings and price book", async () => {
	const priceBook = await readInStore(storeId, async (tx) =>
		priceBookFor(tx, (await readSettings(tx)).currency)
	);
	// The demo store's floors are the sample book's, under ids of its own.
	const storeFloor = new Map(priceBook.floors.map((f) => [f.name, f.id]));
	const job = sampleJob(4);
	for (const room of job.rooms) {
		const sample = samplePriceBook.floors.find((f) => f.id === room.floor?.productId);
		if (room.floor && sample) room.floor.productId = storeFloor.get(sample.name)!;
	}
	const response = await sales.post('/api/v1/estimates/preview', { headers: json, data: { job } });
	expect(response.status()).toBe(200);
	const result = await response.json();
	expect(result).toEqual(JSON.parse(JSON.stringify(estimate({ job, settings, priceBook }))));
	expect(result.ok).toBe(true);
	// The demo store's own tax, not the engine's default of none.
	expect(result.totals.taxes.map((t: { name: string }) => t.name)).toEqual([
		'Bramblefield sales tax'
	]);

	// An installer gets the installer view: no store prices or margins anywhere.
	const field = await installer.post('/api/v1/estimates/preview', {
		headers: json,
		data: { job }
	});
	expect(field.status()).toBe(200);
	const view = await field.json();
	expect(view.work.length).toBe(result.lines.length);
	expect(view.installerPayCents).toBe(result.installerPayCents);
	expect(JSON.stringify(view)).not.toMatch(/priceCents|costCents|margin|subtotal/i);

	const bad = await sales.post('/api/v1/estimates/preview', {
		headers: json,
		data: {
			job: { rooms: [{ ...job.rooms[0], shape: { kind: 'rect', widthIn: -1, lengthIn: 9 } }] }
		}
	});
	expect(bad.status()).toBe(400);
	expect((await bad.json()).issues.map((i: { path: string }) => i.path)).toEqual([
		'job.rooms.0.shape.widthIn'
	]);
	expect(
		(await anonymous.post('/api/v1/estimates/preview', { headers: json, data: { job } })).status()
	).toBe(401);
});

test('openapi.json describes the routes, and the real answers fit it', async () => {
	expect((await anonymous.get('/api/v1/openapi.json')).status()).toBe(401);
	const response = await sales.get('/api/v1/openapi.json');
	expect(response.status()).toBe(200);
	const doc = JSON.parse(await response.text());
	expect(doc.openapi).toBe('3.1.0');
	for (const name of names) expect(doc.paths[`/api/v1/calc/${name}`], name).toBeDefined();
	const cookies = (await sales.storageState()).cookies.map((c) => c.name);
	expect(cookies).toContain(doc.components.securitySchemes.session.name);

	const ajv = new Ajv2020({ strict: false, allErrors: true, validateFormats: false });
	ajv.addSchema({ $id: 'https://flushline.invalid/openapi.json', components: doc.components });
	const fits = (id: string, value: unknown) => {
		const validate = ajv.getSchema(
			`https://flushline.invalid/openapi.json#/components/schemas/${id}`
		)!;
		const ok = validate(value);
		expect(ok, `${id}: ${JSON.stringify(validate.errors)}`).toBe(true);
	};
	fits('Me', await (await sales.get('/api/v1/me')).json());
	fits('CustomerPage', await (await sales.get('/api/v1/customers')).json());
	const jobs = await (await sales.get('/api/v1/jobs')).json();
	fits('JobPage', jobs);
	fits('JobView', await (await sales.get(`/api/v1/jobs/${jobs.rows[0].id}`)).json());
	const changed = await sales.patch(`/api/v1/jobs/${jobs.rows[0].id}`, {
		headers: json,
		data: { notes: jobs.rows[0].notes }
	});
	fits('Job', await changed.json());
	fits(
		'CalculatorResult',
		await (
			await sales.post('/api/v1/calc/area', { headers: json, data: calculatorExamples.area })
		).json()
	);
	fits(
		'ValidationError',
		await (await sales.post('/api/v1/calc/area', { headers: json, data: {} })).json()
	);
	fits('Error', await (await installer.get('/api/v1/customers')).json());
	// What a person would send validates against the document as it does against zod.
	const input = doc.paths['/api/v1/calc/moisture'].post.requestBody.content['application/json'];
	fits(input.schema.$ref.split('/').pop(), input.example);
});
