import {
	changeOrder as priceChangeOrder,
	LimitError,
	refKey,
	soldQuantities,
	type ChangeOrder,
	type ItemRef,
	type PriceBook,
	type QuantityItem
} from '$lib/estimating';
import { canRaiseChangeOrder } from '$lib/jobs/status';
import * as changeOrders from '../db/queries/change-orders';
import * as jobs from '../db/queries/jobs';
import { priceBookFor } from '../db/queries/price-book';
import * as tradeSettings from '../db/queries/settings';
import { InvalidStoreSettings } from '../db/queries/settings';
import * as quotes from '../db/queries/quotes';
import type { ChangeOrderInput, InstallerPayRate } from '../db/schema';
import type { StoreWriteTx } from '../db/tenant';
import { changeOrderFigures } from './figures';

export type FromReportResult =
	| {
			ok: true;
			/** What happened to the job's open change order. */
			outcome: 'created' | 'updated' | 'removed' | 'unchanged';
			changeOrder: changeOrders.ChangeOrderRow | null;
	  }
	| {
			ok: false;
			reason:
				| 'not_found'
				| 'not_open'
				| 'no_quote'
				| 'settings'
				| 'with_customer'
				| 'unpriced'
				| 'too_large';
			errors?: ChangeOrder['errors'];
			message?: string;
	  };

const place = (roomId: string | null | undefined, key: string) => `${roomId ?? 'job'}|${key}`;

/**
 * The found list of a change order: the baseline (what the customer has agreed to so far) with
 * each live found item put in place of its room and item. A found item is the whole amount found
 * there (DEVELOPERS.md, `field_item`), so it replaces what was sold rather than adding to it; `0`
 * means none was needed.
 */
export function foundQuantities(
	baseline: readonly QuantityItem[],
	found: readonly { roomId: string | null; ref: ItemRef | null; qty: number | null }[]
): QuantityItem[] {
	const replaced = new Map<string, QuantityItem>();
	for (const f of found) {
		if (!f.ref || f.qty === null) continue;
		const item: QuantityItem = { ref: f.ref, qty: f.qty };
		if (f.roomId) item.roomId = f.roomId;
		replaced.set(place(f.roomId, refKey(f.ref)), item);
	}
	const out: QuantityItem[] = [];
	for (const b of baseline) {
		if (!replaced.has(place(b.roomId, refKey(b.ref)))) out.push(b);
	}
	return [...out, ...replaced.values()];
}

/**
 * The price book with the installer's own pay put in place of the book's, item by item (the
 * profile's `pay_rates`, DEVELOPERS.md `installer_profile`). Prices and costs are untouched.
 */
export function withPayRates(book: PriceBook, rates: readonly InstallerPayRate[]): PriceBook {
	if (!rates.length) return book;
	const pay = new Map(rates.map((r) => [refKey(r.ref), r.payCents]));
	return {
		...book,
		floors: book.floors.map((f) => {
			const cents = pay.get(refKey({ type: 'install', productId: f.id }));
			return cents === undefined ? f : { ...f, payCentsPerSqFt: cents };
		}),
		prep: book.prep.map((p) => {
			const cents = pay.get(refKey({ type: 'prep', kind: p.kind }));
			return cents === undefined ? p : { ...p, payCents: cents };
		}),
		removal: book.removal.map((r) => {
			const cents = pay.get(refKey({ type: 'removal', existing: r.existing }));
			return cents === undefined ? r : { ...r, payCents: cents };
		})
	};
}

/**
 * Prices what the installer's report found against what was sold and keeps it as the job's open
 * change order, `submitted` for a manager's review; the input is stored whole so every figure can
 * be worked out again.
 *
 * - Sold is the accepted quote's lines, or, after a change order the customer approved, what that
 *   one found (so an approved extra is never billed twice).
 * - Prices and settings are the store's current price book and settings; the installer's pay
 *   rates replace the book's pay where their profile sets one.
 * - Nothing differs: no change order (an open, unsent one is removed).
 * - A report sent again updates the open `submitted` change order (its manager's adjustments
 *   kept) rather than making a second one; once sent to the customer it is no longer changed.
 */
export async function changeOrderFromReport(
	tx: StoreWriteTx,
	reportId: string,
	userId: string
): Promise<FromReportResult> {
	const report = await changeOrders.readReport(tx, reportId);
	if (!report) return { ok: false, reason: 'not_found' };
	const status = await jobs.lockStatus(tx, report.jobId);
	const job = status ? await jobs.readForStore(tx, report.jobId) : undefined;
	if (!status || !job) return { ok: false, reason: 'not_found' };
	if (!canRaiseChangeOrder(status)) return { ok: false, reason: 'not_open' };
	const quote = await quotes.accepted(tx, job.id);
	if (!quote) return { ok: false, reason: 'no_quote' };

	let trade: tradeSettings.StoreTradeSettings;
	try {
		trade = await tradeSettings.read(tx);
	} catch (e) {
		if (e instanceof InvalidStoreSettings) return { ok: false, reason: 'settings' };
		throw e;
	}
	const all = await changeOrders.listForJob(tx, job.id);
	const lastApproved = all.find((c) => c.status === 'approved');
	const sold = lastApproved ? lastApproved.input.found : soldQuantities(quote.result);
	const found = foundQuantities(sold, await changeOrders.liveFoundItems(tx, report.id));
	const rates = job.installerId ? await changeOrders.payRatesOf(tx, job.installerId) : [];
	const input: ChangeOrderInput = {
		sold,
		found,
		priceBook: withPayRates(await priceBookFor(tx, quote.currency), rates),
		settings: trade.settings
	};
	let result: ChangeOrder;
	try {
		result = priceChangeOrder(input);
	} catch (e) {
		if (e instanceof LimitError) return { ok: false, reason: 'too_large', message: e.message };
		throw e;
	}
	if (!result.ok) return { ok: false, reason: 'unpriced', errors: result.errors };

	const open = await changeOrders.lockOpen(tx, job.id);
	if (open && open.status !== 'submitted') return { ok: false, reason: 'with_customer' };
	if (result.lines.length === 0) {
		if (!open) return { ok: true, outcome: 'unchanged', changeOrder: null };
		await changeOrders.remove(tx, open.id);
		return { ok: true, outcome: 'removed', changeOrder: null };
	}
	const adjustments = open?.adjustments ?? [];
	const figures = changeOrderFigures(result, adjustments, trade.settings);
	if (open) {
		const row = await changeOrders.update(tx, open.id, {
			reportId: report.id,
			input,
			result,
			currency: quote.currency,
			...figures
		});
		return { ok: true, outcome: 'updated', changeOrder: row ?? null };
	}
	const row = await changeOrders.insert(tx, {
		jobId: job.id,
		reportId: report.id,
		number: await changeOrders.nextNumber(tx, job.id),
		status: 'submitted',
		input,
		result,
		adjustments,
		currency: quote.currency,
		...figures,
		createdBy: userId
	});
	return { ok: true, outcome: 'created', changeOrder: row };
}
