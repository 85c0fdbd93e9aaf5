// The calculator and preview routes' server side: the store's own settings and price book, and
// what an installer may get back.
import { inStore, readInStore } from '$lib/server/db/tenant';
import { describe, expect, it } from 'vitest';
import { defaultSettings, estimate } from '$lib/estimating';
import { sampleJob, samplePriceBook } from '$lib/estimating/sample';
import { calculators } from '$lib/calculators/registry';
import { priceBookFor } from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { previewEstimate, runCalculator } from '$lib/server/estimates';
import { grantsOf } from '$lib/server/permissions';
import { makePriceBook, makeStore } from './factories';

const cartons = calculators.cartons.input.parse({ areaSqFt: 120, coverageSqFt: 20.5 });

/** A sample job of some rooms whose floors are the store's own price-book lines. */
async function pricedJob(storeId: string, rooms: number) {
	const { floors } = await makePriceBook(storeId);
	const job = sampleJob(rooms);
	for (const room of job.rooms) if (room.floor) room.floor.productId = floors[room.floor.productId];
	return job;
}

describe('runCalculator', () => {
	it("uses the engine's defaults for a store that saved none, and the store's own once saved", async () => {
		const store = await makeStore('Calc Floors');
		// 120 × 1.10 ÷ 20.5 = 6.44 → 7 (common practice arithmetic)
		expect(await inStore(store.id, (tx) => runCalculator(tx, 'cartons', cartons))).toMatchObject({
			cartons: 7,
			wastePct: 10
		});
		const settings = structuredClone(defaultSettings);
		settings.wastePct.straight = 25;
		await inStore(store.id, (tx) =>
			tradeSettings.save(tx, { settings, currency: 'USD', quoteValidDays: 30 })
		);
		// 120 × 1.25 ÷ 20.5 = 7.32 → 8
		expect(await inStore(store.id, (tx) => runCalculator(tx, 'cartons', cartons))).toMatchObject({
			cartons: 8,
			wastePct: 25
		});
		// Another store keeps its own.
		const other = await makeStore('Other Floors');
		expect(await inStore(other.id, (tx) => runCalculator(tx, 'cartons', cartons))).toMatchObject({
			cartons: 7
		});
	});
});

describe('previewEstimate', () => {
	it("prices a job with the store's settings and price book when the body leaves them out", async () => {
		const store = await makeStore('Preview Floors');
		const job = await pricedJob(store.id, 4);
		const result = await readInStore(store.id, (tx) =>
			previewEstimate(tx, grantsOf('manager'), { job })
		);
		const { settings, currency } = await readInStore(store.id, (tx) => tradeSettings.read(tx));
		expect(result).toEqual(
			estimate({
				job,
				settings,
				priceBook: await inStore(store.id, (tx) => priceBookFor(tx, currency))
			})
		);
		expect('lines' in result && result.ok).toBe(true);
		// The store's sales tax applies (Test sales tax, 6.5 % on material).
		expect('totals' in result && result.totals.taxes[0]).toMatchObject({ name: 'Test sales tax' });
	});

	it('uses the settings and price book sent in the body as they are', async () => {
		const store = await makeStore('Sent Floors');
		const input = { job: sampleJob(2), settings: defaultSettings, priceBook: samplePriceBook };
		expect(
			await readInStore(store.id, (tx) => previewEstimate(tx, grantsOf('owner'), input))
		).toEqual(estimate(input));
	});

	it('gives an installer the installer view: no prices, totals or margins', async () => {
		const store = await makeStore('Installer Floors');
		const job = await pricedJob(store.id, 3);
		const view = await readInStore(store.id, (tx) =>
			previewEstimate(tx, grantsOf('installer'), { job })
		);
		expect(Object.keys(view).sort()).toEqual(
			[
				'cautions',
				'errors',
				'findings',
				'installerPayCents',
				'ok',
				'pay',
				'rooms',
				'schedule',
				'warnings',
				'work'
			].sort()
		);
		const text = JSON.stringify(view);
		expect(text).not.toMatch(/priceCents|costCents|margin|subtotal/i);
		expect('installerPayCents' in view && view.installerPayCents).toBeGreaterThan(0);
	});

	it('gives a salesperson sell prices without pay or margin, unless the store shows them costs', async () => {
		const store = await makeStore('Counter Floors');
		const job = await pricedJob(store.id, 4);
		const { settings, currency } = await readInStore(store.id, (tx) => tradeSettings.read(tx));
		const priceBook = await readInStore(store.id, (tx) => priceBookFor(tx, currency));
		const whole = estimate({ job, settings, priceBook });
		expect(whole.installerPayCents).toBeGreaterThan(0);

		const sell = await readInStore(store.id, (tx) =>
			previewEstimate(tx, grantsOf('sales'), { job })
		);
		const { pay: _p, installerPayCents: _i, margin: _m, ...expected } = whole;
		expect(sell).toEqual(expected);
		expect(JSON.stringify(sell)).not.toMatch(/installerPay|margin|costCents|"pay"/);

		const seeing = grantsOf('sales', { salesSeeCosts: true, salesJobs: 'all' });
		expect(await readInStore(store.id, (tx) => previewEstimate(tx, seeing, { job }))).toEqual(
			whole
		);
	});
});
