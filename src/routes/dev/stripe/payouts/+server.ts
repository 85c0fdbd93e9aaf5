import { endpoint, readJson } from '$lib/server/api';
import { payoutSchema } from '$lib/schemas/test-payments';
import { json } from '@sveltejs/kit';
import { requireStripeFake } from '../fake.server';
import type { RequestHandler } from './$types';

/**
 * Pays out the available balance now (Stripe pays out on its own schedule): one payout per
 * currency, or for `{ currency }` only. Answers the payouts made, none when nothing is due.
 */
export const POST: RequestHandler = endpoint(async ({ request }) => {
	const fake = requireStripeFake();
	const { currency, account } = await readJson(request, payoutSchema);
	return json({ data: await fake.payout(currency, account) });
});
