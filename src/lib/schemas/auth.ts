import { z } from 'zod';
import { email, requiredText } from './fields';

export const PASSWORD_RULE = 'At least 10 characters, with a letter and a digit';

export const password = z
	.string({ error: 'Enter a password' })
	.min(10, 'Use at least 10 characters')
	.max(128, 'Keep it under 128 characters')
	.regex(/[A-Za-z]/, 'Add at least one letter')
	.regex(/[0-9]/, 'Add at least one digit');

export const signUpSchema = z.object({
	name: requiredText('Enter your name', 100),
	email,
	password
});

export const signInSchema = z.object({
	email,
	password: z.string().min(1, 'Enter your password')
});

export const forgotPasswordSchema = z.object({ email });

export const resetPasswordSchema = z
	.object({
		token: z.string().min(1, 'This reset link is incomplete: ask for a new one'),
		password,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, {
		path: ['confirm'],
		message: 'The two passwords differ'
	});

/** Only same-origin paths, so a crafted link cannot send people elsewhere after sign-in. */
export { safeRedirect } from '../redirect';
