import type Stripe from 'stripe';
import * as activity from '../db/queries/stripe-activity';
import { inStore, readInStore } from '../db/tenant';
import { stripe as appStripe, idOf } from '../stripe';
import { storeAccount, type StoreAccount } from './sync';

/**
 * The store's Stripe activity (charges, refunds, payouts) brought into its own tables, so the
 * reconciliation page reads the tables and never waits on Stripe. Webhooks keep them current one
 * object at a time (`mirrorObject`); a sync in the background, or when a manager asks, catches up
 * whatever a webhook missed (`syncStripeActivity`).
 */

/** At most this many objects of each kind in one sync; the next sync goes on from there. */
const MAX_OBJECTS = 5_000;
/** How far back the first sync of a store reaches. */
const FIRST_SYNC_DAYS = 90;
/** A sync starts this far before where the last one ended, for objects Stripe dated late. */
const OVERLAP_MS = 24 * 3_600_000;

const seconds = (d: Date) => Math.floor(d.getTime() / 1000);
const dateOf = (unix: number) => new Date(unix * 1000);

/** Every item of a Stripe list across its pages (the SDK's auto-pagination), up to a bound. */
async function all<T>(list: Stripe.ApiListPromise<T>, max = MAX_OBJECTS): Promise<T[]> {
	const items: T[] = [];
	for await (const item of list) {
		items.push(item);
		if (items.length >= max) break;
	}
	return items;
}

function chargeRow(c: Stripe.Charge) {
	const txn = typeof c.balance_transaction === 'object' ? c.balance_transaction : null;
	return {
		id: c.id,
		paymentIntentId: idOf(c.payment_intent),
		status: c.status,
		currency: c.currency.toUpperCase(),
		amountCents: c.amount,
		feeCents: txn?.fee ?? null,
		paymentId: c.metadata?.payment_id ?? null,
		jobId: c.metadata?.job_id ?? null,
		stripeCreated: dateOf(c.created)
	};
}

function refundRow(r: Stripe.Refund) {
	return {
		id: r.id,
		chargeId: idOf(r.charge),
		paymentIntentId: idOf(r.payment_intent),
		status: r.status ?? 'pending',
		currency: r.currency.toUpperCase(),
		amountCents: r.amount,
		stripeCreated: dateOf(r.created)
	};
}

/** A payout with what it netted: its balance transactions, less the payout's own. */
async function payoutRow(po: Stripe.Payout, client: Stripe, account: string) {
	const txns = await all(
		client.balanceTransactions.list({ payout: po.id, limit: 100 }, { stripeAccount: account })
	);
	const moving = txns.filter((t) => t.type !== 'payout');
	return {
		id: po.id,
		status: po.status,
		currency: po.currency.toUpperCase(),
		amountCents: po.amount,
		grossCents: moving.filter((t) => t.amount > 0).reduce((s, t) => s + t.amount, 0),
		feeCents: moving.reduce((s, t) => s + t.fee, 0),
		refundCents: -moving.filter((t) => t.amount < 0).reduce((s, t) => s + t.amount, 0),
		transactions: moving.length,
		arrivalDate: dateOf(po.arrival_date),
		stripeCreated: dateOf(po.created)
	};
}

export interface SyncResult {
	connected: boolean;
	charges: number;
	refunds: number;
	payouts: number;
}

/**
 * Reads the store's charges, refunds and payouts created in a window from Stripe into its
 * tables, and the payouts still on their way again. Without a window it goes on from where the
 * last sync ended (a day earlier, for late objects), or 90 days back the first time.
 */
export async function syncStripeActivity(
	storeId: string,
	window: { from?: Date; to?: Date } = {},
	client: Stripe = appStripe
): Promise<SyncResult> {
	const store = await storeAccount(storeId);
	if (!store) return { connected: false, charges: 0, refunds: 0, payouts: 0 };
	const { account } = store;
	const state = await readInStore(storeId, activity.readSync);
	const until = state?.syncedUntil ?? null;
	const to = window.to ?? new Date();
	const from =
		window.from ??
		(until
			? new Date(until.getTime() - OVERLAP_MS)
			: new Date(Date.now() - FIRST_SYNC_DAYS * 86_400_000));
	// The tables are whole up to `to` when this window starts where they were whole.
	const reachesBack = until ? from <= until : !window.from;
	try {
		const on = { stripeAccount: account };
		const created = { gte: seconds(from), lte: seconds(to) };
		const [charges, refunds, payouts, open] = await Promise.all([
			all(client.charges.list({ created, limit: 100, expand: ['data.balance_transaction'] }, on)),
			all(client.refunds.list({ created, limit: 100 }, on)),
			all(client.payouts.list({ created, limit: 100 }, on)),
			readInStore(storeId, (tx) => activity.unfinishedPayouts(tx))
		]);
		const listed = new Set(payouts.map((p) => p.id));
		for (const id of open) {
			if (!listed.has(id)) payouts.push(await client.payouts.retrieve(id, {}, on));
		}
		const payoutRows: Awaited<ReturnType<typeof payoutRow>>[] = [];
		for (const po of payouts) payoutRows.push(await payoutRow(po, client, account));
		await inStore(storeId, async (tx) => {
			await activity.saveCharges(tx, charges.map(chargeRow));
			await activity.saveRefunds(tx, refunds.map(refundRow));
			await activity.savePayouts(tx, payoutRows);
			await activity.noteSync(tx, reachesBack ? to : null);
		});
		return {
			connected: true,
			charges: charges.length,
			refunds: refunds.length,
			payouts: payoutRows.length
		};
	} catch (e) {
		await inStore(storeId, (tx) => activity.noteSyncError(tx, (e as Error).message));
		throw e;
	}
}

/**
 * Brings one charge, refund or payout a webhook named into the store's tables, as Stripe has it
 * now (not as the event said). Other objects are left alone.
 */
export async function mirrorObject(
	{ storeId, account }: StoreAccount,
	object: { object: string; id: string },
	client: Stripe = appStripe
) {
	const on = { stripeAccount: account };
	if (object.object === 'charge') {
		const charge = await client.charges.retrieve(
			object.id,
			{ expand: ['balance_transaction'] },
			on
		);
		await inStore(storeId, (tx) => activity.saveCharges(tx, [chargeRow(charge)]));
	} else if (object.object === 'refund') {
		const refund = await client.refunds.retrieve(object.id, {}, on);
		await inStore(storeId, (tx) => activity.saveRefunds(tx, [refundRow(refund)]));
	} else if (object.object === 'payout') {
		const row = await payoutRow(await client.payouts.retrieve(object.id, {}, on), client, account);
		await inStore(storeId, (tx) => activity.savePayouts(tx, [row]));
	}
}
