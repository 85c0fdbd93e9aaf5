import { endpoint, readJson } from '$lib/server/api';
import { deliverSchema } from '$lib/schemas/test-payments';
import { json } from '@sveltejs/kit';
import { requireStripeFake } from '../fake.server';
import type { RequestHandler } from './$types';

/** Delivery attempts, newest first, with the endpoint's status (`?event=evt_…&type=…`). */
export const GET: RequestHandler = endpoint(async ({ url }) => {
	const fake = requireStripeFake();
	const event = url.searchParams.get('event') ?? undefined;
	const type = url.searchParams.get('type') ?? undefined;
	return json({ data: fake.deliveries({ event, type }).slice(0, 200) });
});

/**
 * Delivers events now, in the order given, `times` times: again (Stripe may send an event
 * twice), late (`lateBy` seconds old, past the 300 s tolerance), with a wrong signature, or held
 * events out of order. Answers the attempts made.
 */
export const POST: RequestHandler = endpoint(async ({ request }) => {
	const fake = requireStripeFake();
	const body = await readJson(request, deliverSchema);
	const known = new Set(fake.events().map((e) => e.id));
	const unknown = body.events.filter((id) => !known.has(id));
	if (unknown.length) {
		return json(
			{
				message: 'Some events do not exist',
				issues: unknown.map((id) => ({ path: 'events', message: `No such event: ${id}` }))
			},
			{ status: 404 }
		);
	}
	const order = Array.from({ length: body.times }, () => body.events).flat();
	const data = await fake.deliver(order, { lateBy: body.lateBy, badSignature: body.badSignature });
	return json({ data });
});
