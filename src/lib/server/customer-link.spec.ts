import { describe, expect, it } from 'vitest';
import { signLink, verifyLink } from './customer-link';

const secret = 'a-test-secret-of-enough-length-123456';
const later = new Date(Date.now() + 86_400_000);

describe('customer links', () => {
	it('carry the store and job they were made for, until they expire', () => {
		const token = signLink({ storeId: 's1', jobId: 'j1', expiresAt: later }, secret);
		expect(verifyLink(token, secret)).toMatchObject({ ok: true, storeId: 's1', jobId: 'j1' });
		expect(verifyLink(token, secret, new Date(later.getTime() + 1000))).toEqual({
			ok: false,
			reason: 'expired'
		});
	});

	it('refuse a changed payload, another key, and junk', () => {
		const token = signLink({ storeId: 's1', jobId: 'j1', expiresAt: later }, secret);
		const [, signature] = token.split('.');
		const otherJob = Buffer.from(JSON.stringify({ s: 's1', j: 'j2', e: 4102444800 })).toString(
			'base64url'
		);
		expect(verifyLink(`${otherJob}.${signature}`, secret)).toEqual({ ok: false, reason: 'forged' });
		expect(verifyLink(token, 'another-secret-of-enough-length-000000')).toEqual({
			ok: false,
			reason: 'forged'
		});
		expect(verifyLink('not-a-token', secret)).toEqual({ ok: false, reason: 'malformed' });
		expect(verifyLink('a.b.c', secret)).toEqual({ ok: false, reason: 'malformed' });
	});

	it('carry the job’s link version (1 unless given)', () => {
		const v3 = signLink({ storeId: 's1', jobId: 'j1', expiresAt: later, version: 3 }, secret);
		expect(verifyLink(v3, secret)).toMatchObject({ ok: true, version: 3 });
		const signed = signLink({ storeId: 's1', jobId: 'j1', expiresAt: later }, secret);
		expect(verifyLink(signed, secret)).toMatchObject({ ok: true, version: 1 });
	});
});
