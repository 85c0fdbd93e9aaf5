import { auth } from '$lib/server/auth';
import { log } from '$lib/server/log';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

// Signing out is a POST (a link could be followed by a prefetch); a GET just goes home.
export const load: PageServerLoad = async () => redirect(303, '/');

export const actions: Actions = {
	default: async ({ request }) => {
		try {
			await auth.api.signOut({ headers: request.headers });
		} catch (e) {
			// A session already ended (signed out in another tab at the same moment) is signed out:
			// going on to the sign-in page is the answer, never a 500.
			log.warn({ err: e }, 'Sign-out found no session to end');
		}
		redirect(303, '/sign-in');
	}
};
