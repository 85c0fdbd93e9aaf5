import { and, eq, gte, isNotNull, lte } from 'drizzle-orm';
import { formatMoney } from '$lib/format';
import { jobLabel } from '$lib/jobs/status';
import { ledger as ledgerOf } from '$lib/payments/ledger';
import { stripeAccount, termsOf } from '../db/queries/settings';
import * as activity from '../db/queries/stripe-activity';
import { job, payment, refund } from '../db/schema';
import type { StoreTx } from '../db/tenant';

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
	/**
	 * The same figures from the ledger's side, worked out by the one ledger function over the
	 * card payments received and the card refunds made in the period.
	 */
	ledgerTotals: { receivedCents: number; refundedCents: number; feeCents: number };
	connected: boolean;
	/** Paid checkouts that named a payment but did not pay its amount or currency: never taken as paid. */
	mismatches: { paymentId: string; jobId: string; jobLabel: string; note: string }[];
	/** The store's currency, for the totals. */
	currency: string;
}

const iso = (d: Date) => d.toISOString();

/** Where the store's Stripe figures come from: the tables, as of their last sync. */
export interface SyncStatus {
	/** Stripe's activity created before this is all in the tables; webhooks add what follows. */
	syncedUntil: string | null;
	lastRunAt: string | null;
	lastError: string | null;
}

/**
 * Matches the store's Stripe activity between two dates (inclusive) with its ledger, both read
 * from the store's own tables in the caller's transaction: Stripe itself is not asked here (see
 * ./stripe-activity.ts for how the tables are kept).
 */
