import Stripe from 'stripe';
import { log } from '../log';
import { saveStripeAccount, stripeAccount } from '../db/queries/settings';
import { inStore, readInStore } from '../db/tenant';
import { stripe as appStripe } from '../stripe';

export type ConnectResult = { ok: true } | { ok: false; reason: 'unknown' | 'stripe' };

/**
 * Connects (or, with null, disconnects) a store's own Stripe account. A new id is first asked of
 * Stripe with the platform's key: only an account connected to the platform is saved. An account
 * another store already uses is refused with the same answer as one Stripe does not know, so no
 * owner learns which accounts other stores use.
 */
export async function connectStripeAccount(
	storeId: string,
	account: string | null,
	client: Stripe = appStripe
): Promise<ConnectResult> {
	const current = await readInStore(storeId, (tx) => stripeAccount(tx));
	if (account && account !== current) {
		try {
			const found = await client.accounts.retrieve(account);
			if (found.id !== account) return { ok: false, reason: 'unknown' };
		} catch (e) {
			if (e instanceof Stripe.errors.StripeError && e.type !== 'StripeConnectionError') {
				if (e.type === 'StripeAPIError' || e.type === 'StripeRateLimitError') {
					log.error({ err: e, storeId }, 'Stripe could not check a connected account');
					return { ok: false, reason: 'stripe' };
				}
				return { ok: false, reason: 'unknown' };
			}
			log.error({ err: e, storeId }, 'Stripe could not be reached to check an account');
			return { ok: false, reason: 'stripe' };
		}
	}
	try {
		await inStore(storeId, (tx) => saveStripeAccount(tx, account));
	} catch (e) {
		if ((e as { cause?: { code?: string } }).cause?.code === '23505') {
			return { ok: false, reason: 'unknown' };
		}
		throw e;
	}
	return { ok: true };
}
