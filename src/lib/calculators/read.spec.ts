import { describe, expect, it } from 'vitest';
import { parseArea, parseNumber } from './read';

describe('parseNumber', () => {
	const waste = { label: 'the waste', units: ['%'], min: 0, max: 100 };

	it('reads plain numbers, thousands, decimal commas and the unit', () => {
		expect(parseNumber('12', waste)).toEqual({ ok: true, value: 12 });
		expect(parseNumber(' 12.5 % ', waste)).toEqual({ ok: true, value: 12.5 });
		expect(parseNumber('0,5', waste)).toEqual({ ok: true, value: 0.5 });
		expect(parseNumber('1,500', { label: 'the area' })).toEqual({ ok: true, value: 1500 });
		expect(parseNumber('.25', waste)).toEqual({ ok: true, value: 0.25 });
	});

	it('says what is wrong instead of guessing', () => {
		expect(parseNumber('', waste)).toEqual({ ok: false, message: 'Enter the waste' });
		expect(parseNumber('-3', waste)).toEqual({
			ok: false,
			message: 'The waste cannot be negative'
		});
		expect(parseNumber('lots', waste)).toMatchObject({ ok: false });
		expect(parseNumber('1,5,0', waste)).toMatchObject({ ok: false });
		expect(parseNumber('120', waste)).toEqual({
			ok: false,
			message: 'The waste must be between 0 and 100'
		});
		expect(parseNumber('2.5', { label: 'the count', integer: true })).toEqual({
			ok: false,
			message: 'The count must be a whole number'
		});
	});
});

describe('parseArea', () => {
	it('reads ft² by default and other units exactly (1 ft² = 0.09290304 m², published)', () => {
		expect(parseArea('120')).toEqual({ ok: true, value: 120 });
		expect(parseArea('120 sq ft')).toEqual({ ok: true, value: 120 });
		expect(parseArea('120ft²')).toEqual({ ok: true, value: 120 });
		const m2 = parseArea('1 m²');
		expect(m2.ok && m2.value).toBeCloseTo(1 / 0.09290304, 10);
		// 1 yd² = 9 ft² exactly
		expect(parseArea('2 yd2')).toEqual({ ok: true, value: 18 });
		const metric = parseArea('10', 'sqm');
		expect(metric.ok && metric.value).toBeCloseTo(107.639, 3);
	});

	it('multiplies two sides typed as lengths', () => {
		expect(parseArea(`12' x 10'`)).toEqual({ ok: true, value: 120 });
		expect(parseArea(`12 by 10' 6"`)).toEqual({ ok: true, value: 126 });
		const m = parseArea('3.6 m × 3 m');
		expect(m.ok && m.value).toBeCloseTo((3600 * 3000) / (304.8 * 304.8), 9);
	});

	it('names the unreadable part', () => {
		expect(parseArea('')).toEqual({ ok: false, message: 'Enter an area' });
		expect(parseArea('-4')).toEqual({ ok: false, message: 'An area cannot be negative' });
		expect(parseArea('12 x 1/0')).toMatchObject({
			ok: false,
			message: expect.stringContaining('1/0')
		});
		expect(parseArea('big')).toMatchObject({ ok: false, message: expect.stringContaining('big') });
		expect(parseArea('2 x 3 x 4')).toMatchObject({ ok: false });
	});
});
