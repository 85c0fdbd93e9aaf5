/**
 * Golden results: the sample jobs, the demo store's measures, a job full of errors, a change
 * order and every calculator's example give exactly the result objects recorded in `golden/`.
 * Recorded from the engine before it was split into named steps (issue 8 item 5); a change to
 * any figure, order or message shows here. Re-record only for an intended change of behaviour:
 * `npx vitest run --project unit src/lib/estimating/golden.spec.ts -u`, and say why in the commit.
 */
import { describe, expect, it } from 'vitest';
import { demoMeasure } from '../../../scripts/demo-measures';
import { calculatorExamples } from '$lib/calculators/examples';
import { toEngine } from '$lib/measure/draft';
import { calculators, type CalculatorName } from '$lib/calculators/registry';
import { changeOrder, soldQuantities } from './change-order';
import { estimate, forCustomer, forInstaller } from './estimate';
import type { EstimateInput } from './index';
import type { PriceBook } from './pricing';
import { demoFloors, samplePriceBook, sampleJob } from './sample';
import { defaultSettings, type StoreSettings } from './settings';

/**
 * As JSON (what a quote keeps: `undefined` keys dropped, -0 as 0) with every object's keys
 * sorted, so the order in which a step fills an object is not part of the result.
 */
const stored = (x: unknown) =>
	JSON.stringify(
		x,
		(_key, value) =>
			value && typeof value === 'object' && !Array.isArray(value)
				? Object.fromEntries(Object.entries(value).sort(([a], [b]) => (a < b ? -1 : 1)))
				: value,
		1
	) + '\n';
const golden = (name: string) => `./golden/${name}.json`;

/** Other taxes, rounding, deposit, spans and hours than the defaults. */
const otherSettings: StoreSettings = {
	...structuredClone(defaultSettings),
	taxes: [
		{ name: 'State tax', rateBps: 650, groups: ['material'] },
		{ name: 'Service tax', rateBps: 225, groups: ['labour', 'prep', 'removal'] }
	],
	taxRounding: 'half_even',
	deposit: { percentBps: 3000, minimumCents: 25_000 },
	asbestosBuiltBefore: 1981
};
otherSettings.joists.spanRounding = 'nearest';
otherSettings.schedule.workdayHours = 7;
otherSettings.schedule.dayStartHour = 7;
otherSettings.underlayment.schedule = 'staples';

const otherBook: PriceBook = structuredClone(samplePriceBook);
otherBook.prep = otherBook.prep.map((p) =>
	p.kind === 'level' ? { ...p, basis: 'sqft' as const } : p
);
otherBook.supplies = otherBook.supplies.map((s) =>
	s.kind === 'fastener' ? { ...s, basis: 'each' as const, priceCents: 3 } : s
);

/** A job where something goes wrong in every way the engine reports. */
function errorsInput(): EstimateInput {
	const job = sampleJob(12, 1955);
	const [a, b, c, d, e, f, g] = job.rooms;
	b.id = a.id;
	c.shape = {
		kind: 'points',
		points: [
			[0, 0],
			[100, 100],
			[100, 0],
			[0, 100]
		]
	};
	d.floor = { productId: 'no-such-floor', layout: 'straight' };
	delete e.floor;
	f.shape = {
		kind: 'sides',
		sides: [
			{ lengthIn: 100, turn: 'left' },
			{ lengthIn: 50, turn: 'left' },
			{ lengthIn: 90, turn: 'left' }
		]
	};
	g.remove = ['hardwood_glued', 'ceramic_tile'];
	const priceBook: PriceBook = structuredClone(samplePriceBook);
	priceBook.prep = priceBook.prep.filter((p) => p.kind !== 'hole_repair' && p.kind !== 'trim');
	priceBook.prep = priceBook.prep.map((p) =>
		p.kind === 'grind' ? { ...p, basis: 'linft' as const } : p
	);
	priceBook.removal = priceBook.removal.filter((r) => r.existing !== 'ceramic_tile');
	priceBook.supplies = priceBook.supplies
		.filter((s) => s.kind !== 'patch')
		.map((s) => (s.kind === 'leveller' ? { ...s, bagYieldCuFt: undefined } : s));
	return { job, settings: defaultSettings, priceBook };
}

