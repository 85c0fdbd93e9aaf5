import { describe, expect, it } from 'vitest';
import { changeOrder, soldQuantities } from './change-order';
import { estimate } from './estimate';
import { samplePriceBook, sampleJob } from './sample';
import { defaultSettings, type StoreSettings } from './settings';

const settings: StoreSettings = {
	...defaultSettings,
	taxes: [{ name: 'Sales tax', rateBps: 825, groups: ['material', 'prep'] }]
};

describe('changeOrder', () => {
	it('prices found − sold line by line, with credits where less was found', () => {
		const co = changeOrder({
			sold: [
				{ roomId: 'r1', ref: { type: 'prep', kind: 'hole_repair' }, qty: 1 },
				{ roomId: 'r1', ref: { type: 'prep', kind: 'seam_patch' }, qty: 12 },
				{ roomId: 'r2', ref: { type: 'prep', kind: 'dent_patch' }, qty: 2 }
			],
			found: [
				{ roomId: 'r1', ref: { type: 'prep', kind: 'hole_repair' }, qty: 3 },
				{ roomId: 'r1', ref: { type: 'prep', kind: 'seam_patch' }, qty: 12 },
				{ roomId: 'r2', ref: { type: 'prep', kind: 'dent_patch' }, qty: 1 }
			],
			priceBook: samplePriceBook,
			settings
		});
		expect(co.ok).toBe(true);
		// holes: +2 × 8,500¢ = 17,000¢; dents: −1 × 1,200¢ = −1,200¢; seams unchanged, left out
		expect(co.lines.map((l) => [l.key, l.deltaQty, l.deltaCents])).toEqual([
			['prep:hole_repair', 2, 17_000],
			['prep:dent_patch', -1, -1_200]
		]);
		expect(co.subtotalCents).toBe(15_800);
		// tax: 8.25 % of found prep (25,500 + 1,800 + 1,200 = 28,500 → 2,351) − sold (8,500 + 1,800
		// + 2,400 = 12,700 → 1,048) = 1,303
		expect(co.taxCents).toBe(1_303);
		// pay: +2 × 5,000 − 700 = 9,300
		expect(co.payDeltaCents).toBe(9_300);
	});

	it('adds items found that were never sold and reports unknown ones', () => {
		const co = changeOrder({
			sold: [],
			found: [
				{ roomId: 'r1', ref: { type: 'prep', kind: 'grind' }, qty: 1 },
				{ roomId: 'r1', ref: { type: 'floor', productId: 'gone' }, qty: 1 }
			],
			priceBook: samplePriceBook,
			settings
		});
		expect(co.lines[0]).toMatchObject({ soldQty: 0, foundQty: 1, deltaCents: 4_500 });
		expect(co.ok).toBe(false);
		expect(co.errors[0].message).toContain('gone');
	});

	it('sold + delta equals a quote of what was found', () => {
		const sold = estimate({ job: sampleJob(6), settings, priceBook: samplePriceBook });
		const foundJob = sampleJob(6);
		foundJob.rooms[1].repairs!.holes!.push({ widthIn: 8, lengthIn: 8 });
		foundJob.rooms[0].repairs = {};
		const found = estimate({ job: foundJob, settings, priceBook: samplePriceBook });
		const co = changeOrder({
			sold: soldQuantities(sold),
			found: soldQuantities(found),
			priceBook: samplePriceBook,
			settings
		});
		expect(sold.totals.subtotalCents + co.subtotalCents).toBe(found.totals.subtotalCents);
		expect(sold.totals.taxCents + co.taxCents).toBe(found.totals.taxCents);
		expect(co.lines.find((l) => l.key === 'prep:fastener_removal')?.deltaCents).toBeLessThan(0);
		expect(co.lines.find((l) => l.key === 'prep:hole_repair')?.deltaQty).toBe(1);
	});
});
