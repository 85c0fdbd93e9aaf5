import { endpoint, readJson } from '$lib/server/api';
import { deliveryModeSchema } from '$lib/schemas/test-payments';
import { json } from '@sveltejs/kit';
import { requireStripeFake } from '../fake.server';
import type { RequestHandler } from './$types';

/** `hold` keeps new events undelivered, to deliver them later in a chosen order; `auto` sends them. */
export const POST: RequestHandler = endpoint(async ({ request }) => {
	const fake = requireStripeFake();
	const { mode } = await readJson(request, deliveryModeSchema);
	fake.setDeliveryMode(mode);
	return json({ mode: fake.deliveryMode() });
});
