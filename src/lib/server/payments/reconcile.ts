import { and, eq, gte, inArray, lte } from 'drizzle-orm';
import type Stripe from 'stripe';
import { formatMoney } from '$lib/format';
import { jobLabel } from '$lib/jobs/status';
import { read as readSettings, stripeAccount } from '../db/queries/settings';
import { job, payment, refund } from '../db/schema';
import { readInStore } from '../db/tenant';
import { stripe as appStripe, idOf } from '../stripe';

/**
 * The manager's week-end check: what Stripe says happened in the store's account over a period
 * (charges, refunds, fees, payouts) set against the ledger, line by line.
 */
export type MatchStatus = 'matched' | 'stripe_only' | 'ledger_only' | 'amount_differs';

export interface ReconRow {
	kind: 'charge' | 'refund';
	status: MatchStatus;
	at: string;
	stripeId: string | null;
	paymentId: string | null;
	jobId: string | null;
	jobLabel: string | null;
	stripeCents: number | null;
	ledgerCents: number | null;
	stripeFeeCents: number | null;
	ledgerFeeCents: number | null;
	currency: string;
	note: string;
}

export interface PayoutRow {
	id: string;
	arrival: string;
	status: string;
	currency: string;
	netCents: number;
	grossCents: number;
	feeCents: number;
	refundCents: number;
	transactions: number;
}

export interface Reconciliation {
	from: string;
	to: string;
	rows: ReconRow[];
	payouts: PayoutRow[];
	counts: Record<MatchStatus, number>;
	totals: { chargedCents: number; refundedCents: number; feeCents: number; paidOutCents: number };
	connected: boolean;
	/** The store's currency, for the totals. */
	currency: string;
}

/** Every item of a Stripe list across its pages (the SDK's auto-pagination), up to a bound. */
async function all<T>(list: Stripe.ApiListPromise<T>, max = 10_000): Promise<T[]> {
	const items: T[] = [];
	for await (const item of list) {
		items.push(item);
		if (items.length >= max) break;
	}
	return items;
}

const seconds = (d: Date) => Math.floor(d.getTime() / 1000);
const iso = (unix: number) => new Date(unix * 1000).toISOString();