export async function reconcile(
	tx: StoreTx,
	from: Date,
	to: Date
): Promise<Reconciliation & { sync: SyncStatus }> {
	const empty = { matched: 0, stripe_only: 0, ledger_only: 0, amount_differs: 0 };
	const base = { from: from.toISOString(), to: to.toISOString() };
	const account = await stripeAccount(tx);
	const { currency } = await termsOf(tx);
	const state = await activity.readSync(tx);
	const sync: SyncStatus = {
		syncedUntil: state?.syncedUntil?.toISOString() ?? null,
		lastRunAt: state?.lastRunAt?.toISOString() ?? null,
		lastError: state?.lastError ?? null
	};
	const mismatches = (
		await tx
			.select({ id: payment.id, jobId: payment.jobId, number: job.number, note: payment.mismatch })
			.from(payment)
			.innerJoin(
				job,
				and(eq(job.id, payment.jobId), eq(job.organizationId, payment.organizationId))
			)
			.where(and(eq(payment.organizationId, tx.storeId), isNotNull(payment.mismatch)))
			.orderBy(payment.updatedAt)
			.limit(200)
	).map((m) => ({
		paymentId: m.id,
		jobId: m.jobId,
		jobLabel: jobLabel(m.number),
		note: m.note ?? ''
	}));
	if (!account) {
		return {
			...base,
			mismatches,
			currency,
			sync,
			rows: [],
			payouts: [],
			counts: empty,
			totals: { chargedCents: 0, refundedCents: 0, feeCents: 0, paidOutCents: 0 },
			ledgerTotals: { receivedCents: 0, refundedCents: 0, feeCents: 0 },
			connected: false
		};
	}
	const charges = await activity.chargesIn(tx, from, to);
	const refunds = await activity.refundsIn(tx, from, to);
	const payouts = await activity.payoutsIn(tx, from, to);
	const succeeded = charges.filter((c) => c.status === 'succeeded');
	const cardPayments = await tx
		.select({ p: payment, number: job.number })
		.from(payment)
		.innerJoin(job, and(eq(job.id, payment.jobId), eq(job.organizationId, payment.organizationId)))
		.where(and(eq(payment.organizationId, tx.storeId), eq(payment.method, 'card')));
	const cardRefunds = await tx
		.select({ r: refund })
		.from(refund)
		.innerJoin(
			payment,
			and(eq(payment.id, refund.paymentId), eq(payment.organizationId, refund.organizationId))
		)
		.where(
			and(
				eq(refund.organizationId, tx.storeId),
				eq(payment.method, 'card'),
				gte(refund.createdAt, from),
				lte(refund.createdAt, to)
			)
		);
	const ledger = { cardPayments, cardRefunds: cardRefunds.map((row) => row.r) };
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
		const found =
			byCharge.get(c.id) ?? byIntent.get(c.paymentIntentId ?? '') ?? byId.get(c.paymentId ?? '');
		const common = {
			kind: 'charge' as const,
			at: iso(c.stripeCreated),
			stripeId: c.id,
			stripeCents: c.amountCents,
			stripeFeeCents: c.feeCents,
			currency: c.currency
		};
		if (!found || (found.p.status !== 'succeeded' && found.p.status !== 'refunded')) {
			rows.push({
				...common,
				status: 'stripe_only',
				paymentId: found?.p.id ?? null,
				jobId: found?.p.jobId ?? c.jobId ?? null,
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
		const differs = found.p.amountCents !== c.amountCents;
		const feeDiffers =
			c.feeCents !== null && found.p.feeCents !== null && found.p.feeCents !== c.feeCents;
		rows.push({
			...common,
			status: differs ? 'amount_differs' : 'matched',
			paymentId: found.p.id,
			jobId: found.p.jobId,
			jobLabel: jobLabel(found.number),
			ledgerCents: found.p.amountCents,
			ledgerFeeCents: found.p.feeCents,
			note: differs
				? `Stripe charged ${formatMoney(c.amountCents, c.currency)}, the ledger has ${formatMoney(found.p.amountCents, found.p.currency)}`
				: feeDiffers
					? `Fee differs: Stripe ${formatMoney(c.feeCents ?? 0, c.currency)}, the ledger ${formatMoney(found.p.feeCents ?? 0, found.p.currency)}`
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
		const paid = ours ? byId.get(ours.paymentId) : byIntent.get(s.paymentIntentId ?? '');
		const common = {
			kind: 'refund' as const,
			at: iso(s.stripeCreated),
			stripeId: s.id,
			paymentId: paid?.p.id ?? null,
			jobId: paid?.p.jobId ?? null,
			jobLabel: paid ? jobLabel(paid.number) : null,
			stripeCents: -s.amountCents,
			stripeFeeCents: null,
			ledgerFeeCents: null,
			currency: s.currency
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
		const differs = ours.amountCents !== s.amountCents;
		rows.push({
			...common,
			status: differs ? 'amount_differs' : 'matched',
			ledgerCents: -ours.amountCents,
			note: differs
				? `Stripe refunded ${formatMoney(s.amountCents, s.currency)}, the ledger has ${formatMoney(ours.amountCents, s.currency)}`
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

	const payoutRows: PayoutRow[] = payouts.map((po) => ({
		id: po.id,
		arrival: iso(po.arrivalDate),
		status: po.status,
		currency: po.currency,
		netCents: po.amountCents,
		grossCents: po.grossCents,
		feeCents: po.feeCents,
		refundCents: po.refundCents,
		transactions: po.transactions
	}));

	const inPeriodLedger = ledgerOf({
		quoteTotalCents: 0,
		depositCents: 0,
		payments: ledger.cardPayments.filter((r) => inPeriod(r.p.succeededAt)).map((r) => r.p),
		refunds: ledger.cardRefunds
	});

	const counts = { ...empty };
	for (const r of rows) counts[r.status] += 1;
	return {
		...base,
		rows,
		payouts: payoutRows,
		counts,
		connected: true,
		mismatches,
		currency,
		sync,
		totals: {
			chargedCents: succeeded.reduce((s, c) => s + c.amountCents, 0),
			refundedCents: refunds.reduce((s, r) => s + r.amountCents, 0),
			feeCents: succeeded.reduce((s, c) => s + (c.feeCents ?? 0), 0),
			paidOutCents: payouts.reduce((s, p) => s + p.amountCents, 0)
		},
		ledgerTotals: {
			receivedCents: inPeriodLedger.receivedCents,
			refundedCents: inPeriodLedger.refundLinesCents,
			feeCents: inPeriodLedger.feesCents
		}
	};
}
