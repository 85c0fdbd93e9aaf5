import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { reconcile } from '$lib/server/payments/reconcile';
import { majorText } from '$lib/format';
import { stringify } from 'csv-stringify/sync';
import type { RequestHandler } from './$types';
import { periodOf } from '../period';

/** The period's reconciliation as CSV (from the store's tables): each charge or refund, then the payouts. */
export const GET: RequestHandler = async ({ url }) => {
	const { store } = requirePermission({ payment: ['reconcile'] });
	const period = periodOf(url);
	const report = await readInStore(store.id, (tx) => reconcile(tx, period.from, period.to));
	const lines = [
		[
			'kind',
			'status',
			'date',
			'job',
			'stripe_id',
			'payment_id',
			'currency',
			'stripe_amount',
			'ledger_amount',
			'stripe_fee',
			'ledger_fee',
			'note'
		],
		...report.rows.map((r) => {
			const cents = (v: number | null) => (v === null ? '' : majorText(v, r.currency));
			return [
				r.kind,
				r.status,
				r.at,
				r.jobLabel ?? '',
				r.stripeId ?? '',
				r.paymentId ?? '',
				r.currency,
				cents(r.stripeCents),
				cents(r.ledgerCents),
				cents(r.stripeFeeCents),
				cents(r.ledgerFeeCents),
				r.note
			];
		}),
		...report.payouts.map((p) => {
			const cents = (v: number | null) => (v === null ? '' : majorText(v, p.currency));
			return [
				'payout',
				p.status,
				p.arrival,
				'',
				p.id,
				'',
				p.currency,
				cents(p.netCents),
				'',
				cents(p.feeCents),
				'',
				`${p.transactions} transactions, gross ${cents(p.grossCents)}, refunds ${cents(p.refundCents)}`
			];
		})
	];
	return new Response(stringify(lines), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="reconciliation-${period.fromDay}-to-${period.toDay}.csv"`,
			'cache-control': 'private, no-store'
		}
	});
};
