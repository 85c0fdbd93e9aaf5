import type { HoleRepair } from '../takeoff';
import { describe, expect, it } from 'vitest';
import { PriceIndex } from '../pricing';
import { samplePriceBook } from '../sample';
import { coverTakeoff, floorTakeoff, supplyTakeoff } from './takeoff';
import { contextFor, plankRoom } from './testing';

describe('floorTakeoff', () => {
	it('takes off cartons with the layout waste, the install and each tear-out', () => {
		const t = floorTakeoff(contextFor({ ...plankRoom, remove: ['carpet', 'sheet_vinyl'] }));
		if (!t.ok) throw new Error(t.error.message);
		// 120 ft² × 1.10 = 132 ft² ÷ 23.64 ft² a carton = 5.58 → 6 cartons (arithmetic)
		expect(t.floor.cartons?.cartons).toBe(6);
		expect(t.order.productId).toBe('lvp-grey');
		expect(t.order.cartonSqFt).toBeCloseTo(132, 12);
		expect(t.requests.map((r) => r.ref)).toEqual([
			{ type: 'install', productId: 'lvp-grey' },
			{ type: 'removal', existing: 'carpet' },
			{ type: 'removal', existing: 'sheet_vinyl' }
		]);
		expect(t.requests[0]).toMatchObject({
			qty: 120,
			path: 'priceBook.floors.1.labourCentsPerSqFt'
		});
		expect(t.requests[2]).toMatchObject({
			path: 'job.rooms.0.remove.1',
			measures: { sqft: 120, room: 1 },
			// age unknown: sheet vinyl may hold asbestos (TRADE.md "Cautions")
			cautions: ['dust_tools', 'asbestos']
		});
		expect(t.requests[1].cautions).toEqual(['dust_tools']);
		// store settings: 500 ft² a day over 8 h → 1.92 h; tear-out 60 ft² an hour → 2 h each
		expect(t.hours).toEqual([
			['install', 1.92],
			['removal', 2],
			['removal', 2]
		]);
	});

	it('keeps the asbestos caution to older houses', () => {
		const t = floorTakeoff(
			contextFor({ ...plankRoom, remove: ['sheet_vinyl'] }, { builtYear: 2005 })
		);
		expect(t.ok && t.requests[1].cautions).toEqual(['dust_tools']);
	});

	it('cuts roll goods in drops and stops a room whose product has no roll width', () => {
		const carpet = { ...plankRoom, floor: { productId: 'carpet-12', layout: 'straight' as const } };
		const t = floorTakeoff(contextFor(carpet));
		if (!t.ok) throw new Error(t.error.message);
		// one 12 ft wide drop covers the 12 ft side: 10 ft + 3 in trim each end = 126 in
		// (common practice)
		expect(t.floor.roll?.cutLengthIn).toBe(126);
		expect(t.order).toEqual({ productId: 'carpet-12', rollCutIn: 126 });
		const book = structuredClone(samplePriceBook);
		delete book.floors[3].rollWidthIn;
		expect(floorTakeoff(contextFor(carpet, { priceBook: book }))).toEqual({
			ok: false,
			error: {
				path: 'priceBook.floors.3.rollWidthIn',
				roomId: 'bed',
				message: 'Plush carpet 12 ft: roll width is missing'
			}
		});
	});
});

describe('coverTakeoff', () => {
	it('lays new underlayment, trim along every edge and transitions', () => {
		const ctx = contextFor({ ...plankRoom, trim: true, transitions: 2 });
		const t = coverTakeoff(ctx, []);
		// 120 ft² × 1.10 ÷ 32 ft² (4 × 8 ft panel, APA, published) = 4.1 → 5 panels
		expect(t.underlayment?.panels).toBe(5);
		expect(t.panelSqFt).toBe(120);
		expect(t.needs).toEqual([
			{ kind: 'underlayment', measures: { sqft: 120, panel: 5, room: 1 }, findings: [] },
			// perimeter 2 × (12 + 10) ft = 44 ft
			{ kind: 'trim', measures: { linft: 44, room: 1 }, findings: [] },
			{ kind: 'transition', measures: { each: 2 }, findings: [] }
		]);
	});

	it('lays panels where a resilient floor’s hole repair calls for them', () => {
		// A floor that does not call for panels by itself (the store's default for it is off).
		const ctx = { ...contextFor(plankRoom), newUnderlayment: false };
		expect(coverTakeoff(ctx, []).underlayment).toBeUndefined();
		const hole = { ignored: false, needsUnderlayment: true } as const;
		const repair: HoleRepair = {
			...hole,
			method: 'blocking_underlayment',
			pieces: [],
			rule: '',
			source: ''
		};
		const t = coverTakeoff(ctx, [repair]);
		expect(t.underlayment?.panels).toBe(5);
		// Issue 12 item 8 (common practice): an underlayment the customer declined is never added back.
		const declined = contextFor({ ...plankRoom, underlayment: false });
		expect(coverTakeoff(declined, [repair]).underlayment).toBeUndefined();
	});
});

describe('supplyTakeoff', () => {
	it('fills voids with patch and low spots with leveller by the price book’s units', () => {
		const index = new PriceIndex(samplePriceBook);
		const ctx = contextFor(plankRoom);
		// 96 × 1/4 × 1/8 in = 3 in³ + 10 % ÷ 231 in³ (1 US gal) → 1 pail (geometry)
		const t = supplyTakeoff(
			[{ lengthIn: 96, widthIn: 0.25, depthIn: 0.125 }],
			[{ areaSqFt: 12, depthIn: 0.125 }],
			index,
			ctx
		);
		expect(t.patch).toMatchObject({ volumeCuIn: 3, containers: 1 });
		// 12 ft² × 1/8 in ÷ 12 = 0.125 ft³ + 10 % ÷ 0.45 ft³ a bag → 1 bag (TRADE.md Quantities)
		expect(t.leveller).toMatchObject({ volumeCuFt: 0.125, bags: 1 });
		expect(supplyTakeoff([], [], index, ctx)).toEqual({});
	});
});
