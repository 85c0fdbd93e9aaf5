import { endpoint } from '$lib/server/api';
import { requireMember } from '$lib/server/guards';
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** Who is calling and in which store, with which role. */
export const GET: RequestHandler = endpoint(async () => {
	const { user, store, role } = requireMember();
	return json({ user: { id: user.id, name: user.name, email: user.email }, store, role });
});
