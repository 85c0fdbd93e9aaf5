import { endpoint } from '$lib/server/api';
import { json } from '@sveltejs/kit';
import { requireStripeFake } from '../fake.server';
import type { RequestHandler } from './$types';

/** The fake's events, newest first (`?type=checkout.session.completed`), for tests and testers. */
export const GET: RequestHandler = endpoint(async ({ url }) => {
	const fake = requireStripeFake();
	const type = url.searchParams.get('type') ?? undefined;
	return json({ data: fake.events({ type }).slice(0, 100) });
});
