import { describe, expect, it } from 'vitest';
import { canonical, parseParams, Reader } from './form';
import { formatAmount, isZeroDecimal, processingFee } from './money';

describe('parseParams', () => {
	it('reads the SDK’s nested form keys into objects and arrays', () => {
		const params = parseParams(
			new URLSearchParams(
				'mode=payment&line_items[0][price_data][currency]=usd&line_items[0][quantity]=2&line_items[1][quantity]=1&metadata[job]=J-1&expand[0]=a&expand[1]=b'
			)
		);
		expect(params).toEqual({
			mode: 'payment',
			line_items: [{ price_data: { currency: 'usd' }, quantity: '2' }, { quantity: '1' }],
			metadata: { job: 'J-1' },
			expand: ['a', 'b']
		});
	});

	it('compares parameters regardless of key order', () => {
		const a = parseParams(new URLSearchParams('a=1&b[c]=2&b[d]=3'));
		const b = parseParams(new URLSearchParams('b[d]=3&a=1&b[c]=2'));
		expect(canonical(a)).toBe(canonical(b));
		expect(canonical(a)).not.toBe(canonical(parseParams(new URLSearchParams('a=2&b[c]=2&b[d]=3'))));
	});

	it('refuses non-integers and names nested parameters in full', () => {
		const reader = new Reader(parseParams(new URLSearchParams('items[0][amount]=12.5')));
		const item = reader.array('items')[0];
		expect(() => item.integer('amount')).toThrow('Invalid integer: 12.5');
		expect(item.name('amount')).toBe('items[0][amount]');
	});

	it('keeps metadata within Stripe’s limits', () => {
		const long = new Reader(parseParams(new URLSearchParams(`metadata[k]=${'x'.repeat(501)}`)));
		expect(() => long.metadata()).toThrow(/up to 500 characters/);
		const cleared = new Reader(parseParams(new URLSearchParams('metadata[a]=')));
		expect(cleared.metadata('metadata', { a: '1', b: '2' })).toEqual({ b: '2' });
	});
});

describe('money', () => {
	it('applies the fake’s fee rule: 2.9% rounded half up, plus 30 of the smallest unit', () => {
		expect(processingFee(10_000)).toBe(320);
		expect(processingFee(1_500)).toBe(74); // 43.5 → 44
		expect(processingFee(1_482)).toBe(73); // 42.978 → 43
		expect(processingFee(50)).toBe(31); // 1.45 → 1
	});

	it('writes amounts in their currency’s own units', () => {
		expect(isZeroDecimal('JPY')).toBe(true);
		expect(isZeroDecimal('usd')).toBe(false);
		expect(formatAmount(123_456, 'usd')).toBe('$1,234.56');
		expect(formatAmount(123_456, 'jpy')).toBe('¥123,456');
	});
});

describe('parseParams and keys that reach a prototype', () => {
	it('refuses __proto__, prototype and constructor segments and leaves Object.prototype alone', () => {
		for (const query of [
			'metadata[__proto__][polluted]=yes',
			'__proto__[polluted]=yes',
			'a[constructor][prototype][polluted]=yes',
			'a[b][c][d][e][f][g][h][i]=deep'
		]) {
			expect(() => parseParams(new URLSearchParams(query)), query).toThrow(
				/Invalid parameter name/
			);
		}
		expect(({} as Record<string, unknown>).polluted).toBeUndefined();
	});

	it('follows only own properties: toString[x] is a parameter, not a change to toString', () => {
		const params = parseParams(new URLSearchParams('toString[x]=1'));
		expect(params).toEqual({ toString: { x: '1' } });
		expect((Object.prototype.toString as unknown as Record<string, unknown>).x).toBeUndefined();
	});
});
