import { describe, expect, it } from 'vitest';
import {
	installPay,
	manualLineAmount,
	statementTotal,
	totalsByKind,
	type PaySource
} from './maths';

// A job of 212.5 ft² vinyl plank, two holes and 3 underlayment panels. The book pays 1.35 a ft²
// to lay the plank, 40.00 a hole, nothing on the panels (sold as material).
const source: PaySource = {
	lines: [
		{
			id: 'r1:install:vp-1',
			ref: { type: 'install', productId: 'vp-1' },
			description: 'Lay vinyl plank',
			basis: 'sqft',
			qty: 212.5
		},
		{
			id: 'r1:prep:hole_repair',
			ref: { type: 'prep', kind: 'hole_repair' },
			description: 'Close a hole',
			basis: 'each',
			qty: 2
		},
		{
			id: 'r1:supply:underlayment_panel',
			ref: { type: 'supply', kind: 'underlayment_panel' },
			description: 'Underlayment panel',
			basis: 'panel',
			qty: 3
		}
	],
	pay: [
		{ lineId: 'r1:install:vp-1', qty: 212.5, unitCents: 135, amountCents: 28_688 },
		{ lineId: 'r1:prep:hole_repair', qty: 2, unitCents: 4_000, amountCents: 8_000 }
	]
};

describe('installPay', () => {
	it('keeps the book’s pay where the installer has no rate of their own', () => {
		const pay = installPay(source, []);
		expect(pay.lines.map((l) => l.amountCents)).toEqual([28_688, 8_000]);
		// 28,688 + 8,000 = 36,688
		expect(pay.totalCents).toBe(36_688);
		expect(pay.lines.every((l) => !l.ownRate)).toBe(true);
	});

	it('replaces the book’s rate item by item with the installer’s, rounding half up', () => {
		// 212.5 ft² × 1.41 = 299.625 → 299.63 (half up); the hole keeps the book's 2 × 40.00.
		const pay = installPay(source, [
			{ ref: { type: 'install', productId: 'vp-1' }, payCents: 141 }
		]);
		expect(pay.lines[0]).toMatchObject({ unitCents: 141, amountCents: 29_963, ownRate: true });
		expect(pay.lines[1]).toMatchObject({ amountCents: 8_000, ownRate: false });
		expect(pay.totalCents).toBe(29_963 + 8_000);
	});

	it('pays a line the book paid nothing on at the installer’s own rate', () => {
		// 3 panels × 2.25 = 6.75
		const pay = installPay(source, [
			{ ref: { type: 'supply', kind: 'underlayment_panel' }, payCents: 225 }
		]);
		expect(pay.lines.map((l) => l.amountCents)).toEqual([28_688, 8_000, 675]);
		expect(pay.totalCents).toBe(37_363);
	});

	it('ignores a rate for an item the job does not have', () => {
		const pay = installPay(source, [{ ref: { type: 'prep', kind: 'level' }, payCents: 9_999 }]);
		expect(pay.totalCents).toBe(36_688);
	});

	it('rounds a third of a cent down and a half up', () => {
		const thirds: PaySource = {
			lines: [
				{
					id: 'a',
					ref: { type: 'prep', kind: 'level' },
					description: 'Level',
					basis: 'sqft',
					qty: 0.3333
				},
				{
					id: 'b',
					ref: { type: 'prep', kind: 'grind' },
					description: 'Grind',
					basis: 'sqft',
					qty: 0.5
				}
			],
			pay: []
		};
		const pay = installPay(thirds, [
			{ ref: { type: 'prep', kind: 'level' }, payCents: 1 },
			{ ref: { type: 'prep', kind: 'grind' }, payCents: 1 }
		]);
		// 0.3333 × 1 = 0.3333 → 0; 0.5 × 1 = 0.5 → 1
		expect(pay.lines.map((l) => l.amountCents)).toEqual([0, 1]);
	});
});

describe('statementTotal and totalsByKind', () => {
	it('adds install pay, extras, chargebacks and adjustments to the cent', () => {
		const lines = [
			{ kind: 'install', amountCents: 36_688 },
			{ kind: 'install', amountCents: 12_001 },
			{ kind: 'extra', amountCents: 5_500 },
			{ kind: 'chargeback', amountCents: -2_599 },
			{ kind: 'adjustment', amountCents: 1 }
		];
		// 36,688 + 12,001 + 5,500 − 2,599 + 1 = 51,591
		expect(statementTotal(lines)).toBe(51_591);
		expect(totalsByKind(lines)).toEqual({
			install: 48_689,
			extra: 5_500,
			chargeback: -2_599,
			adjustment: 1,
			total: 51_591
		});
	});

	it('is zero for no lines and refuses fractions of a cent', () => {
		expect(statementTotal([])).toBe(0);
		expect(() => statementTotal([{ amountCents: 0.5 }])).toThrow();
	});
});

describe('manualLineAmount', () => {
	it('stores a chargeback negative whatever sign was typed', () => {
		expect(manualLineAmount('chargeback', 2_500)).toEqual({ ok: true, amountCents: -2_500 });
		expect(manualLineAmount('chargeback', -2_500)).toEqual({ ok: true, amountCents: -2_500 });
	});

	it('keeps an adjustment’s sign and refuses zero or too much', () => {
		expect(manualLineAmount('adjustment', -700)).toEqual({ ok: true, amountCents: -700 });
		expect(manualLineAmount('adjustment', 700)).toEqual({ ok: true, amountCents: 700 });
		expect(manualLineAmount('adjustment', 0).ok).toBe(false);
		expect(manualLineAmount('chargeback', 100_000_001).ok).toBe(false);
	});
});
