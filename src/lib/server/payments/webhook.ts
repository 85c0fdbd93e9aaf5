import Stripe from 'stripe';
import { log } from '../log';
import * as payments from '../db/queries/payments';
import { stripeAccount, storeOfStripeAccount } from '../db/queries/settings';
import { readStore } from '../db/queries/stores';
import { inStore, readInStore } from '../db/tenant';
import { stripe as appStripe, idOf } from '../stripe';
import { mirrorObject } from './stripe-activity';
import { syncRefundsIn, syncSessionIn, type StoreAccount } from './sync';

export type EventOutcome = 'handled' | 'duplicate' | 'ignored';

/** A metadata value as we wrote it: a short string, or nothing (a signed event may still carry junk). */
function metaText(metadata: unknown, key: 'store_id' | 'payment_id'): string | null {
	if (!metadata || typeof metadata !== 'object') return null;
	const value = Object.hasOwn(metadata, key) ? (metadata as Record<string, unknown>)[key] : null;
	return typeof value === 'string' && value.length > 0 && value.length <= 100 ? value : null;
}

/**
 * The store an event is for: the one whose connected Stripe account sent it. An event without an
 * account (the platform's own) acts for no store, since every store takes cards on its own
 * account; an object naming another store than its account's is refused too.
 */
async function storeOfEvent(event: Stripe.Event): Promise<StoreAccount | null> {
	if (typeof event.account !== 'string' || !event.account) return null;
	const named = metaText((event.data.object as { metadata?: unknown }).metadata, 'store_id');
	const storeId = await storeOfStripeAccount(event.account);
	if (!storeId || (named && named !== storeId)) return null;
	const found = await readInStore(storeId, async (tx) => ({
		store: await readStore(tx),
		account: await stripeAccount(tx)
	}));
	if (!found.store || !found.account || event.account !== found.account) return null;
	return { storeId, account: found.account };
}

/** Stripe's answer that an object named by a signed event does not exist (or is not ours to ask). */
const unknownObject = (e: unknown) => e instanceof Stripe.errors.StripeInvalidRequestError;

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
	if (!store) {
		log.info({ eventId: event.id, type: event.type }, 'Stripe event for no store: ignored');
		return 'ignored';
	}
	const { storeId } = store;
	const object = event.data.object as {
		id: string;
		object: string;
		metadata?: unknown;
		payment_intent?: string | { id: string } | null;
	};
	const found = await readInStore(storeId, async (tx) => {
		if (await payments.seenEvent(tx, event.id)) return 'duplicate' as const;
		if (!['payment_intent', 'charge', 'refund'].includes(object.object)) return null;
		const intent = object.object === 'payment_intent' ? object.id : idOf(object.payment_intent);
		return payments.findByIdOrIntent(tx, {
			id: metaText(object.metadata, 'payment_id'),
			intent: typeof intent === 'string' && intent.length <= 255 ? intent : null
		});
	});
	if (found === 'duplicate') return 'duplicate';
	let outcome = 'no change';
	try {
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
	} catch (e) {
		if (!unknownObject(e)) throw e;
		// Signed by Stripe, but naming an object the store's account does not have: nothing to do,
		// and nothing Stripe should send again.
		log.warn(
			{ storeId, eventId: event.id, type: event.type, err: e },
			'Stripe event names an unknown object: acknowledged'
		);
		outcome = 'unknown object';
	}
	await inStore(storeId, (tx) =>
		payments.firstSight(
			tx,
			{
				id: event.id.slice(0, 255),
				type: event.type.slice(0, 255),
				objectId: object.id.slice(0, 255),
				created: Number.isFinite(event.created) ? event.created : 0
			},
			outcome
		)
	);
	return outcome === 'unknown object' ? 'ignored' : 'handled';
}
