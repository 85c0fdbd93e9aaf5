import { describe, expect, it } from 'vitest';
import { formatMoney } from '$lib/format';
import {
	bpsToInput,
	currencySymbol,
	moneyExample,
	moneyToInput,
	readMoney,
	readPercentBps
} from './money';

const price = { label: 'the price' };

describe('money as typed', () => {
	it('reads dollars into integer cents', () => {
		expect(
			['12.50', '$12.5', '1,250', '.5', '0', '  7 ', '$ 1,250.00', '12.50 USD', '12.500'].map((t) =>
				readMoney(t, 'USD', price)
			)
		).toEqual(
			[1250, 1250, 125_000, 50, 0, 700, 125_000, 1250, 1250].map((value) => ({ ok: true, value }))
		);
	});

	it('reads a zero-decimal currency in whole units: ¥1,500 is 1500 (Stripe, published)', () => {
		expect(readMoney('1500', 'JPY', price)).toEqual({ ok: true, value: 1500 });
		expect(readMoney('¥1,500', 'JPY', price)).toEqual({ ok: true, value: 1500 });
		expect(readMoney('1500.00', 'JPY', price)).toEqual({ ok: true, value: 1500 });
		expect(readMoney('12.50', 'JPY', price)).toEqual({
			ok: false,
			message: 'JPY has no decimals: type a whole amount, e.g. 1250'
		});
		expect(readMoney('', 'JPY', price)).toEqual({
			ok: false,
			message: 'Enter the price, e.g. 1250'
		});
	});

	it('reads three-decimal currencies to their smallest unit (1 KWD = 1000 fils, ISO 4217, published)', () => {
		expect(readMoney('1.250', 'KWD', price)).toEqual({ ok: true, value: 1250 });
		expect(readMoney('1.2505', 'KWD', price)).toMatchObject({
			ok: false,
			message: /three decimals/
		});
	});

	it('refuses empty, negative, sub-cent, ambiguous and unreadable amounts with a message', () => {
		expect(readMoney('', 'USD', price)).toEqual({
			ok: false,
			message: 'Enter the price, e.g. 12.50'
		});
		expect(readMoney('-3', 'USD', price)).toEqual({
			ok: false,
			message: 'The price cannot be negative'
		});
		expect(readMoney('1.005', 'USD', price)).toMatchObject({ ok: false, message: /two decimals/ });
		expect(readMoney('twelve', 'USD', price)).toMatchObject({
			ok: false,
			message: /Cannot read "twelve"/
		});
		expect(readMoney('12,50', 'USD', price)).toMatchObject({
			ok: false,
			message: /use a point for decimals/
		});
		expect(readMoney('2000000', 'USD', price)).toEqual({
			ok: false,
			message: 'Keep the price at most $1,000,000.00'
		});
		expect(readMoney('1e5', 'USD', price)).toMatchObject({ ok: false });
		expect(readMoney('0.25', 'USD', { label: 'the amount', min: 50 })).toEqual({
			ok: false,
			message: 'The amount must be at least $0.50'
		});
	});

	it('writes amounts back as a field shows them, and reads them again unchanged', () => {
		expect(moneyToInput(1250, 'USD')).toBe('12.50');
		expect(moneyToInput(5, 'USD')).toBe('0.05');
		expect(moneyToInput(-5, 'USD')).toBe('-0.05');
		expect(moneyToInput(undefined, 'USD')).toBe('');
		expect(moneyToInput(1500, 'JPY')).toBe('1500');
		expect(moneyToInput(1250, 'KWD')).toBe('1.250');
		for (const [minor, currency] of [
			[0, 'USD'],
			[99_999_999, 'USD'],
			[7, 'JPY'],
			[123_456, 'EUR']
		] as const)
			expect(readMoney(moneyToInput(minor, currency), currency, price)).toEqual({
				ok: true,
				value: minor
			});
	});

	it('names the symbol and a typical amount for labels and messages', () => {
		expect(currencySymbol('USD')).toBe('$');
		expect(currencySymbol('JPY')).toBe('¥');
		expect(currencySymbol('EUR')).toBe('€');
		expect(moneyExample('USD')).toBe('12.50');
		expect(moneyExample('JPY')).toBe('1250');
		// What the field reads is what the page shows (Intl's own minor digits).
		expect(formatMoney(readMoney('1,250', 'JPY', price).ok ? 1250 : 0, 'JPY')).toBe('¥1,250');
	});
});

describe('percentages as typed', () => {
	it('reads a percentage into basis points', () => {
		expect(readPercentBps('6.5')).toEqual({ ok: true, value: 650 });
		expect(readPercentBps('8.25 %')).toEqual({ ok: true, value: 825 });
		expect(readPercentBps('100')).toEqual({ ok: true, value: 10_000 });
		expect(readPercentBps('101')).toMatchObject({ ok: false });
		expect(readPercentBps('8.255')).toMatchObject({ ok: false });
		expect(readPercentBps('6,5')).toMatchObject({ ok: false, message: /use a point/ });
		expect(readPercentBps('', 'the rate')).toEqual({
			ok: false,
			message: 'Enter the rate, e.g. 6.5'
		});
		expect(bpsToInput(825)).toBe('8.25');
	});
});
