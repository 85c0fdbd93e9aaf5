import { auth } from '$lib/server/auth';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

// Signing out is a POST (a link could be followed by a prefetch); a GET just goes home.
export const load: PageServerLoad = async () => redirect(303, '/');

export const actions: Actions = {
	default: async ({ request }) => {
		await auth.api.signOut({ headers: request.headers });
		redirect(303, '/sign-in');
	}
};
