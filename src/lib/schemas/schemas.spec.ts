import { describe, expect, it } from 'vitest';
import { safeRedirect, signUpSchema } from './auth';
import { customerPatchSchema, customerSchema } from './customer';
import { inviteSchema } from './store';

/** The first message per field: the one the form shows. */
function messages(r: { error?: { issues: { path: PropertyKey[]; message: string }[] } }) {
	const first: Record<string, string> = {};
	for (const i of r.error?.issues ?? []) first[i.path.join('.')] ??= i.message;
	return first;
}

describe('sign-up', () => {
	it('refuses a bad e-mail and a weak password with words for the field', () => {
		const r = signUpSchema.safeParse({ name: 'Ada', email: 'not-an-email', password: 'short' });
		expect(r.success).toBe(false);
		expect(messages(r)).toEqual({
			email: 'Enter an e-mail address like name@example.com',
			password: 'Use at least 10 characters'
		});
	});

	it('asks for a digit and a letter', () => {
		expect(
			messages(signUpSchema.safeParse({ name: 'A', email: 'a@b.co', password: 'abcdefghijk' }))
				.password
		).toBe('Add at least one digit');
		expect(
			messages(signUpSchema.safeParse({ name: 'A', email: 'a@b.co', password: '12345678901' }))
				.password
		).toBe('Add at least one letter');
	});

	it('normalises the e-mail', () => {
		const r = signUpSchema.parse({
			name: ' Ada ',
			email: ' Ada@Example.COM ',
			password: 'abcdefghij1'
		});
		expect(r).toMatchObject({ name: 'Ada', email: 'ada@example.com' });
	});
});

describe('invitation', () => {
	it('accepts only our roles', () => {
		expect(inviteSchema.safeParse({ email: 'a@b.co', role: 'admin' }).success).toBe(false);
		expect(inviteSchema.parse({ email: 'a@b.co', role: 'installer' }).role).toBe('installer');
	});
});

describe('customer', () => {
	it('turns empty optional fields into null and checks the phone', () => {
		expect(customerSchema.parse({ name: 'Greta', email: '', phone: '' })).toEqual({
			name: 'Greta',
			email: null,
			phone: null,
			notes: ''
		});
		expect(messages(customerSchema.safeParse({ name: '', phone: 'call me' }))).toEqual({
			name: "Enter the customer's name",
			phone: 'Enter a phone number: digits, spaces, + ( ) - only'
		});
	});
});

describe('customer changes through the API', () => {
	it('change only the fields sent, so a name change keeps the notes', () => {
		expect(customerPatchSchema.parse({ name: 'Greta O.' })).toEqual({ name: 'Greta O.' });
		expect(customerPatchSchema.parse({ notes: '' })).toEqual({ notes: '' });
	});
});

describe('safeRedirect', () => {
	it('keeps same-site paths and drops everything else', () => {
		expect(safeRedirect('/invite/abc')).toBe('/invite/abc');
		expect(safeRedirect('//evil.example/x')).toBe('/app');
		expect(safeRedirect('/\\evil.example')).toBe('/app');
		expect(safeRedirect('https://evil.example')).toBe('/app');
		expect(safeRedirect(null, '/stores')).toBe('/stores');
	});
});
