import { describe, expect, it } from 'vitest';
import { readDecimal, readNumber, ungroupThousands } from './number';

const waste = { label: 'the waste', units: ['%'], min: 0, max: 100 };

describe('the number rule', () => {
	it('reads a point as the decimal mark and commas that group thousands in threes', () => {
		expect(readNumber('12', waste)).toEqual({ ok: true, value: 12 });
		expect(readNumber(' 12.5 % ', waste)).toEqual({ ok: true, value: 12.5 });
		expect(readNumber('.25', waste)).toEqual({ ok: true, value: 0.25 });
		expect(readNumber('12.', waste)).toEqual({ ok: true, value: 12 });
		expect(readNumber('1,500', { label: 'the area' })).toEqual({ ok: true, value: 1500 });
		expect(readNumber('12,345.5', { label: 'the area' })).toEqual({ ok: true, value: 12345.5 });
		expect(readNumber('1,000,000', { label: 'the area' })).toEqual({ ok: true, value: 1_000_000 });
	});

	it('refuses a comma that does not group thousands, saying to use a point', () => {
		for (const typed of [
			'0,5',
			'1,5',
			'12,34',
			'1,50,000',
			'1,5,0',
			'1,5000',
			',5',
			'1,',
			'0.1,500'
		]) {
			const r = readNumber(typed, { label: 'the area' });
			expect(r, typed).toMatchObject({
				ok: false,
				message: expect.stringContaining('use a point for decimals')
			});
		}
	});

	it('refuses what is not plainly a number, instead of guessing', () => {
		for (const typed of [
			'1e3',
			'1e308',
			'0x10',
			'Infinity',
			'NaN',
			'+5',
			'--1',
			'1.2.3',
			'lots',
			'٣',
			'１２'
		])
			expect(readNumber(typed, { label: 'the area' }), typed).toMatchObject({ ok: false });
		expect(readNumber('1 000', { label: 'the area' })).toEqual({
			ok: false,
			message: 'Cannot read "1 000": write the number without spaces (1500 or 1,500)'
		});
		expect(readNumber('1234567890123456', { label: 'the area', max: 1e20 })).toMatchObject({
			ok: false,
			message: expect.stringContaining('at most 15 digits')
		});
		expect(readNumber('lots', waste)).toEqual({
			ok: false,
			message: 'Cannot read "lots": type a number (and %)'
		});
	});

	it('says what is wrong with the field: empty, negative, out of range, not whole', () => {
		expect(readNumber('', waste)).toEqual({ ok: false, message: 'Enter the waste' });
		expect(readNumber('-3', waste)).toEqual({ ok: false, message: 'The waste cannot be negative' });
		expect(readNumber('120', waste)).toEqual({
			ok: false,
			message: 'The waste must be between 0 and 100'
		});
		expect(readNumber('2.5', { label: 'the count', integer: true })).toEqual({
			ok: false,
			message: 'The count must be a whole number'
		});
		expect(readNumber('3.0', { label: 'the count', integer: true })).toEqual({
			ok: true,
			value: 3
		});
		expect(readNumber('0', { label: 'the coverage', above: 0, max: 1000 })).toEqual({
			ok: false,
			message: 'The coverage must be more than 0 and at most 1,000'
		});
		expect(readNumber('2,000,000', { label: 'the area' })).toEqual({
			ok: false,
			message: 'The area must be between 0 and 1,000,000'
		});
	});

	it('refuses text longer than any number before a pattern reads it', () => {
		const long = `${' '.repeat(200_000)}x`;
		expect(readNumber(long, waste)).toEqual({
			ok: false,
			message: 'Cannot read this: keep it under 100 characters'
		});
		expect(readDecimal('1'.repeat(101))).toMatchObject({ ok: false });
	});

	it('lets a minus sign in only where the field goes below zero', () => {
		expect(readNumber('-90', { label: 'the turn', min: -179, max: 179 })).toEqual({
			ok: true,
			value: -90
		});
		expect(readNumber('−45.5', { label: 'the turn', min: -179, max: 179 })).toEqual({
			ok: true,
			value: -45.5
		});
		expect(readNumber('-0', waste)).toEqual({ ok: false, message: 'The waste cannot be negative' });
	});

	it('keeps the typed digits for exact conversions', () => {
		expect(readDecimal('0012.50')).toEqual({
			ok: true,
			value: { negative: false, whole: '12', fraction: '50', value: 12.5 }
		});
	});

	it('ungroups thousands inside longer text and refuses other commas there too', () => {
		expect(ungroupThousands('1,500 mm')).toEqual({ ok: true, value: '1500 mm' });
		expect(ungroupThousands('1,200\' 6 1/2"')).toEqual({ ok: true, value: '1200\' 6 1/2"' });
		expect(ungroupThousands('0,5 m')).toMatchObject({ ok: false });
		expect(ungroupThousands('3 m, 2 m')).toMatchObject({ ok: false });
	});
});