const DEMO_TITLES = [
	'Kitchen and hall, vinyl plank',
	'Basement carpet',
	'Living room oak',
	'Two bedrooms, carpet',
	'Bathroom tile',
	'Sunroom laminate',
	'Laundry sheet vinyl',
	'Upstairs landing carpet',
	'Den engineered wood'
];

const demoSettings: StoreSettings = {
	...defaultSettings,
	taxes: [{ name: 'Bramblefield sales tax', rateBps: 650, groups: ['material'] }],
	deposit: { percentBps: 3000, minimumCents: 25_000 }
};
const demoBook: PriceBook = {
	...samplePriceBook,
	floors: [...samplePriceBook.floors, ...demoFloors]
};
const floorId = (name: string) => {
	const f = demoBook.floors.find((x) => x.name === name);
	if (!f) throw new Error(`No demo floor ${name}`);
	return f.id;
};

describe('golden results', () => {
	it('the 12-room sample job, and what the customer and the installer see of it', async () => {
		const r = estimate({
			job: sampleJob(12, 1975),
			settings: defaultSettings,
			priceBook: samplePriceBook
		});
		await expect(stored(r)).toMatchFileSnapshot(golden('sample-12'));
		await expect(stored(forCustomer(r))).toMatchFileSnapshot(golden('sample-12-customer'));
		await expect(stored(forInstaller(r))).toMatchFileSnapshot(golden('sample-12-installer'));
	});

	it("the benchmark's 60-room job", async () => {
		const r = estimate({
			job: sampleJob(60),
			settings: defaultSettings,
			priceBook: samplePriceBook
		});
		await expect(stored(r)).toMatchFileSnapshot(golden('sample-60'));
	});

	it('a sample job under other taxes, rounding, deposit, spans, hours and bases', async () => {
		const r = estimate({ job: sampleJob(18, 1979), settings: otherSettings, priceBook: otherBook });
		await expect(stored(r)).toMatchFileSnapshot(golden('sample-18-other'));
	});

	it('a job with every kind of error, in the order they are found', async () => {
		const r = estimate(errorsInput());
		expect(r.ok).toBe(false);
		await expect(stored(r)).toMatchFileSnapshot(golden('errors'));
	});

	it("the demo store's measures, read as typed", async () => {
		const all = DEMO_TITLES.map((title) => {
			const read = toEngine(demoMeasure(title, floorId), demoSettings);
			const input = { job: read.job, settings: demoSettings, priceBook: demoBook };
			return { title, draftErrors: read.errors, job: read.job, result: estimate(input) };
		});
		expect(all.every((x) => x.draftErrors.length === 0 && x.result.ok)).toBe(true);
		await expect(stored(all)).toMatchFileSnapshot(golden('demo'));
	});

	it('a change order: found against sold on the sample job', async () => {
		const sold = estimate({
			job: sampleJob(12, 1975),
			settings: defaultSettings,
			priceBook: samplePriceBook
		});
		const job = sampleJob(12, 1975);
		job.rooms[1].repairs = { holes: [{ widthIn: 20, lengthIn: 30 }] };
		job.rooms[3].readings = { woodMc: { subfloorPct: [15], flooringPct: [8] } };
		job.rooms.pop();
		const found = estimate({ job, settings: defaultSettings, priceBook: samplePriceBook });
		const co = changeOrder({
			sold: soldQuantities(sold),
			found: soldQuantities(found),
			priceBook: samplePriceBook,
			settings: otherSettings
		});
		await expect(stored(co)).toMatchFileSnapshot(golden('change-order'));
	});

	it("every calculator's example, with the default and other settings", async () => {
		const names = Object.keys(calculators) as CalculatorName[];
		const all = names.map((name) => {
			const c = calculators[name];
			const input = c.input.parse(calculatorExamples[name]);
			const run = c.run as (i: unknown, s?: StoreSettings) => unknown;
			return { name, default: run(input), other: run(input, otherSettings) };
		});
		await expect(stored(all)).toMatchFileSnapshot(golden('calculators'));
	});
});
