import { refKey, type ItemRef } from '$lib/estimating/pricing';
import type { Basis } from '$lib/estimating/prep';
import { FLOOR_KINDS } from '$lib/estimating/settings';
import type { FloorKind } from '$lib/estimating';
import { readMoney, readNumber } from '$lib/input';
import type { profileSchema } from '$lib/schemas/crew';
import { WEEKDAY_FIELDS } from '$lib/schemas/crew';
import type { z } from 'zod';
import type { FieldErrors } from '../forms';
import * as priceBook from '../db/queries/price-book';
import type { ProfileInput } from '../db/queries/installers';
import type { StoreTx } from '../db/tenant';

/** A price-book item an installer is paid on, with the book's own pay per unit. */
export interface PayItem {
	key: string;
	ref: ItemRef;
	name: string;
	basis: Basis;
	bookPayCents: number;
}

/** The items of the store's book that carry installer pay: laying each floor, prep, tear-out. */
export async function payItems(tx: StoreTx, currency: string): Promise<PayItem[]> {
	const book = await priceBook.priceBookFor(tx, currency);
	const items: PayItem[] = [];
	for (const f of book.floors) {
		const ref: ItemRef = { type: 'install', productId: f.id };
		items.push({
			key: refKey(ref),
			ref,
			name: `Install ${f.name}`,
			basis: 'sqft',
			bookPayCents: f.payCentsPerSqFt
		});
	}
	for (const p of book.prep) {
		const ref: ItemRef = { type: 'prep', kind: p.kind };
		items.push({
			key: refKey(ref),
			ref,
			name: p.name ?? p.kind.replace(/_/g, ' '),
			basis: p.basis,
			bookPayCents: p.payCents
		});
	}
	for (const r of book.removal) {
		const ref: ItemRef = { type: 'removal', existing: r.existing };
		items.push({
			key: refKey(ref),
			ref,
			name: `Tear out ${r.existing.replace(/_/g, ' ')}`,
			basis: r.basis,
			bookPayCents: r.payCents
		});
	}
	return items;
}

/** Largest own rate: 100,000.00 per unit. */
const MAX_RATE_CENTS = 10_000_000;

/**
 * The profile form's values as the profile stores them, or each field's problem. Kinds and
 * weekdays are read from our own lists; a rate row names an item by its key, looked up in the
 * book's items (a row for an item no longer in the book is dropped).
 */
export function profileFromForm(
	form: z.output<typeof profileSchema>,
	items: PayItem[],
	currency: string
): { ok: true; value: ProfileInput } | { ok: false; errors: FieldErrors } {
	const errors: FieldErrors = {};
	const floorKinds = FLOOR_KINDS.filter((k) => Boolean(form.kinds[k]));
	const daysOff = WEEKDAY_FIELDS.flatMap((d, i) => (form.off[d] ? [i + 1] : []));
	const sqFtPerDay: Partial<Record<FloorKind, number>> = {};
	for (const k of FLOOR_KINDS) {
		const typed = form.output[k];
		if (!typed) continue;
		const r = readNumber(typed, {
			label: 'the output',
			units: ['ft²', 'sqft'],
			above: 0,
			max: 20_000
		});
		if (r.ok) sqFtPerDay[k] = r.value;
		else errors[`output.${k}`] = [r.message];
	}
	const byKey = new Map(items.map((i) => [i.key, i]));
	const payRates: ProfileInput['payRates'] = [];
	const seen = new Set<string>();
	form.rates.forEach((row, i) => {
		const item = row && byKey.get(row.key);
		if (!row || !item || !row.pay || seen.has(item.key)) return;
		seen.add(item.key);
		const r = readMoney(row.pay, currency, { label: 'the pay', max: MAX_RATE_CENTS });
		if (r.ok) payRates.push({ ref: item.ref, payCents: r.value });
		else errors[`rates.${i}.pay`] = [r.message];
	});
	if (Object.keys(errors).length) return { ok: false, errors };
	return {
		ok: true,
		value: {
			crewSize: form.crewSize,
			floorKinds,
			sqFtPerDay,
			payRates,
			daysOff,
			phone: form.phone,
			notes: form.notes
		}
	};
}
