import { describe, expect, it } from 'vitest';
import { centsToInput, formatCents, parseMoney, parsePercentBps } from './money';

describe('money as typed', () => {
	it('reads dollars into integer cents', () => {
		expect(['12.50', '$12.5', '1,250', '.5', '0', '  7 '].map((t) => parseMoney(t))).toEqual([
			{ ok: true, cents: 1250 },
			{ ok: true, cents: 1250 },
			{ ok: true, cents: 125_000 },
			{ ok: true, cents: 50 },
			{ ok: true, cents: 0 },
			{ ok: true, cents: 700 }
		]);
	});

	it('refuses empty, negative, sub-cent and unreadable amounts with a message', () => {
		expect(parseMoney('')).toEqual({ ok: false, message: 'Enter a price' });
		expect(parseMoney('-3')).toMatchObject({ ok: false, message: /negative/ });
		expect(parseMoney('1.005')).toMatchObject({ ok: false, message: /two decimals/ });
		expect(parseMoney('twelve')).toMatchObject({ ok: false, message: /Cannot read "twelve"/ });
		expect(parseMoney('2000000')).toMatchObject({ ok: false, message: /1,000,000/ });
	});

	it('writes cents back as a field shows them, and for display', () => {
		expect([centsToInput(1250), centsToInput(5), centsToInput(undefined)]).toEqual([
			'12.50',
			'0.05',
			''
		]);
		expect(formatCents(123_456)).toBe('$1,234.56');
	});

	it('reads a percentage into basis points', () => {
		expect(parsePercentBps('6.5')).toEqual({ ok: true, bps: 650 });
		expect(parsePercentBps('8.25 %')).toEqual({ ok: true, bps: 825 });
		expect(parsePercentBps('101')).toMatchObject({ ok: false });
		expect(parsePercentBps('8.255')).toMatchObject({ ok: false });
	});
});
