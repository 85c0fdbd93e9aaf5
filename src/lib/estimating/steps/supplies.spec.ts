/**
 * The install's own supplies on a whole estimate: thinset, grout and backer for the tile, and new
 * baseboard and shoe in stock lengths, each a price-book supply the store may leave out. Worked
 * examples as in `tile.spec.ts` and `trim.spec.ts` (arithmetic; data sheets in the price book;
 * stock lengths and allowances common practice, memory).
 */
import { describe, expect, it } from 'vitest';
import { changeOrder, soldQuantities } from '../change-order';
import { estimate, forCustomer, forInstaller } from '../estimate';
import type { PriceBook } from '../pricing';
import { samplePriceBook } from '../sample';
import { defaultSettings, type StoreSettings } from '../settings';
import type { RoomMeasure } from '../types';

const kitchen: RoomMeasure = {
	id: 'k',
	name: 'Kitchen',
	shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
	floor: { productId: 'lvp-grey', layout: 'straight' },
	subfloor: { kind: 'plywood', thicknessIn: 0.625 },
	base: { baseboard: 'new', shoe: 'new' },
	doorways: [{ widthIn: 32 }, { widthIn: 32 }]
};
const hall: RoomMeasure = {
	id: 'h',
	name: 'Hall',
	shape: { kind: 'rect', widthIn: 42, lengthIn: 192 },
	floor: { productId: 'lvp-grey', layout: 'straight' },
	subfloor: { kind: 'plywood', thicknessIn: 0.625 },
	base: { shoe: 'new' }
};
const bath: RoomMeasure = {
	id: 'b',
	name: 'Bathroom',
	shape: { kind: 'rect', widthIn: 72, lengthIn: 96 },
	floor: { productId: 'tile-12', layout: 'straight' },
	subfloor: { kind: 'plywood', thicknessIn: 0.75 }
};
const run = (
	rooms: RoomMeasure[],
	priceBook: PriceBook = samplePriceBook,
	settings: StoreSettings = defaultSettings
) => estimate({ job: { builtYear: 2005, rooms }, settings, priceBook });
const line = (r: ReturnType<typeof run>, key: string) => r.lines.find((l) => l.key === key);

