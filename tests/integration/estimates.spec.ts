// The calculator and preview routes' server side: the store's own settings and price book, and
// what an installer may get back.
import { inStore } from '$lib/server/db/tenant';
import { describe, expect, it } from 'vitest';
import { defaultSettings, estimate } from '$lib/estimating';
import { sampleJob, samplePriceBook } from '$lib/estimating/sample';
import { calculators } from '$lib/schemas/estimate';
import { priceBookFor } from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { previewEstimate, runCalculator } from '$lib/server/estimates';
import { makePriceBook, makeStore } from './factories';

const cartons = calculators.cartons.input.parse({ areaSqFt: 120, coverageSqFt: 20.5 });

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
		const { floors } = await makePriceBook(store.id);
		const job = sampleJob(4);
		for (const room of job.rooms)
			if (room.floor) room.floor.productId = floors[room.floor.productId];
		const result = await inStore(store.id, (tx) => previewEstimate(tx, 'sales', { job }));
		const { settings, currency } = await inStore(store.id, (tx) => tradeSettings.read(tx));
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
		expect(await inStore(store.id, (tx) => previewEstimate(tx, 'owner', input))).toEqual(
			estimate(input)
		);
	});

	it('gives an installer the installer view: no prices, totals or margins', async () => {
		const store = await makeStore('Installer Floors');
		const { floors } = await makePriceBook(store.id);
		const job = sampleJob(3);
		for (const room of job.rooms)
			if (room.floor) room.floor.productId = floors[room.floor.productId];
		const view = await inStore(store.id, (tx) => previewEstimate(tx, 'installer', { job }));
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
});
