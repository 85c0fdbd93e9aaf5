import { endpoint } from '$lib/server/api';
import { requireMember } from '$lib/server/guards';
import { openApiDocument } from '$lib/server/openapi';
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The API described as OpenAPI 3.1, from the same zod schemas the routes validate with. */
export const GET: RequestHandler = endpoint(async () => {
	requireMember();
	return json(openApiDocument());
});