describe('install supplies on the quote', () => {
	it('prices thinset, grout and backer for a 6 × 8 ft bathroom over plywood', () => {
		const r = run([bath]);
		expect(r.errors).toEqual([]);
		// 48 ft² + 10 % = 52.8 ft²: thinset at 60 ft² a bag → 1; backer 3 × 5 ft sheets → 4
		expect(line(r, 'supply:thinset')).toMatchObject({ qty: 1, amountCents: 3_800 });
		expect(line(r, 'supply:backer')).toMatchObject({ qty: 4, amountCents: 6_400 });
		// joints: 48 × 0.8336 = 40.0 in³ (+10 % = 44 in³) in one 0.2 ft³ bag
		expect(line(r, 'supply:grout')).toMatchObject({ qty: 1, amountCents: 2_600 });
		expect(line(r, 'supply:grout')?.description).toContain('joints come to 41 in³');
		// materials: no installer pay on them; the setting work keeps its own pay line
		const ids = new Set(r.pay.map((p) => p.lineId));
		expect(ids.has('job:supply:thinset')).toBe(false);
		expect(ids.has('b:prep:tile_setting')).toBe(true);
		// cement board is cut: the dust and tools caution
		expect(r.cautions.map((c) => c.kind)).toContain('dust_tools');
	});

	it('buys baseboard and shoe in 16 ft lengths, sharing offcuts across the job', () => {
		const r = run([kitchen, hall]);
		expect(r.errors).toEqual([]);
		// kitchen baseboard: 122 + 58 | 122 + 58 | 58 + 58 → 3 lengths (trim.spec.ts)
		expect(line(r, 'supply:baseboard')).toMatchObject({ qty: 3, amountCents: 7_200 });
		expect(line(r, 'supply:baseboard')?.description).toBe(
			'Primed baseboard 3 1/4 in, 16 ft — 3 lengths of 16 ft (39 lin ft of wall)'
		);
		// kitchen and hall shoe together: 6 lengths
		expect(line(r, 'supply:shoe')).toMatchObject({ qty: 6, amountCents: 6_600 });
		// the fitting is still priced per linear ft of wall less doorways: 464 in → 39 ft
		expect(r.lines.find((l) => l.id === 'k:prep:base_new')?.qty).toBe(39);
	});

	it('counts nothing for trim put back (reset) or a floor without tile', () => {
		const r = run([{ ...kitchen, base: { baseboard: 'reset', shoe: 'reset' } }]);
		expect(line(r, 'supply:baseboard')).toBeUndefined();
		expect(line(r, 'supply:shoe')).toBeUndefined();
		expect(line(r, 'supply:thinset')).toBeUndefined();
	});

	it('can be priced per linear ft of stock instead of per length', () => {
		const book: PriceBook = structuredClone(samplePriceBook);
		const base = book.supplies.find((s) => s.kind === 'baseboard')!;
		base.basis = 'linft';
		base.priceCents = 150;
		const r = run([kitchen], book);
		// 3 lengths × 16 ft = 48 ft at $1.50
		expect(line(r, 'supply:baseboard')).toMatchObject({ qty: 48, amountCents: 7_200 });
	});

	it('leaves out what the store has no supply for, and the prep line still prices', () => {
		const book: PriceBook = {
			...samplePriceBook,
			supplies: samplePriceBook.supplies.filter(
				(s) => !['thinset', 'grout', 'backer', 'baseboard', 'shoe'].includes(s.kind)
			)
		};
		const r = run([kitchen, bath], book);
		expect(r.errors).toEqual([]);
		expect(r.lines.filter((l) => l.group === 'material').map((l) => l.key)).not.toEqual(
			expect.arrayContaining(['supply:thinset'])
		);
		expect(r.lines.some((l) => l.key.startsWith('supply:b'))).toBe(false);
		expect(line(r, 'prep:tile_setting')).toBeDefined();
		expect(line(r, 'prep:base_new')).toBeDefined();
	});

	it('names the missing data sheet figure instead of pricing without it', () => {
		const book: PriceBook = structuredClone(samplePriceBook);
		delete book.supplies.find((s) => s.kind === 'thinset')!.coverageSqFt;
		delete book.supplies.find((s) => s.kind === 'baseboard')!.stockLengthIn;
		const r = run([kitchen, bath], book);
		expect(r.errors.map((e) => e.message)).toEqual([
			'Modified thinset mortar, 50 lb bag: the coverage of a bag is missing (supply "thinset")',
			'Primed baseboard 3 1/4 in, 16 ft: the stock length is missing (supply "baseboard")'
		]);
		expect(r.errors.every((e) => e.path === 'priceBook.supplies')).toBe(true);
	});

	it('warns when the tile has no size to count grout by', () => {
		const book: PriceBook = structuredClone(samplePriceBook);
		delete book.floors.find((f) => f.id === 'tile-12')!.tileEdgesIn;
		const r = run([bath], book);
		expect(line(r, 'supply:grout')).toBeUndefined();
		expect(r.warnings.map((w) => w.message)).toContain(
			"Grout is not counted for Porcelain tile 12 × 24 in: the tile's size is not in the price book"
		);
	});

	it('takes the store’s waste and trim allowance from its settings', () => {
		const settings: StoreSettings = {
			...defaultSettings,
			installSupplies: { wastePct: 30, trimEndAllowanceIn: 0 }
		};
		const r = run([bath], samplePriceBook, settings);
		// 48 × 1.3 = 62.4 ft² → thinset 2 bags, backer 5 sheets
		expect(line(r, 'supply:thinset')?.qty).toBe(2);
		expect(line(r, 'supply:backer')?.qty).toBe(5);
	});

	it('shows on the customer’s quote and the installer’s work list, and prices in a change order', () => {
		const r = run([kitchen, bath]);
		expect(forCustomer(r).lines.map((l) => l.key)).toEqual(
			expect.arrayContaining(['supply:thinset', 'supply:grout', 'supply:backer'])
		);
		const work = forInstaller(r).work.find((w) => w.id === 'job:supply:baseboard');
		expect(work).toMatchObject({ qty: 3, group: 'material' });
		expect(work).not.toHaveProperty('amountCents');
		// one more length of baseboard found on site: $24.00 on the change order
		const sold = soldQuantities(r);
		const found = sold.map((q) =>
			q.ref.type === 'supply' && q.ref.kind === 'baseboard' ? { ...q, qty: q.qty + 1 } : q
		);
		const co = changeOrder({
			sold,
			found,
			priceBook: samplePriceBook,
			settings: defaultSettings
		});
		expect(co.lines).toHaveLength(1);
		expect(co.lines[0]).toMatchObject({ key: 'supply:baseboard', deltaQty: 1, deltaCents: 2_400 });
	});
});
