import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import { parseForm, refuse } from '$lib/server/forms';
import { config } from '$lib/server/config';
import { safeRedirect } from '$lib/redirect';
import { signUpSchema } from '$lib/schemas/auth';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	// Only a same-origin path survives, in the page and in the form it posts back.
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo'), '', config.origin) || null;
	if (locals.user) redirect(303, redirectTo ?? '/stores');
	return { redirectTo, email: url.searchParams.get('email') ?? '' };
};

export const actions: Actions = {
	default: async ({ request }) => {
		const parsed = await parseForm(request, signUpSchema);
		if (!parsed.ok) return parsed.failure;
		try {
			await auth.api.signUpEmail({ body: parsed.data, headers: request.headers });
		} catch (e) {
			const failure = authFailure(e);
			if (failure.field) return refuse(parsed.form, { [failure.field]: [failure.message] });
			return refuse(parsed.form, {}, failure.message, failure.status);
		}
		redirect(
			303,
			safeRedirect(parsed.form.get('redirectTo')?.toString(), '/stores', config.origin)
		);
	}
};
