import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import { homeFor } from '$lib/server/access';
import { parseForm, refuse } from '$lib/server/forms';
import { config } from '$lib/server/config';
import { safeRedirect } from '$lib/redirect';
import { signInSchema } from '$lib/schemas/auth';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	// Only a same-origin path survives, in the page and in the form it posts back.
	const redirectTo = safeRedirect(url.searchParams.get('redirectTo'), '', config.origin) || null;
	if (locals.user) redirect(303, redirectTo ?? homeFor(locals.role));
	return { redirectTo, reset: url.searchParams.has('reset') };
};

export const actions: Actions = {
	default: async ({ request }) => {
		const parsed = await parseForm(request, signInSchema);
		if (!parsed.ok) return parsed.failure;
		try {
			await auth.api.signInEmail({ body: parsed.data, headers: request.headers });
		} catch (e) {
			const failure = authFailure(e);
			return refuse(parsed.form, {}, failure.message, failure.status);
		}
		// /app sends installers on to /field and people without a store to /stores.
		redirect(303, safeRedirect(parsed.form.get('redirectTo')?.toString(), '/app', config.origin));
	}
};
