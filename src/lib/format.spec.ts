import { describe, expect, it } from 'vitest';
import {
	formatDate,
	formatDateTime,
	formatMoney,
	joinParts,
	formatQty,
	formatSaved,
	majorText,
	zoneName
} from './format';

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

describe("dates in the store's time zone", () => {
	// 03:30 UTC on 4 March 2027 is still the evening of 3 March in Chicago (UTC−6 in winter).
	const lateEvening = '2027-03-04T03:30:00Z';

	it("show the store's day, not the server's", () => {
		expect(formatDate(lateEvening, 'UTC')).toBe('Mar 4, 2027');
		expect(formatDate(lateEvening, 'America/Chicago')).toBe('Mar 3, 2027');
		expect(formatDate(lateEvening, 'America/Chicago', 'long')).toBe('March 3, 2027');
		expect(formatDate(lateEvening, 'Asia/Tokyo', 'long')).toBe('March 4, 2027');
	});

	it("show the store's time, across daylight saving", () => {
		expect(formatDateTime(lateEvening, 'America/Chicago')).toBe('Mar 3, 2027, 9:30 PM');
		expect(zoneName(lateEvening, 'America/Chicago')).toBe('CST');
		// After the change on 14 March 2027 Chicago is UTC−5.
		expect(formatDateTime('2027-03-20T03:30:00Z', 'America/Chicago')).toBe(
			'Mar 19, 2027, 10:30 PM'
		);
		expect(zoneName('2027-03-20T03:30:00Z', 'America/Chicago')).toBe('CDT');
	});

	it('give a save time of today without the day, and the day otherwise', () => {
		const now = new Date('2027-03-03T23:00:00Z'); // 5 PM on 3 March in Chicago, 3 March in UTC
		expect(formatSaved(lateEvening, 'America/Chicago', now)).toBe('9:30 PM');
		expect(formatSaved(lateEvening, 'UTC', now)).toBe('Mar 4, 3:30 AM');
	});
});

describe('joinParts', () => {
	it('leaves out empty parts, so no stray commas', () => {
		expect(joinParts('', '14 Ferrule Lane')).toBe('14 Ferrule Lane');
		expect(joinParts('Home', ' ', null, 'Ashcombe')).toBe('Home, Ashcombe');
		expect(joinParts()).toBe('');
	});
});
