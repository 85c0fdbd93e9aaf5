import { majorText } from '$lib/format';
import * as statements from '$lib/server/db/queries/statements';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { error } from '@sveltejs/kit';
import { stringify } from 'csv-stringify/sync';
import type { RequestHandler } from './$types';

/** One statement as CSV: a row per line, then the total. Amounts in the currency's main unit. */
export const GET: RequestHandler = async ({ params }) => {
	const { store } = requirePermission({ statement: ['read'] });
	const found = await readInStore(store.id, async (tx) => {
		const row = await statements.read(tx, params.id);
		return row && { ...row, lines: await statements.lines(tx, params.id) };
	});
	if (!found) error(404, 'Not found');
	const { statement: s, installerName, lines } = found;
	const money = (cents: number) => majorText(cents, s.currency);
	// Typed text that a spreadsheet would run as a formula is kept as text (OWASP, CSV injection).
	const text = (v: string) => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v);
	const rows = [
		[
			'installer',
			'period_start',
			'period_end',
			'kind',
			'job',
			'description',
			'reason',
			'currency',
			'amount'
		],
		...lines.map((l) => [
			installerName,
			s.periodStart,
			s.periodEnd,
			l.kind,
			l.jobNumber ? `J-${l.jobNumber}` : '',
			text(l.description),
			text(l.reason),
			s.currency,
			money(l.amountCents)
		]),
		[
			installerName,
			s.periodStart,
			s.periodEnd,
			'total',
			'',
			s.status === 'paid' ? `Paid: ${s.paidReference}` : 'Open',
			'',
			s.currency,
			money(s.totalCents)
		]
	];
	const name = installerName.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'installer';
	return new Response(stringify(rows), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="statement-${name}-${s.periodStart}.csv"`,
			'cache-control': 'private, no-store'
		}
	});
};
