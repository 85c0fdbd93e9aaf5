import { afterEach, describe, expect, it } from 'vitest';
import { fieldPath, formFields, own, readFields, setPath } from './fields';

/** Whatever a test might have written onto the shared prototypes. */
function pollution() {
	const probe = {} as Record<string, unknown>;
	return {
		polluted: probe.polluted,
		x: probe.x,
		toStringX: (Object.prototype.toString as unknown as Record<string, unknown>).x,
		arrayX: ([] as unknown as Record<string, unknown>).x
	};
}

afterEach(() => {
	expect(pollution()).toEqual({
		polluted: undefined,
		x: undefined,
		toStringX: undefined,
		arrayX: undefined
	});
});

describe('readFields', () => {
	it('reads dotted names into objects and lists, the last of a repeated name winning', () => {
		const r = readFields([
			['taxes.0.name', 'Sales tax'],
			['taxes.0.rate', '6.5'],
			['taxes.1.name', 'County'],
			['waste.straight', '7'],
			['units.system', 'metric'],
			['units.system', 'imperial'],
			['logo', new File([], 'logo.png')]
		]);
		expect(r).toEqual({
			ok: true,
			value: {
				taxes: [{ name: 'Sales tax', rate: '6.5' }, { name: 'County' }],
				waste: { straight: '7' },
				units: { system: 'imperial' }
			}
		});
	});

	it('refuses __proto__, prototype and constructor anywhere in a name, writing nothing', () => {
		for (const name of [
			'__proto__.polluted',
			'__proto__',
			'waste.__proto__.polluted',
			'constructor.prototype.polluted',
			'taxes.0.constructor.prototype.x',
			'prototype.x'
		]) {
			const r = readFields([[name, 'yes']]);
			expect(r, name).toEqual({
				ok: false,
				field: name,
				message: `The field name "${name}" is not allowed`
			});
		}
	});

	it('never follows an inherited property: toString.x makes a field, not a change to toString', () => {
		const r = readFields([['toString.x', '1']]);
		expect(r.ok && Object.hasOwn(r.value, 'toString')).toBe(true);
	});

	it('refuses lengths, huge indices, clashes and deep names instead of crashing or stalling', () => {
		expect(readFields([['taxes.length', '99999999']])).toMatchObject({ ok: true });
		expect(
			readFields([
				['taxes.0.name', 'a'],
				['taxes.length', '99999999']
			])
		).toMatchObject({
			ok: false,
			message: expect.stringContaining('mixes a list and named fields')
		});
		expect(readFields([['taxes.99999999.rate', '1']])).toMatchObject({
			ok: false,
			message: expect.stringContaining('list index over 999')
		});
		expect(readFields([['taxes.01.rate', '1']])).toMatchObject({ ok: false });
		expect(
			readFields([
				['a', '1'],
				['a.b', '2']
			])
		).toMatchObject({
			ok: false,
			message: 'The field name "a.b" is also a single field'
		});
		expect(
			readFields([
				['a.b', '2'],
				['a', '1']
			])
		).toMatchObject({
			ok: false,
			message: 'The field name "a" is also a group of fields'
		});
		expect(readFields([['a.b.c.d.e.f.g.h.i', '1']])).toMatchObject({
			ok: false,
			message: expect.stringContaining('nested too deeply')
		});
		expect(readFields([['a..b', '1']])).toMatchObject({ ok: false });
	});
});

describe('formFields and fieldPath', () => {
	it('keeps names flat and leaves out names no form has', () => {
		expect(
			formFields([
				['rooms.0.width', "12'"],
				['op', 'save'],
				['__proto__', 'x'],
				['constructor.prototype.polluted', 'x'],
				['logo', new File([], 'logo.png')]
			])
		).toEqual({ 'rooms.0.width': "12'", op: 'save' });
		expect(fieldPath('readings.3.spanIn')).toEqual({
			ok: true,
			value: ['readings', '3', 'spanIn']
		});
	});
});

describe('setPath and own', () => {
	it('writes nested input our own code names, and refuses a forbidden path', () => {
		const input: Record<string, unknown> = {};
		setPath(input, 'container.atDepthIn', 0.125);
		setPath(input, 'tileEdgesIn.1', 24);
		expect(input).toEqual({ container: { atDepthIn: 0.125 }, tileEdgesIn: [undefined, 24] });
		expect(() => setPath(input, '__proto__.polluted', 1)).toThrow(/not allowed/);
	});

	it('looks up only own properties', () => {
		const LABELS: Record<string, string> = { carpet: 'Carpet' };
		expect(own(LABELS, 'carpet')).toBe('Carpet');
		expect(own(LABELS, 'constructor')).toBeUndefined();
		expect(own(LABELS, '__proto__')).toBeUndefined();
		expect(own(LABELS, 'toString')).toBeUndefined();
	});
});
