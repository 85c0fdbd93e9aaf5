import { log } from '$lib/server/log';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { reconcile } from '$lib/server/payments/reconcile';
import { syncStripeActivity } from '$lib/server/payments/stripe-activity';
import { catchUp } from '$lib/server/payments/sync';
import type { Actions, PageServerLoad } from './$types';
import { periodOf } from './period';

/** The reconciliation, from the store's tables: no call to Stripe while the page loads. */
export const load: PageServerLoad = async ({ url }) => {
	const { store } = requirePermission({ payment: ['reconcile'] });
	const period = periodOf(url);
	const report = await readInStore(store.id, (tx) => reconcile(tx, period.from, period.to));
	return { period, report };
};

export const actions: Actions = {
	/** Reads every pending card payment back from Stripe: what a missed webhook left behind. */
	catchUp: async () => {
		const { store } = requirePermission({ payment: ['reconcile'] });
		const outcomes = await catchUp(store.id);
		return {
			caughtUp: outcomes.filter((o) => o === 'succeeded' || o === 'failed').length,
			checked: outcomes.length
		};
	},
	/** Reads the period's charges, refunds and payouts from Stripe into the store's tables now. */
	sync: async ({ url }) => {
		const { store } = requirePermission({ payment: ['reconcile'] });
		const period = periodOf(url);
		try {
			const synced = await syncStripeActivity(store.id, { from: period.from, to: period.to });
			return { synced };
		} catch (e) {
			log.error({ err: e }, 'The Stripe figures could not be brought up to date');
			return { syncFailed: `Stripe could not be reached: ${(e as Error).message}` };
		}
	}
};
