import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { parseForm, typedValues } from './forms';

function post(fields: Record<string, string>) {
	return new Request('http://x/', { method: 'POST', body: new URLSearchParams(fields) });
}

describe('form parsing', () => {
	it('returns what was typed and each field’s problem, but never a password', async () => {
		const schema = z.object({
			email: z.email('Bad e-mail'),
			password: z.string().min(10, 'Too short')
		});
		const result = await parseForm(post({ email: 'nope', password: 'secret' }), schema);
		expect(result.ok).toBe(false);
		if (result.ok) return;
		expect(result.failure.status).toBe(400);
		expect(result.failure.data).toEqual({
			values: { email: 'nope' },
			errors: { email: ['Bad e-mail'], password: ['Too short'] },
			message: undefined
		});
	});

	it('passes parsed data through', async () => {
		const result = await parseForm(post({ n: '3' }), z.object({ n: z.coerce.number() }));
		expect(result.ok && result.data).toEqual({ n: 3 });
	});

	it('drops tokens and confirmations from the echoed values', () => {
		const form = new FormData();
		form.set('name', 'A');
		form.set('token', 't');
		form.set('confirm', 'c');
		expect(typedValues(form)).toEqual({ name: 'A' });
	});
});
