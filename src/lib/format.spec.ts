import { describe, expect, it } from 'vitest';
import { formatMoney, formatQty, majorText } from './format';

describe('money for display', () => {
	it('shows cents as dollars, and respects zero-decimal currencies', () => {
		// Stripe: amounts are integers in the smallest unit; JPY has none (TRADE.md "Units and money", published).
		expect(formatMoney(123456, 'USD')).toBe('$1,234.56');
		expect(formatMoney(1500, 'JPY')).toBe('¥1,500');
		expect(formatMoney(-2500, 'USD')).toBe('-$25.00');
	});

	it('writes plain amounts for files in the currency’s own decimals', () => {
		expect(majorText(123456, 'USD')).toBe('1234.56');
		expect(majorText(1500, 'JPY')).toBe('1500');
		expect(majorText(-5, 'USD')).toBe('-0.05');
	});
});

describe('quantities', () => {
	it('name their unit, in the singular for one', () => {
		expect(formatQty(14, 'carton')).toBe('14 cartons');
		expect(formatQty(1, 'carton')).toBe('1 carton');
		expect(formatQty(126.456, 'sqft')).toBe('126.46 ft²');
	});
});
