import { DuplicatePriceItem, InvalidPriceItem } from '$lib/server/db/queries/price-book';
import { json } from '@sveltejs/kit';

/** A price-book write the engine's schema refused (400) or that doubles a kind (409); else rethrown. */
export function priceItemRefusal(e: unknown): Response {
	if (e instanceof InvalidPriceItem) {
		return json({ message: 'Some fields are not valid', issues: e.issues }, { status: 400 });
	}
	if (e instanceof DuplicatePriceItem) {
		return json(
			{ message: `The price book already has a line for ${e.code}: change that one` },
			{ status: 409 }
		);
	}
	throw e;
}
