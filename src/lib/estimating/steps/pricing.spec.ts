import { describe, expect, it } from 'vitest';
import { PriceIndex } from '../pricing';
import { samplePriceBook } from '../sample';
import { defaultSettings } from '../settings';
import type { Finding } from '../types';
import { materialItems, prepItems, priceItems, type JobOrder } from './pricing';
import type { ItemRequest } from './room';
import { contextFor, plankRoom } from './testing';

const index = new PriceIndex(samplePriceBook);
const names = (id: string) => (id === 'bed' ? 'Bedroom' : undefined);

describe('priceItems', () => {
	it('prices each request by the measure its price is counted in', () => {
		const requests: ItemRequest[] = [
			{ ref: { type: 'install', productId: 'lvp-grey' }, roomId: 'bed', qty: 120, path: 'p' },
			{
				ref: { type: 'removal', existing: 'carpet' },
				roomId: 'bed',
				qty: 1,
				path: 'q',
				measures: { sqft: 120, room: 1 },
				cautions: ['dust_tools']
			}
		];
		const p = priceItems(requests, index, defaultSettings, names);
		// install 120 ft² × $2.00; tear-out of carpet priced per ft²: 120 × $0.60
		expect(p.lines.map((l) => [l.id, l.qty, l.amountCents])).toEqual([
			['bed:install:lvp-grey', 120, 24_000],
			['bed:removal:carpet', 120, 7_200]
		]);
		// installer pay beside it: 120 × $1.30 and 120 × $0.40
		expect(p.pay.map((l) => l.amountCents)).toEqual([15_600, 4_800]);
		expect(p.cautions).toEqual([
			{ kind: 'dust_tools', roomId: 'bed', lineId: 'bed:removal:carpet' }
		]);
		expect(p.itemLines.map((l) => l?.id)).toEqual(['bed:install:lvp-grey', 'bed:removal:carpet']);
		expect(p.errors).toEqual([]);
	});

	it('says which price is missing or does not fit, and prices the rest', () => {
		const book = {
			...samplePriceBook,
			prep: [{ kind: 'grind' as const, basis: 'linft' as const, priceCents: 100, payCents: 50 }]
		};
		const p = priceItems(
			[
				{
					ref: { type: 'prep', kind: 'level' },
					roomId: 'bed',
					qty: 0,
					path: 'priceBook.prep',
					measures: { sqft: 5 }
				},
				{
					ref: { type: 'prep', kind: 'grind' },
					roomId: 'bed',
					qty: 0,
					path: 'priceBook.prep',
					measures: { each: 1 },
					cautions: ['dust_tools']
				},
				{ error: { path: 'priceBook.supplies', message: 'No price for supply "patch"' } },
				{
					ref: { type: 'prep', kind: 'grind' },
					roomId: 'bed',
					qty: 0,
					path: 'x',
					measures: { linft: 0 }
				}
			],
			new PriceIndex(book),
			defaultSettings,
			names
		);
		expect(p.errors).toEqual([
			{
				path: 'priceBook.prep',
				roomId: 'bed',
				message: 'No price for prep "level" (needed in Bedroom)'
			},
			{
				path: 'priceBook.prep',
				roomId: 'bed',
				message: '"grind" is priced per linft, which does not fit grind'
			},
			{ path: 'priceBook.supplies', message: 'No price for supply "patch"' }
		]);
		// nothing to price at a quantity of zero, and no line to tie the caution to
		expect(p.lines).toEqual([]);
		expect(p.cautions).toEqual([{ kind: 'dust_tools', roomId: 'bed', lineId: undefined }]);
	});

	it('keeps the store cost, and says when a material has none', () => {
		const floor = { ref: { type: 'floor', productId: 'lvp-grey' }, qty: 10, path: 'f' } as const;
		// 10 ft² × $1.90 cost
		expect(priceItems([floor], index, defaultSettings, names)).toMatchObject({
			costCents: 1_900,
			costComplete: true
		});
		const book = structuredClone(samplePriceBook);
		delete book.floors[1].material.costCents;
		expect(priceItems([floor], new PriceIndex(book), defaultSettings, names).costComplete).toBe(
			false
		);
	});
});

describe('prepItems', () => {
	it('measures each prep in hours too, by the store’s hours per unit', () => {
		const f = { id: 'bed:flatness:0' } as Finding;
		const p = prepItems(
			[
				{
					kind: 'level',
					measures: { sqft: 10, sqft_per_eighth_in: 10, each: 1, room: 1 },
					findings: [f]
				}
			],
			contextFor(plankRoom)
		);
		// level: 0.01 h per ft² (store setting) × 10 ft² = 0.1 h
		expect(p.hours).toEqual([['level', 0.1]]);
		expect(p.prep).toEqual([
			{ kind: 'level', qty: { sqft: 10, sqft_per_eighth_in: 10, each: 1, room: 1, hour: 0.1 } }
		]);
		expect(p.requests[0]).toMatchObject({
			ref: { type: 'prep', kind: 'level' },
			roomId: 'bed',
			description: 'Level low spots (patch or self-levelling underlayment) — Bedroom',
			findingIds: ['bed:flatness:0'],
			path: 'priceBook.prep'
		});
	});
});

describe('materialItems', () => {
	const order = (o: Partial<JobOrder>): JobOrder => ({
		cartonSqFt: new Map(),
		rollCutIn: new Map(),
		panelSqFt: 0,
		voids: [],
		levelAreas: [],
		...o
	});

	it('rounds cartons and roll length up once for the whole job', () => {
		// two rooms of 55 ft² with waste: 3 cartons each, but 110 ÷ 23.64 = 4.65 → 5 for the job
		const { items } = materialItems(
			order({
				cartonSqFt: new Map([['lvp-grey', 110]]),
				rollCutIn: new Map([['sheet-6', 150 + 150]])
			}),
			index,
			defaultSettings
		);
		expect(items).toEqual([
			{
				ref: { type: 'floor', productId: 'lvp-grey' },
				qty: 0,
				description: 'Grey vinyl plank — 5 cartons',
				path: 'priceBook.floors',
				measures: { carton: 5, sqft: 118.2 }
			},
			{
				ref: { type: 'floor', productId: 'sheet-6' },
				qty: 0,
				// 300 in → 25 ft, ordered in whole feet (common practice); 25 × 6 ÷ 9 yd²
				description: 'Sheet vinyl 6 ft — 25 lin ft of 6 ft roll',
				path: 'priceBook.floors',
				measures: { roll_linft: 25, roll_sqyd: (300 * 72) / 1296 }
			}
		]);
	});

	it('buys panels, fasteners, patch and leveller, or says what the price book lacks', () => {
		const book = structuredClone(samplePriceBook);
		book.supplies = book.supplies.filter((s) => s.kind !== 'patch');
		const m = materialItems(
			order({
				panelSqFt: 120,
				voids: [{ lengthIn: 96, widthIn: 0.25, depthIn: 0.125 }],
				levelAreas: [{ areaSqFt: 12, depthIn: 0.125 }]
			}),
			new PriceIndex(book),
			defaultSettings
		);
		expect(m.items.map((i) => ('error' in i ? i.error.message : i.description))).toEqual([
			'Underlayment panels — 5',
			// 5 panels × 201 nails (APA E30V Table 14, published, 3 in edges and 6 in field)
			'Underlayment fasteners — 1005 (1/4 in plywood underlayment, nails)',
			'No price for supply "patch"',
			'Self-levelling underlayment, 50 lb bag — 1 bags'
		]);
		expect(m.cautions).toEqual([{ kind: 'dust_tools' }]);
	});
});
