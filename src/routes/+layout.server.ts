import type { LayoutServerLoad } from './$types';

/** Who is signed in and where, for headers; never decides access (hooks and guards do). */
export const load: LayoutServerLoad = async ({ locals }) => {
	return {
		user: locals.user
			? { id: locals.user.id, name: locals.user.name, email: locals.user.email }
			: null,
		store: locals.store,
		role: locals.role
	};
};
