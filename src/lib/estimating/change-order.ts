/**
 * Change-order delta: quantities sold against quantities found, line by line, priced from the
 * same price book. Each side is priced with the one rounding rule, and the delta is found −
 * sold, so sold + delta always equals what a fresh quote of the found work would say. Less
 * found than sold gives a credit (a negative line).
 */
import { countWithin, LIMITS } from './limits';
import type { EstimateResult } from './types';
import {
	PriceIndex,
	priceQty,
	refKey,
	taxes,
	type ItemRef,
	type LineGroup,
	type PriceBook
} from './pricing';
import type { Basis } from './prep';
import type { StoreSettings } from './settings';

/** A quantity of one item in one room, in the unit (basis) of its price-book line. */
export interface QuantityItem {
	roomId?: string;
	ref: ItemRef;
	qty: number;
}

export interface DeltaLine {
	key: string;
	roomId?: string;
	ref: ItemRef;
	group: LineGroup;
	description: string;
	basis: Basis;
	soldQty: number;
	foundQty: number;
	deltaQty: number;
	unitCents: number;
	soldCents: number;
	foundCents: number;
	deltaCents: number;
	payDeltaCents: number;
}

export interface ChangeOrder {
	ok: boolean;
	errors: { path: string; roomId?: string; message: string }[];
	lines: DeltaLine[];
	subtotalCents: number;
	taxCents: number;
	totalCents: number;
	payDeltaCents: number;
}

/** The sold quantities of an estimate, in the units of their lines. */
export function soldQuantities(result: EstimateResult): QuantityItem[] {
	return result.lines.map((l) => ({ roomId: l.roomId, ref: l.ref, qty: l.qty }));
}

/** Prices found − sold for every item in either list; unchanged lines are left out. */
export function changeOrder(input: {
	sold: readonly QuantityItem[];
	found: readonly QuantityItem[];
	priceBook: PriceBook;
	settings: StoreSettings;
}): ChangeOrder {
	countWithin(input.sold.length, 'sold', 'items sold', LIMITS.changeOrderItems);
	countWithin(input.found.length, 'found', 'items found', LIMITS.changeOrderItems);
	const index = new PriceIndex(input.priceBook);
	const rows = new Map<string, { roomId?: string; ref: ItemRef; sold: number; found: number }>();
	const take = (items: readonly QuantityItem[], side: 'sold' | 'found') => {
		for (const it of items) {
			const id = `${it.roomId ?? 'job'}|${refKey(it.ref)}`;
			const row = rows.get(id) ?? { roomId: it.roomId, ref: it.ref, sold: 0, found: 0 };
			row[side] += it.qty;
			rows.set(id, row);
		}
	};
	take(input.sold, 'sold');
	take(input.found, 'found');

	const errors: ChangeOrder['errors'] = [];
	const lines: DeltaLine[] = [];
	const soldBy: Record<LineGroup, number> = { material: 0, labour: 0, prep: 0, removal: 0 };
	const foundBy: Record<LineGroup, number> = { material: 0, labour: 0, prep: 0, removal: 0 };
	for (const row of rows.values()) {
		const price = index.resolve(row.ref);
		if (typeof price === 'string') {
			errors.push({ path: 'priceBook', roomId: row.roomId, message: price });
			continue;
		}
		const sold = priceQty(
			{ ref: row.ref, roomId: row.roomId, qty: row.sold },
			price,
			input.settings
		);
		const found = priceQty(
			{ ref: row.ref, roomId: row.roomId, qty: row.found },
			price,
			input.settings
		);
		soldBy[price.group] += sold.line.amountCents;
		foundBy[price.group] += found.line.amountCents;
		const deltaQty = found.line.qty - sold.line.qty;
		if (Math.abs(deltaQty) < 1e-9) continue;
		lines.push({
			key: refKey(row.ref),
			roomId: row.roomId,
			ref: row.ref,
			group: price.group,
			description: price.name,
			basis: price.basis,
			soldQty: sold.line.qty,
			foundQty: found.line.qty,
			deltaQty: Math.round(deltaQty * 10_000) / 10_000,
			unitCents: price.unitCents,
			soldCents: sold.line.amountCents,
			foundCents: found.line.amountCents,
			deltaCents: found.line.amountCents - sold.line.amountCents,
			payDeltaCents: (found.pay?.amountCents ?? 0) - (sold.pay?.amountCents ?? 0)
		});
	}
	const subtotalCents = lines.reduce((t, l) => t + l.deltaCents, 0);
	const tax = (by: Record<LineGroup, number>) =>
		taxes(by, input.settings).reduce((t, x) => t + x.taxCents, 0);
	const taxCents = tax(foundBy) - tax(soldBy);
	return {
		ok: errors.length === 0,
		errors,
		lines,
		subtotalCents,
		taxCents,
		totalCents: subtotalCents + taxCents,
		payDeltaCents: lines.reduce((t, l) => t + l.payDeltaCents, 0)
	};
}