/** Matches the store's Stripe activity between two dates (inclusive) with its ledger. */
export async function reconcile(
	storeId: string,
	from: Date,
	to: Date,
	client: Stripe = appStripe
): Promise<Reconciliation> {
	const empty = { matched: 0, stripe_only: 0, ledger_only: 0, amount_differs: 0 };
	const base = { from: from.toISOString(), to: to.toISOString() };
	const { account, trade } = await readInStore(storeId, async (tx) => ({
		account: await stripeAccount(tx),
		trade: await readSettings(tx)
	}));
	const currency = trade.currency;
	if (!account) {
		return {
			...base,
			currency,
			rows: [],
			payouts: [],
			counts: empty,
			totals: { chargedCents: 0, refundedCents: 0, feeCents: 0, paidOutCents: 0 },
			connected: false
		};
	}
	const on = { stripeAccount: account };
	const created = { gte: seconds(from), lte: seconds(to) };
	const [charges, refunds, payouts] = await Promise.all([
		all(client.charges.list({ created, limit: 100, expand: ['data.balance_transaction'] }, on)),
		all(client.refunds.list({ created, limit: 100 }, on)),
		all(client.payouts.list({ created, limit: 100 }, on))
	]);
	const succeeded = charges.filter((c) => c.status === 'succeeded');

	const ledger = await readInStore(storeId, async (tx) => {
		const cardPayments = await tx
			.select({ p: payment, number: job.number })
			.from(payment)
			.innerJoin(
				job,
				and(eq(job.id, payment.jobId), eq(job.organizationId, payment.organizationId))
			)
			.where(and(eq(payment.organizationId, storeId), eq(payment.method, 'card')));
		const cardRefunds = cardPayments.length
			? await tx
					.select()
					.from(refund)
					.where(
						and(
							eq(refund.organizationId, storeId),
							inArray(
								refund.paymentId,
								cardPayments.map((r) => r.p.id)
							),
							gte(refund.createdAt, from),
							lte(refund.createdAt, to)
						)
					)
			: [];
		return { cardPayments, cardRefunds };
	});
	const byCharge = new Map(
		ledger.cardPayments.filter((r) => r.p.stripeChargeId).map((r) => [r.p.stripeChargeId!, r])
	);
	const byIntent = new Map(
		ledger.cardPayments
			.filter((r) => r.p.stripePaymentIntentId)
			.map((r) => [r.p.stripePaymentIntentId!, r])
	);
	const byId = new Map(ledger.cardPayments.map((r) => [r.p.id, r]));
	const rows: ReconRow[] = [];
	const seenPayments = new Set<string>();

	for (const c of succeeded) {
		const txn = typeof c.balance_transaction === 'object' ? c.balance_transaction : null;
		const found =
			byCharge.get(c.id) ??
			byIntent.get(idOf(c.payment_intent) ?? '') ??
			byId.get(c.metadata?.payment_id ?? '');
		const common = {
			kind: 'charge' as const,
			at: iso(c.created),
			stripeId: c.id,
			stripeCents: c.amount,
			stripeFeeCents: txn?.fee ?? null,
			currency: c.currency.toUpperCase()
		};
		if (!found || (found.p.status !== 'succeeded' && found.p.status !== 'refunded')) {
			rows.push({
				...common,
				status: 'stripe_only',
				paymentId: found?.p.id ?? null,
				jobId: found?.p.jobId ?? c.metadata?.job_id ?? null,
				jobLabel: found ? jobLabel(found.number) : null,
				ledgerCents: null,
				ledgerFeeCents: null,
				note: found
					? `The ledger still has this payment as ${found.p.status}: bring it up to date`
					: 'No ledger payment for this charge'
			});
			continue;
		}
		seenPayments.add(found.p.id);
		const differs = found.p.amountCents !== c.amount;
		const feeDiffers = txn && found.p.feeCents !== null && found.p.feeCents !== txn.fee;
		rows.push({
			...common,
			status: differs ? 'amount_differs' : 'matched',
			paymentId: found.p.id,
			jobId: found.p.jobId,
			jobLabel: jobLabel(found.number),
			ledgerCents: found.p.amountCents,
			ledgerFeeCents: found.p.feeCents,
			note: differs
				? `Stripe charged ${formatMoney(c.amount, c.currency.toUpperCase())}, the ledger has ${formatMoney(found.p.amountCents, found.p.currency)}`
				: feeDiffers
					? `Fee differs: Stripe ${formatMoney(txn.fee, c.currency.toUpperCase())}, the ledger ${formatMoney(found.p.feeCents ?? 0, found.p.currency)}`
					: ''
		});
	}
	const inPeriod = (d: Date | null) => d && d >= from && d <= to;
	for (const r of ledger.cardPayments) {
		if (seenPayments.has(r.p.id)) continue;
		if ((r.p.status === 'succeeded' || r.p.status === 'refunded') && inPeriod(r.p.succeededAt)) {
			rows.push({
				kind: 'charge',
				status: 'ledger_only',
				at: r.p.succeededAt!.toISOString(),
				stripeId: r.p.stripeChargeId,
				paymentId: r.p.id,
				jobId: r.p.jobId,
				jobLabel: jobLabel(r.number),
				stripeCents: null,
				ledgerCents: r.p.amountCents,
				stripeFeeCents: null,
				ledgerFeeCents: r.p.feeCents,
				currency: r.p.currency,
				note: 'The ledger has this card payment; Stripe has no such charge in the period'
			});
		}
	}

	const refundByStripe = new Map(
		ledger.cardRefunds.filter((r) => r.stripeRefundId).map((r) => [r.stripeRefundId!, r])
	);
	const seenRefunds = new Set<string>();
	for (const s of refunds) {
		const ours = refundByStripe.get(s.id);
		const paid = ours ? byId.get(ours.paymentId) : byIntent.get(idOf(s.payment_intent) ?? '');
		const common = {
			kind: 'refund' as const,
			at: iso(s.created),
			stripeId: s.id,
			paymentId: paid?.p.id ?? null,
			jobId: paid?.p.jobId ?? null,
			jobLabel: paid ? jobLabel(paid.number) : null,
			stripeCents: -s.amount,
			stripeFeeCents: null,
			ledgerFeeCents: null,
			currency: s.currency.toUpperCase()
		};
		if (!ours) {
			rows.push({
				...common,
				status: 'stripe_only',
				ledgerCents: null,
				note: 'A refund made in Stripe that the ledger lacks'
			});
			continue;
		}
		seenRefunds.add(ours.id);
		const differs = ours.amountCents !== s.amount;
		rows.push({
			...common,
			status: differs ? 'amount_differs' : 'matched',
			ledgerCents: -ours.amountCents,
			note: differs
				? `Stripe refunded ${formatMoney(s.amount, s.currency.toUpperCase())}, the ledger has ${formatMoney(ours.amountCents, s.currency.toUpperCase())}`
				: ''
		});
	}
	for (const r of ledger.cardRefunds) {
		if (seenRefunds.has(r.id) || r.status === 'failed') continue;
		const paid = byId.get(r.paymentId);
		rows.push({
			kind: 'refund',
			status: 'ledger_only',
			at: r.createdAt.toISOString(),
			stripeId: r.stripeRefundId,
			paymentId: r.paymentId,
			jobId: paid?.p.jobId ?? null,
			jobLabel: paid ? jobLabel(paid.number) : null,
			stripeCents: null,
			ledgerCents: -r.amountCents,
			stripeFeeCents: null,
			ledgerFeeCents: null,
			currency: paid?.p.currency ?? 'USD',
			note: 'The ledger has this refund; Stripe has none in the period'
		});
	}
	rows.sort((a, b) => a.at.localeCompare(b.at));

	const payoutRows: PayoutRow[] = [];
	for (const po of payouts) {
		const txns = await all(client.balanceTransactions.list({ payout: po.id, limit: 100 }, on));
		const moving = txns.filter((t) => t.type !== 'payout');
		payoutRows.push({
			id: po.id,
			arrival: iso(po.arrival_date),
			status: po.status,
			currency: po.currency.toUpperCase(),
			netCents: po.amount,
			grossCents: moving.filter((t) => t.amount > 0).reduce((s, t) => s + t.amount, 0),
			feeCents: moving.reduce((s, t) => s + t.fee, 0),
			refundCents: -moving.filter((t) => t.amount < 0).reduce((s, t) => s + t.amount, 0),
			transactions: moving.length
		});
	}

	const counts = { ...empty };
	for (const r of rows) counts[r.status] += 1;
	return {
		...base,
		rows,
		payouts: payoutRows,
		counts,
		connected: true,
		currency,
		totals: {
			chargedCents: succeeded.reduce((s, c) => s + c.amount, 0),
			refundedCents: refunds.reduce((s, r) => s + r.amount, 0),
			feeCents: succeeded.reduce(
				(s, c) =>
					s + (typeof c.balance_transaction === 'object' ? (c.balance_transaction?.fee ?? 0) : 0),
				0
			),
			paidOutCents: payouts.reduce((s, p) => s + p.amount, 0)
		}
	};
}
