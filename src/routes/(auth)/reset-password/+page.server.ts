import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import { parseForm, refuse } from '$lib/server/forms';
import { resetPasswordSchema } from '$lib/schemas/auth';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	return {
		token: url.searchParams.get('token') ?? '',
		invalid: url.searchParams.get('error') === 'INVALID_TOKEN'
	};
};

export const actions: Actions = {
	default: async ({ request }) => {
		const parsed = await parseForm(request, resetPasswordSchema);
		if (!parsed.ok) return parsed.failure;
		try {
			await auth.api.resetPassword({
				body: { newPassword: parsed.data.password, token: parsed.data.token },
				headers: request.headers
			});
		} catch (e) {
			const failure = authFailure(e);
			return refuse(parsed.form, {}, failure.message, failure.status);
		}
		redirect(303, '/sign-in?reset=1');
	}
};
