import { requirePermission } from '$lib/server/guards';
import { catchUp } from '$lib/server/payments/sync';
import { reconcile } from '$lib/server/payments/reconcile';
import type { Actions, PageServerLoad } from './$types';
import { periodOf } from './period';

export const load: PageServerLoad = async ({ url }) => {
	const { store } = requirePermission({ payment: ['reconcile'] });
	const period = periodOf(url);
	try {
		const report = await reconcile(store.id, period.from, period.to);
		return { period, report, failure: null };
	} catch (e) {
		console.error('Reconciliation failed', e);
		return {
			period,
			report: null,
			failure: `Stripe could not be reached: ${(e as Error).message}`
		};
	}
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
	}
};
