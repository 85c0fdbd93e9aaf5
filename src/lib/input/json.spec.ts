import { describe, expect, it } from 'vitest';
import { readJsonText } from './json';

describe('readJsonText', () => {
	it('reads ordinary JSON as JSON.parse does', () => {
		expect(readJsonText('{"name":"Alder Floors","rooms":[{"w":1}],"n":null}')).toEqual({
			ok: true,
			value: { name: 'Alder Floors', rooms: [{ w: 1 }], n: null }
		});
		expect(readJsonText('3')).toEqual({ ok: true, value: 3 });
	});

	it('refuses prototype keys at any depth, naming where', () => {
		expect(readJsonText('{"__proto__":{"polluted":1}}')).toEqual({
			ok: false,
			message: 'The key "__proto__" is not allowed',
			path: '__proto__'
		});
		expect(readJsonText('{"data":[{"constructor":{"prototype":{"x":1}}}]}')).toMatchObject({
			ok: false,
			path: 'data.0.constructor'
		});
		expect(readJsonText('{"a":{"prototype":1}}')).toMatchObject({ ok: false, path: 'a.prototype' });
		expect(({} as Record<string, unknown>).polluted).toBeUndefined();
	});

	it('refuses text that is not JSON, and documents nested past any of ours', () => {
		expect(readJsonText('{rooms')).toEqual({ ok: false, message: 'The body is not valid JSON' });
		expect(readJsonText('['.repeat(40) + ']'.repeat(40))).toMatchObject({
			ok: false,
			message: expect.stringContaining('nested more than 32 levels')
		});
		expect(readJsonText('['.repeat(20) + ']'.repeat(20))).toMatchObject({ ok: true });
	});
});
