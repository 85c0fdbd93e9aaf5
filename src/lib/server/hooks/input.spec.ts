import { describe, expect, it } from 'vitest';
import {
	badParam,
	hasControl,
	INPUT_LIMITS,
	problemInForm,
	problemInJson,
	problemInUrl
} from './input';

describe('hasControl', () => {
	it('finds NUL, escape, DEL and C1 controls; tab, CR and LF only when breaks are refused', () => {
		for (const c of ['\u0000', '\u0007', '\u001b', '\u007f', '\u0085', '\u009f']) {
			expect(hasControl(`a${c}b`, true), JSON.stringify(c)).toBe(true);
		}
		for (const c of ['\t', '\r', '\n']) {
			expect(hasControl(`a${c}b`, true)).toBe(false);
			expect(hasControl(`a${c}b`)).toBe(true);
		}
		expect(hasControl('Café Ünïcode — 5/8 in ½', true)).toBe(false);
	});
});

describe('problemInUrl', () => {
	it('names the query parameter', () => {
		expect(problemInUrl(new URL('http://x/a?q=a%00b'))).toMatchObject({ path: 'q' });
		expect(problemInUrl(new URL('http://x/a?q=a%09b'))).toMatchObject({ path: 'q' });
		expect(problemInUrl(new URL('http://x/a?q=fine&page=2'))).toBeNull();
	});

	it('refuses controls and broken escapes in the path', () => {
		expect(problemInUrl(new URL('http://x/app/jobs/%00'))).not.toBeNull();
		expect(problemInUrl(new URL('http://x/app/%E0%A4%A'))).not.toBeNull();
		expect(problemInUrl(new URL('http://x/app/jobs/%C3%A9'))).toBeNull();
	});

	it('bounds the number of parameters', () => {
		const many = Array.from({ length: INPUT_LIMITS.queryParams + 1 }, (_, i) => `p${i}=1`);
		expect(problemInUrl(new URL(`http://x/a?${many.join('&')}`))).not.toBeNull();
	});
});

describe('problemInForm', () => {
	it('allows line breaks in values, never controls in names', () => {
		const form = new FormData();
		form.set('notes', 'Side door\r\n\tback gate');
		expect(problemInForm(form)).toBeNull();
		form.set('name', 'Ada\u0000');
		expect(problemInForm(form)).toMatchObject({ path: 'name' });
		const named = new FormData();
		named.set('na\nme', 'Ada');
		expect(problemInForm(named)).toMatchObject({ path: '(form)' });
	});

	it('checks file names', () => {
		const form = new FormData();
		form.set('logo', new File(['x'], 'logo\u0000.png'));
		expect(problemInForm(form)).toMatchObject({ path: 'logo' });
	});
});

describe('problemInJson', () => {
	it('names the path of the bad value or key', () => {
		expect(problemInJson({ rooms: [{ name: 'ok' }, { name: 'x\u0000' }] })).toMatchObject({
			path: 'rooms.1.name'
		});
		expect(problemInJson({ a: { ['b\u0001']: 1 } })).toMatchObject({ path: 'a' });
		expect(problemInJson({ note: 'line one\nline two', n: 5, ok: true, none: null })).toBeNull();
	});

	it('is bounded in depth and size', () => {
		let deep: unknown = 'x';
		for (let i = 0; i < INPUT_LIMITS.jsonDepth + 2; i++) deep = [deep];
		expect(problemInJson(deep)?.message).toMatch(/nested too deeply/);
		const wide = Array.from({ length: INPUT_LIMITS.jsonNodes + 1 }, () => 1);
		expect(problemInJson(wide)?.message).toMatch(/too many values/);
	});
});

describe('badParam', () => {
	it('refuses object internals and ill-shaped ids, keeps ours', () => {
		for (const value of [
			'__proto__',
			'constructor',
			'prototype',
			'<script>',
			'a b',
			'',
			'x'.repeat(513)
		]) {
			expect(badParam({ id: value }), value).toBe(true);
		}
		for (const value of [
			crypto.randomUUID(),
			'urwEonCBm0nfdcVnle8TVFI4wtXeQk0a',
			'cs_test_a1B2',
			'eyJwYXlsb2FkIjoxfQ.c2lnbmF0dXJl',
			'3'
		]) {
			expect(badParam({ id: value }), value).toBe(false);
		}
		expect(badParam({})).toBe(false);
	});
});
