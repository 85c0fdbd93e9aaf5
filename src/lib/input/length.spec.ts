import { describe, expect, it } from 'vitest';
import { readArea, readLength, readVolume } from './length';

describe('readLength', () => {
	it('reads feet and inches with fractions, and millimetres (1 in = 25.4 mm, published)', () => {
		expect(readLength(`12' 6 1/2"`, 'ft')).toEqual({ ok: true, value: 150.5 });
		expect(readLength('3810 mm')).toEqual({ ok: true, value: 150 });
		expect(readLength('1,270 mm')).toEqual({ ok: true, value: 50 });
		expect(readLength('12', 'ft')).toEqual({ ok: true, value: 144 });
	});

	it('follows the same comma rule as every number', () => {
		expect(readLength('0,5 m')).toMatchObject({ ok: false, message: /use a point for decimals/ });
		expect(readLength('12,5', 'ft')).toMatchObject({
			ok: false,
			message: /use a point for decimals/
		});
	});

	it('checks the bounds a field gives', () => {
		expect(readLength('0', 'in', { label: 'the roll width', positive: true })).toEqual({
			ok: false,
			message: 'The roll width must be more than 0'
		});
		expect(readLength('100 ft', 'in', { label: 'a board', maxIn: 240 })).toEqual({
			ok: false,
			message: 'A board must be at most 240 in'
		});
	});
});

describe('readArea', () => {
	it('reads ft² by default and other units exactly (1 ft² = 0.09290304 m², published)', () => {
		expect(readArea('120')).toEqual({ ok: true, value: 120 });
		expect(readArea('1,200 sq ft')).toEqual({ ok: true, value: 1200 });
		expect(readArea('120ft²')).toEqual({ ok: true, value: 120 });
		const m2 = readArea('1 m²');
		expect(m2.ok && m2.value).toBeCloseTo(1 / 0.09290304, 10);
		// 1 yd² = 9 ft² exactly (published)
		expect(readArea('2 yd2')).toEqual({ ok: true, value: 18 });
		const metric = readArea('10', 'sqm');
		expect(metric.ok && metric.value).toBeCloseTo(107.639, 3);
	});

	it('multiplies two sides typed as lengths', () => {
		expect(readArea(`12' x 10'`)).toEqual({ ok: true, value: 120 });
		expect(readArea(`12 by 10' 6"`)).toEqual({ ok: true, value: 126 });
		const m = readArea('3.6 m × 3 m');
		expect(m.ok && m.value).toBeCloseTo((3600 * 3000) / (304.8 * 304.8), 9);
	});

	it('names the unreadable part', () => {
		expect(readArea('')).toEqual({ ok: false, message: 'Enter an area' });
		expect(readArea('-4')).toEqual({ ok: false, message: 'An area cannot be negative' });
		expect(readArea('12 x 1/0')).toMatchObject({
			ok: false,
			message: expect.stringContaining('1/0')
		});
		expect(readArea('big')).toMatchObject({ ok: false, message: expect.stringContaining('big') });
		expect(readArea('2 x 3 x 4')).toMatchObject({ ok: false });
		expect(readArea('0,5 m²')).toMatchObject({ ok: false, message: /use a point for decimals/ });
		expect(readArea(`${' '.repeat(200_000)}x`)).toMatchObject({ ok: false, message: /under 100/ });
		expect(readLength(`${'1 '.repeat(100_000)}`)).toMatchObject({
			ok: false,
			message: /under 100/
		});
	});
});

describe('readVolume', () => {
	it('reads US gallons, quarts, litres and cubic units to in³ (1 US gal = 231 in³, published)', () => {
		expect(readVolume('1 gal')).toEqual({ ok: true, value: 231 });
		expect(readVolume('2 qt')).toEqual({ ok: true, value: 115.5 });
		expect(readVolume('1,728 cu in')).toEqual({ ok: true, value: 1728 });
		// 1 L = 1000 cm³ and 1 in = 2.54 cm exactly (published)
		const litre = readVolume('1 L');
		expect(litre.ok && litre.value).toBeCloseTo(1000 / 2.54 ** 3, 9);
	});

	it('asks for the unit and refuses what it cannot read', () => {
		expect(readVolume('3')).toEqual({
			ok: false,
			message: 'Add the unit: gal, qt, L, cu in or cu ft'
		});
		expect(readVolume('0 gal')).toEqual({ ok: false, message: 'A volume must be more than 0' });
		expect(readVolume('1,5 gal')).toMatchObject({ ok: false, message: /use a point/ });
		expect(readVolume('a pail')).toMatchObject({ ok: false });
	});
});
