import type Stripe from 'stripe';
import * as payments from '../db/queries/payments';
import { stripeAccount } from '../db/queries/settings';
import { readStore } from '../db/queries/stores';
import { inStore, readInStore } from '../db/tenant';
import { stripe as appStripe, idOf } from '../stripe';
import { syncRefundsIn, syncSessionIn, type StoreAccount } from './sync';

export type EventOutcome = 'handled' | 'duplicate' | 'ignored';

/** The store an event's object names, if the store's Stripe account is the one it came from. */
async function storeOfEvent(event: Stripe.Event): Promise<StoreAccount | null> {
	const object = event.data.object as { metadata?: Record<string, string> | null };
	const storeId = object.metadata?.store_id;
	if (!storeId) return null;
	const found = await readInStore(storeId, async (tx) => ({
		store: await readStore(tx),
		account: await stripeAccount(tx)
	}));
	if (!found.store || !found.account) return null;
	if (event.account && event.account !== found.account) return null;
	return { storeId, account: found.account };
}

/**
 * Handles one verified webhook event: once per event id, in the store its object names (and
 * whose Stripe account sent it). The ledger is set from Stripe's current state, not the event's
 * snapshot, so the order events arrive in does not matter.
 */
export async function handleEvent(
	event: Stripe.Event,
	client: Stripe = appStripe
): Promise<EventOutcome> {
	const store = await storeOfEvent(event);
	if (!store) return 'ignored';
	const { storeId } = store;
	const object = event.data.object as {
		id: string;
		object: string;
		metadata?: Record<string, string> | null;
		payment_intent?: string | { id: string } | null;
	};
	const found = await readInStore(storeId, async (tx) => {
		if (await payments.seenEvent(tx, event.id)) return 'duplicate' as const;
		if (!['payment_intent', 'charge', 'refund'].includes(object.object)) return null;
		return payments.findByIdOrIntent(tx, {
			id: object.metadata?.payment_id,
			intent: object.object === 'payment_intent' ? object.id : idOf(object.payment_intent)
		});
	});
	if (found === 'duplicate') return 'duplicate';
	let outcome = 'no change';
	if (object.object === 'checkout.session') {
		outcome = await syncSessionIn(store, object.id, client);
	} else if (found === undefined) {
		outcome = 'not in the ledger';
	} else if (found) {
		if (found.stripeCheckoutSessionId)
			outcome = await syncSessionIn(store, found.stripeCheckoutSessionId, client);
		if (object.object === 'charge' || object.object === 'refund') {
			await syncRefundsIn(store, found.id, client);
			outcome = `${outcome}; refunds synced`;
		}
	}
	await inStore(storeId, (tx) =>
		payments.firstSight(
			tx,
			{ id: event.id, type: event.type, objectId: object.id, created: event.created },
			outcome
		)
	);
	return 'handled';
}
