import { describe, expect, it } from 'vitest';
import { changeOrderFigures } from './figures';

const engine = { subtotalCents: 19_900, taxCents: 416, payDeltaCents: 8_700 };

describe('a change order’s figures with adjustments', () => {
	it('are the engine’s when there are none', () => {
		const settings = { taxes: [], taxRounding: 'half_up' as const };
		expect(changeOrderFigures(engine, [], settings)).toEqual({
			subtotalCents: 19_900,
			taxCents: 416,
			totalCents: 20_316,
			payDeltaCents: 8_700
		});
	});

	it('tax an adjustment as prep, each tax rounded by the store’s rule', () => {
		// A store taxing prep at 8.25 % and materials at 6.5 %: a −$10.05 goodwill line is taxed
		// −8.25 % × $10.05 = −$0.829…, rounded half up (away from zero) to −$0.83; the 6.5 % tax
		// does not apply to prep. Subtotal $199.00 − $10.05 = $188.95; tax $4.16 − $0.83 = $3.33.
		const settings = {
			taxes: [
				{ name: 'Labour and prep', rateBps: 825, groups: ['prep' as const, 'labour' as const] },
				{ name: 'Materials', rateBps: 650, groups: ['material' as const] }
			],
			taxRounding: 'half_up' as const
		};
		const figures = changeOrderFigures(
			engine,
			[
				{ description: 'Goodwill', amountCents: -1_005, payCents: 0 },
				{ description: 'Extra trip for the sander', amountCents: 0, payCents: 2_500 }
			],
			settings
		);
		expect(figures).toEqual({
			subtotalCents: 18_895,
			taxCents: 333,
			totalCents: 19_228,
			payDeltaCents: 11_200
		});
		expect(figures.totalCents).toBe(figures.subtotalCents + figures.taxCents);
	});
});
