import { z } from 'zod';

/** Required text, trimmed, with a message for the empty case. */
export const requiredText = (message: string, max = 200) =>
	z.string({ error: message }).trim().min(1, message).max(max, `Keep it under ${max} characters`);

/** Optional text: an empty field becomes null. */
export const optionalText = (max = 200) =>
	z
		.string()
		.trim()
		.max(max, `Keep it under ${max} characters`)
		.optional()
		.transform((v) => (v ? v : null));

export const email = z
	.string({ error: 'Enter an e-mail address' })
	.trim()
	.toLowerCase()
	.pipe(z.email('Enter an e-mail address like name@example.com'));

/** An e-mail that may be left empty (null). */
export const optionalEmail = z
	.string()
	.trim()
	.toLowerCase()
	.optional()
	.transform((v) => v || null)
	.pipe(z.email('Enter an e-mail address like name@example.com').nullable());

export const phone = z
	.string()
	.trim()
	.optional()
	.transform((v) => v || null)
	.pipe(
		z
			.string()
			.regex(/^\+?[0-9 ().-]{7,20}$/, 'Enter a phone number: digits, spaces, + ( ) - only')
			.nullable()
	);

/** A text id as the tables use (uuid or better-auth's ids). */
export const id = z.string().trim().min(1).max(64);
