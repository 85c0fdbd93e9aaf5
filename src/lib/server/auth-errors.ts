import { own } from '$lib/input';

/** Our words for better-auth's error codes, and which form field each belongs to. */
const MESSAGES: Record<string, { message: string; field?: string }> = {
	USER_ALREADY_EXISTS: {
		message: 'An account with this e-mail already exists. Sign in instead.',
		field: 'email'
	},
	USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL: {
		message: 'An account with this e-mail already exists. Sign in instead.',
		field: 'email'
	},
	INVALID_EMAIL: { message: 'Enter an e-mail address like name@example.com', field: 'email' },
	INVALID_EMAIL_OR_PASSWORD: { message: 'That e-mail and password do not match an account.' },
	PASSWORD_TOO_SHORT: { message: 'Use at least 10 characters', field: 'password' },
	PASSWORD_TOO_LONG: { message: 'Keep it under 128 characters', field: 'password' },
	INVALID_TOKEN: { message: 'This reset link has expired or was already used. Ask for a new one.' },
	USER_IS_ALREADY_INVITED_TO_THIS_ORGANIZATION: {
		message: 'This person already has an open invitation. Cancel it below to send a new one.',
		field: 'email'
	},
	USER_IS_ALREADY_A_MEMBER_OF_THIS_ORGANIZATION: {
		message: 'This person is already a member of the store.',
		field: 'email'
	},
	INVITATION_NOT_FOUND: {
		message:
			'This invitation has expired, was cancelled or was already used. Ask the store for a new one.'
	},
	YOU_ARE_NOT_THE_RECIPIENT_OF_THE_INVITATION: {
		message:
			'This invitation was sent to another e-mail address. Sign in with that address to accept it.'
	},
	ORGANIZATION_SLUG_ALREADY_TAKEN: {
		message: 'A store with a name this close exists; add your town.',
		field: 'name'
	},
	YOU_CANNOT_LEAVE_THE_ORGANIZATION_AS_THE_ONLY_OWNER: {
		message: 'A store needs at least one owner. Make someone else owner first.'
	},
	YOU_CANNOT_LEAVE_THE_ORGANIZATION_WITHOUT_AN_OWNER: {
		message: 'A store needs at least one owner. Make someone else owner first.'
	}
};

export interface AuthFailure {
	message: string;
	field?: string;
	status: number;
}

/** better-auth's refusals: APIError, and the body validation errors of its endpoints (another class). */
function isAuthError(
	e: unknown
): e is { statusCode?: number; status?: number; body?: { code?: string; message?: string } } {
	return (
		typeof e === 'object' &&
		e !== null &&
		'body' in e &&
		(typeof (e as { statusCode?: unknown }).statusCode === 'number' ||
			typeof (e as { status?: unknown }).status === 'number')
	);
}

/** Turns an error from better-auth into our message; anything else is thrown on. */
export function authFailure(e: unknown): AuthFailure {
	if (!isAuthError(e)) throw e;
	const code = e.body?.code ?? '';
	const status = typeof e.statusCode === 'number' ? e.statusCode : 400;
	const known = own(MESSAGES, code);
	if (known) return { ...known, status: status >= 500 ? 400 : status };
	if (code === 'VALIDATION_ERROR') {
		// "[body.email] Invalid email address": the field is named in brackets.
		const field = /\[body\.(\w+)\]/.exec(e.body?.message ?? '')?.[1];
		const fieldMessage = field ? own(MESSAGES, `INVALID_${field.toUpperCase()}`) : undefined;
		if (fieldMessage) return { ...fieldMessage, status: 400 };
		return { message: 'Some fields are not valid. Check them and try again.', field, status: 400 };
	}
	if (status === 429) {
		const message =
			code === 'TOO_MANY_ATTEMPTS' && e.body?.message
				? e.body.message
				: 'Too many tries. Wait a minute and try again.';
		return { message, status };
	}
	return { message: e.body?.message ?? 'That did not work. Try again.', status };
}
