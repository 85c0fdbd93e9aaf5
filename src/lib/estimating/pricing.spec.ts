import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	depositCents,
	divRound,
	extend,
	margin,
	PriceIndex,
	priceQty,
	refKey,
	taxes,
	totals,
	type PriceLine
} from './pricing';
import { samplePriceBook } from './sample';
import { defaultSettings, type StoreSettings } from './settings';

const settings: StoreSettings = {
	...defaultSettings,
	taxes: [{ name: 'Sales tax', rateBps: 825, groups: ['material'] }],
	deposit: { percentBps: 3000, minimumCents: 25_000 }
};

const line = (group: PriceLine['group'], amountCents: number): PriceLine => ({
	id: `x:${group}:${amountCents}`,
	ref: { type: 'prep', kind: 'grind' },
	key: 'prep:grind',
	group,
	description: '',
	basis: 'each',
	qty: 1,
	unitCents: amountCents,
	amountCents,
	taxable: group === 'material',
	findingIds: []
});

describe('rounding (the one rule, written in pricing.ts)', () => {
	it('rounds half up on the magnitude, so credits mirror charges', () => {
		expect(divRound(5, 10)).toBe(1);
		expect(divRound(4, 10)).toBe(0);
		expect(divRound(-5, 10)).toBe(-1);
		expect(divRound(15, 10, 'half_even')).toBe(2);
		expect(divRound(25, 10, 'half_even')).toBe(2);
		expect(divRound(21, 10, 'up')).toBe(3);
		expect(divRound(29, 10, 'down')).toBe(2);
	});

	it('extends qty × unit cents with qty kept to 1/10,000', () => {
		// 123.45 ft² × 399¢ = 49,256.55¢ → 49,257¢ (half up, not float-truncated)
		expect(extend(123.45, 399)).toBe(49_257);
		// 2.675 × 100 is 267.49999… in binary floats; the rule still gives 268
		expect(extend(2.675, 100)).toBe(268);
		expect(extend(-2.675, 100)).toBe(-268);
	});

	it('is exact and symmetric on generated amounts', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 0, max: 10_000_000 }),
				fc.integer({ min: 0, max: 500_000 }),
				(q, c) => {
					const qty = q / 10_000;
					expect(Number.isInteger(extend(qty, c))).toBe(true);
					expect(extend(-qty, c) + extend(qty, c)).toBe(0);
					expect(Math.abs(extend(qty, c) - qty * c)).toBeLessThanOrEqual(0.5 + 1e-6);
				}
			)
		);
	});
});

describe('taxes, totals and deposit', () => {
	it('taxes the taxable groups once, rounded half up', () => {
		// material 10,001¢ × 8.25 % = 825.08¢ → 825¢; labour untaxed
		const t = totals(
			[line('material', 6_001), line('material', 4_000), line('labour', 5_000)],
			settings
		);
		expect(t.byGroup).toEqual({ material: 10_001, labour: 5_000, prep: 0, removal: 0 });
		expect(t.taxes).toEqual([
			{ name: 'Sales tax', rateBps: 825, taxableCents: 10_001, taxCents: 825 }
		]);
		expect(t.totalCents).toBe(15_826);
		// 30 % of 15,826 = 4,747.8 → 4,748 but the minimum is 25,000 and never above the total
		expect(t.depositCents).toBe(15_826);
		expect(t.balanceCents).toBe(0);
	});

	it('applies several taxes, each on its own groups', () => {
		const byGroup = { material: 10_000, labour: 20_000, prep: 3_000, removal: 0 };
		const t = taxes(byGroup, {
			taxes: [
				{ name: 'State', rateBps: 600, groups: ['material'] },
				{ name: 'County', rateBps: 150, groups: ['material', 'labour', 'prep'] }
			],
			taxRounding: 'half_up'
		});
		expect(t.map((x) => x.taxCents)).toEqual([600, 495]);
	});

	it('takes the deposit as a percent with a minimum, never above the total', () => {
		const d = { percentBps: 3000, minimumCents: 25_000 };
		expect(depositCents(1_000_000, d)).toBe(300_000);
		expect(depositCents(50_000, d)).toBe(25_000);
		expect(depositCents(20_000, d)).toBe(20_000);
		expect(depositCents(0, d)).toBe(0);
		// 30 % of 100,001 = 30,000.3 → 30,000
		expect(depositCents(100_001, d)).toBe(30_000);
	});
});

describe('price lookups', () => {
	const index = new PriceIndex(samplePriceBook);

	it('resolves every kind of item and names what is missing', () => {
		expect(index.resolve({ type: 'floor', productId: 'oak-7' })).toMatchObject({
			group: 'material',
			basis: 'carton',
			unitCents: 10_250
		});
		expect(index.resolve({ type: 'install', productId: 'oak-7' })).toMatchObject({
			group: 'labour',
			unitCents: 350,
			payCents: 225
		});
		expect(index.resolve({ type: 'removal', existing: 'carpet' })).toMatchObject({
			group: 'removal'
		});
		expect(index.resolve({ type: 'supply', kind: 'leveller' })).toMatchObject({ basis: 'bag' });
		expect(index.resolve({ type: 'floor', productId: 'nope' })).toBe(
			'No floor product "nope" in the price book'
		);
		expect(
			new PriceIndex({ ...samplePriceBook, prep: [] }).resolve({ type: 'prep', kind: 'level' })
		).toBe('No price for prep "level"');
		expect(refKey({ type: 'removal', existing: 'sheet_vinyl' })).toBe('removal:sheet_vinyl');
	});

	it('keeps installer pay apart from the price and computes the margin', () => {
		const price = index.resolve({ type: 'install', productId: 'oak-7' });
		if (typeof price === 'string') throw new Error(price);
		const p = priceQty(
			{ ref: { type: 'install', productId: 'oak-7' }, roomId: 'r1', qty: 120.5 },
			price,
			settings
		);
		// 120.5 ft² × 350¢ = 42,175¢; pay 120.5 × 225¢ = 27,112.5 → 27,113¢
		expect(p.line.amountCents).toBe(42_175);
		expect(p.line.taxable).toBe(false);
		expect(p.pay?.amountCents).toBe(27_113);
		expect(p.line).not.toHaveProperty('payCents');
		const m = margin(42_175, 27_113, 0, true);
		expect(m.marginCents).toBe(15_062);
		// 15,062 ÷ 42,175 = 35.71 % → 3571 bps
		expect(m.marginBps).toBe(3571);
	});
});
