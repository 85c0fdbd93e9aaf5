import { and, asc, eq } from 'drizzle-orm';
import type { PriceBook } from '../../../estimating';
import { priceItem } from '../schema';
import { inStore } from '../tenant';

export type PriceSection = (typeof priceItem.$inferSelect)['section'];
export type PriceItem = typeof priceItem.$inferSelect;

/** What a price-book line is made of; `data` is the engine's shape for its section. */
export interface PriceItemInput {
	section: PriceSection;
	code: string;
	name: string;
	active?: boolean;
	/** The engine's object for the section (FloorProduct, PrepPrice, RemovalPrice, SupplyPrice). */
	data: object;
}

/** The store's price-book lines, one section or all, by section and name. */
export async function list(storeId: string, section?: PriceSection): Promise<PriceItem[]> {
	return inStore(storeId, (tx) =>
		tx
			.select()
			.from(priceItem)
			.where(
				and(
					eq(priceItem.organizationId, storeId),
					section ? eq(priceItem.section, section) : undefined
				)
			)
			.orderBy(asc(priceItem.section), asc(priceItem.name))
	);
}

export async function read(storeId: string, id: string): Promise<PriceItem | undefined> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select()
			.from(priceItem)
			.where(and(eq(priceItem.organizationId, storeId), eq(priceItem.id, id)));
		return row;
	});
}

/** A floor's code is its own id (measures refer to it); other sections key by their kind. */
export async function create(storeId: string, input: PriceItemInput): Promise<PriceItem> {
	return inStore(storeId, async (tx) => {
		const id = crypto.randomUUID();
		const code = input.section === 'floor' ? id : input.code;
		const [row] = await tx
			.insert(priceItem)
			.values({
				...input,
				data: input.data as Record<string, unknown>,
				id,
				code,
				organizationId: storeId
			})
			.returning();
		return row;
	});
}

export async function update(
	storeId: string,
	id: string,
	input: Partial<Omit<PriceItemInput, 'section' | 'code'>>
): Promise<PriceItem | undefined> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.update(priceItem)
			.set({
				name: input.name,
				active: input.active,
				data: input.data as Record<string, unknown> | undefined,
				updatedAt: new Date()
			})
			.where(and(eq(priceItem.organizationId, storeId), eq(priceItem.id, id)))
			.returning();
		return row;
	});
}

/**
 * Removes a line. Quotes keep their own copy of every price, so sent quotes are untouched; a
 * measure naming a removed floor is told to choose another.
 */
export async function remove(storeId: string, id: string): Promise<boolean> {
	return inStore(storeId, async (tx) => {
		const deleted = await tx
			.delete(priceItem)
			.where(and(eq(priceItem.organizationId, storeId), eq(priceItem.id, id)))
			.returning({ id: priceItem.id });
		return deleted.length > 0;
	});
}

/** The engine's price book from the store's active lines. */
export function toPriceBook(items: PriceItem[], currency: string): PriceBook {
	const active = items.filter((i) => i.active);
	const of = (section: PriceSection) => active.filter((i) => i.section === section);
	return {
		currency,
		floors: of('floor').map((i) => ({ ...i.data, id: i.id, name: i.name })),
		prep: of('prep').map((i) => ({ ...i.data, kind: i.code, name: i.name })),
		removal: of('removal').map((i) => ({ ...i.data, existing: i.code })),
		supplies: of('supply').map((i) => ({ ...i.data, kind: i.code, name: i.name }))
	} as PriceBook;
}

/** The store's price book as the engine takes it. */
export async function priceBookFor(storeId: string, currency: string): Promise<PriceBook> {
	return toPriceBook(await list(storeId), currency);
}
