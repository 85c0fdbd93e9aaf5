import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { createLogger, currentRequestId, safePath, withRequestId } from './log';

describe('safePath', () => {
	it('keeps plain parameters and masks the rest', () => {
		const url = new URL(
			'http://x/api/v1/customers?q=ada%40example.com&page=2&sort=name&phone=%2B1%20555%20201%207788'
		);
		expect(safePath(url)).toBe('/api/v1/customers?q=[redacted]&page=2&sort=name&phone=[redacted]');
	});

	it('masks link secrets and anything like an e-mail or a phone number in the path', () => {
		expect(safePath(new URL('http://x/c/eyJhbGciOi.sig'))).toBe('/c/[redacted]');
		expect(safePath(new URL('http://x/invite/abc123/accept'))).toBe('/invite/[redacted]/accept');
		expect(safePath(new URL('http://x/find/ada@example.com'))).toBe('/find/[redacted]');
		expect(safePath(new URL('http://x/call/555-201-7788'))).toBe('/call/[redacted]');
		expect(safePath(new URL('http://x/app/jobs/3f2a'))).toBe('/app/jobs/3f2a');
	});

	it('masks a plain parameter whose value is an e-mail address', () => {
		expect(safePath(new URL('http://x/a?status=ada@example.com'))).toBe('/a?status=[redacted]');
	});

	it('bounds the number of parameters it writes', () => {
		const url = new URL('http://x/a?' + Array.from({ length: 500 }, (_, i) => `p${i}=1`).join('&'));
		expect(safePath(url).split('&')).toHaveLength(20);
	});
});

describe('the request id', () => {
	it('is carried through async work and gone outside it', async () => {
		expect(currentRequestId()).toBeUndefined();
		await withRequestId('req-1', async () => {
			await new Promise((r) => setTimeout(r, 1));
			expect(currentRequestId()).toBe('req-1');
		});
		expect(currentRequestId()).toBeUndefined();
	});

	it('is on every line, and personal fields are redacted', () => {
		const lines: string[] = [];
		const sink = new Writable({
			write(chunk, _enc, done) {
				lines.push(String(chunk));
				done();
			}
		});
		// The same options as `log`, written to a sink the test reads.
		const probe = createLogger(sink, 'info');
		withRequestId('req-2', () =>
			probe.info({ customer: { email: 'ada@example.com', phone: '555' }, password: 'x' }, 'hi')
		);
		const line = JSON.parse(lines[0]);
		expect(line.requestId).toBe('req-2');
		expect(line.customer).toEqual({ email: '[redacted]', phone: '[redacted]' });
		expect(line.password).toBe('[redacted]');
	});
});
