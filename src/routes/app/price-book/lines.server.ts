import * as priceBook from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { inStore } from '$lib/server/db/tenant';
import { fieldErrors, refuse } from '$lib/server/forms';
import { formFields } from '$lib/input';
import {
	floorToForm,
	prepToForm,
	removalToForm,
	sectionForm,
	supplyToForm,
	type FloorData,
	type PrepData,
	type PriceSectionName,
	type RemovalData,
	type SupplyData
} from '$lib/schemas/price-book';
import { error, redirect } from '@sveltejs/kit';

/** A line's fields as its form shows them (prices in the store's `currency`). */
export function formValues(item: priceBook.PriceItem, currency: string): Record<string, string> {
	switch (item.section) {
		case 'floor':
			return floorToForm(item.name, item.data as unknown as FloorData, currency);
		case 'prep':
			return prepToForm(item.code, item.name, item.data as unknown as PrepData, currency);
		case 'removal':
			return removalToForm(item.code, item.name, item.data as unknown as RemovalData, currency);
		case 'supply':
			return supplyToForm(item.code, item.name, item.data as unknown as SupplyData, currency);
	}
}

const FIELD_OF_KIND: Record<PriceSectionName, string> = {
	floor: 'name',
	prep: 'kind',
	removal: 'existing',
	supply: 'kind'
};

/**
 * Parses a price-book form for its section, then creates the line (a `section` named) or changes
 * the line `id` names. A refusal keeps what was typed, with each field's message; nothing is
 * written then.
 */
export async function saveLine(
	storeId: string,
	request: Request,
	target: { section: PriceSectionName } | { id: string }
) {
	const form = await request.formData();
	const entries = formFields(form);
	const taken = (section: PriceSectionName) =>
		refuse(form, {
			[FIELD_OF_KIND[section]]: ['This already has a line in the price book: change that one']
		});
	try {
		const saved = await inStore(storeId, async (tx) => {
			const existing = 'id' in target ? await priceBook.read(tx, target.id) : undefined;
			if ('id' in target && !existing) return { kind: 'not_found' } as const;
			const section = existing?.section ?? ('section' in target ? target.section : 'floor');
			// The kind of an existing line is its key: it is not changed by an edit.
			if (existing && section !== 'floor') entries[FIELD_OF_KIND[section]] = existing.code;
			const { currency } = await tradeSettings.termsOf(tx);
			const parsed = sectionForm(section, currency).safeParse(entries);
			if (!parsed.success) return { kind: 'invalid', section, error: parsed.error } as const;
			const input = parsed.data;
			if (existing) {
				const row = await priceBook.update(tx, existing.id, {
					name: input.name,
					data: input.data
				});
				return { kind: 'changed', section, row: row! } as const;
			}
			if (section !== 'floor' && (await priceBook.readByCode(tx, section, input.code))) {
				return { kind: 'taken', section } as const;
			}
			return { kind: 'added', section, row: await priceBook.create(tx, input) } as const;
		});
		switch (saved.kind) {
			case 'not_found':
				error(404, 'Not found');
			// falls through: error() throws
			case 'invalid':
				return refuse(form, fieldErrors(saved.error));
			case 'taken':
				return taken(saved.section);
			case 'changed':
				return { saved: true, id: saved.row.id };
			case 'added':
				redirect(303, `/app/price-book?added=${saved.row.id}#${saved.section}`);
		}
	} catch (e) {
		if (e instanceof priceBook.DuplicatePriceItem) return taken(e.section);
		if (e instanceof priceBook.InvalidPriceItem) {
			return refuse(form, {}, e.issues.map((i) => i.message).join('; '));
		}
		throw e;
	}
}
