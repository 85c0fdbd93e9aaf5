import type Stripe from 'stripe';
import * as payments from '../db/queries/payments';
import { stripeAccount, storeOfStripeAccount } from '../db/queries/settings';
import { readStore } from '../db/queries/stores';
import { inStore, readInStore } from '../db/tenant';
import { stripe as appStripe, idOf } from '../stripe';
import { mirrorObject } from './stripe-activity';
import { syncRefundsIn, syncSessionIn, type StoreAccount } from './sync';

export type EventOutcome = 'handled' | 'duplicate' | 'ignored';

/**
 * The store an event is for: the one whose Stripe account sent it, or (from the platform's own
 * account) the one its object names. An object naming another store than its account's is
 * refused, and so is a store without that account.
 */
async function storeOfEvent(event: Stripe.Event): Promise<StoreAccount | null> {
	const object = event.data.object as { metadata?: Record<string, string> | null };
	const named = object.metadata?.store_id ?? null;
	const storeId = event.account ? await storeOfStripeAccount(event.account) : named;
	if (!storeId || (named && named !== storeId)) return null;
	const found = await readInStore(storeId, async (tx) => ({
		store: await readStore(tx),
		account: await stripeAccount(tx)
	}));
	if (!found.store || !found.account) return null;
	if (event.account && event.account !== found.account) return null;
	return { storeId, account: found.account };
}

/**
 * Handles one verified webhook event: once per event id, in the store it is for. The ledger and
 * the reconciliation's tables are set from Stripe's current state, not the event's snapshot, so
 * the order events arrive in does not matter.
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
	// The reconciliation's copy of the charge, refund or payout, as Stripe has it now.
	await mirrorObject(store, object, client);
	await inStore(storeId, (tx) =>
		payments.firstSight(
			tx,
			{ id: event.id, type: event.type, objectId: object.id, created: event.created },
			outcome
		)
	);
	return 'handled';
}
