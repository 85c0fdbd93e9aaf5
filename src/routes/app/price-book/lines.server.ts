import * as priceBook from '$lib/server/db/queries/price-book';
import * as tradeSettings from '$lib/server/db/queries/settings';
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
 * Parses a price-book form for its section, then creates the line (no `existing`) or changes it.
 * A refusal keeps what was typed, with each field's message; nothing is written then.
 */
export async function saveLine(
	storeId: string,
	section: PriceSectionName,
	request: Request,
	existing?: priceBook.PriceItem
) {
	const form = await request.formData();
	const entries = formFields(form);
	// The kind of an existing line is its key: it is not changed by an edit.
	if (existing && section !== 'floor') entries[FIELD_OF_KIND[section]] = existing.code;
	const parsed = sectionForm(section, await currencyOf(storeId)).safeParse(entries);
	if (!parsed.success) return refuse(form, fieldErrors(parsed.error));
	const input = parsed.data;
	try {
		if (existing) {
			const row = await priceBook.update(storeId, existing.id, {
				name: input.name,
				data: input.data
			});
			if (!row) error(404, 'Not found');
			return { saved: true, id: row.id };
		}
		if (section !== 'floor' && (await priceBook.readByCode(storeId, section, input.code))) {
			return refuse(form, {
				[FIELD_OF_KIND[section]]: ['This already has a line in the price book: change that one']
			});
		}
		const row = await priceBook.create(storeId, input);
		redirect(303, `/app/price-book?added=${row.id}#${section}`);
	} catch (e) {
		if (e instanceof priceBook.DuplicatePriceItem) {
			return refuse(form, {
				[FIELD_OF_KIND[section]]: ['This already has a line in the price book: change that one']
			});
		}
		if (e instanceof priceBook.InvalidPriceItem) {
			return refuse(form, {}, e.issues.map((i) => i.message).join('; '));
		}
		throw e;
	}
}

/** The store's currency for showing prices. */
export async function currencyOf(storeId: string) {
	return (await tradeSettings.read(storeId)).currency;
}
