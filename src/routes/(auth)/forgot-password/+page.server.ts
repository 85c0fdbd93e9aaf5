import { auth } from '$lib/server/auth';
import { config } from '$lib/server/config';
import { authFailure } from '$lib/server/auth-errors';
import { parseForm, refuse } from '$lib/server/forms';
import { forgotPasswordSchema } from '$lib/schemas/auth';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async ({ request }) => {
		const parsed = await parseForm(request, forgotPasswordSchema);
		if (!parsed.ok) return parsed.failure;
		// The same answer whether or not the address has an account, so nobody can probe for logins.
		try {
			await auth.api.requestPasswordReset({
				body: { email: parsed.data.email, redirectTo: `${config.origin}/reset-password` },
				headers: request.headers
			});
		} catch (e) {
			const failure = authFailure(e);
			return refuse(parsed.form, {}, failure.message, failure.status);
		}
		return { sent: true, email: parsed.data.email };
	}
};
