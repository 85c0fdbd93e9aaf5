import { describe, expect, it } from 'vitest';
import { safeRedirect } from './redirect';

const ORIGIN = 'http://127.0.0.1:4173';

describe('safeRedirect', () => {
	it('keeps same-origin paths with their query and hash', () => {
		expect(safeRedirect('/app/jobs?status=sold#top', '/app', ORIGIN)).toBe(
			'/app/jobs?status=sold#top'
		);
		expect(safeRedirect('/invite/abc', '/app', ORIGIN)).toBe('/invite/abc');
		expect(safeRedirect(`${ORIGIN}/field`, '/app', ORIGIN)).toBe('/field');
	});

	it('sends anything that could leave the site home', () => {
		for (const target of [
			'//evil.example',
			'///evil.example',
			'/\\evil.example',
			'\\\\evil.example',
			'/\t/evil.example', // what `redirectTo=/%09/evil.example` decodes to
			'/\n/evil.example',
			'/\r/evil.example',
			'/\u0000/x',
			'/app\u007f',
			'https://evil.example/app',
			'http://127.0.0.1:4174/app',
			'javascript:alert(1)',
			'data:text/html,x',
			'evil.example',
			'app',
			'?x=1',
			'',
			'/' + 'a'.repeat(2001)
		]) {
			expect(safeRedirect(target, '/home', ORIGIN), JSON.stringify(target)).toBe('/home');
		}
		expect(safeRedirect(null, '/stores', ORIGIN)).toBe('/stores');
		expect(safeRedirect(undefined)).toBe('/app');
	});

	it('keeps an encoded slash as part of one path, never a host', () => {
		expect(safeRedirect('/%2F%2Fevil.example', '/home', ORIGIN)).toBe('/%2F%2Fevil.example');
		expect(safeRedirect('/%09/evil.example', '/home', ORIGIN)).toBe('/%09/evil.example');
	});
});
