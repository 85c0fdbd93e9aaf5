import { and, asc, eq } from 'drizzle-orm';
import type { PriceBook } from '../../../estimating';
import { engineItem } from '../../../schemas/price-book';
import { priceItem } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';

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

/** A write the engine's schema refused; `issues` name each bad field of the engine's shape. */
export class InvalidPriceItem extends Error {
	constructor(readonly issues: { path: string; message: string }[]) {
		super(
			`The price-book line is not valid: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`
		);
	}
}

/** A second line for a prep kind, existing floor or supply that already has one. */
export class DuplicatePriceItem extends Error {
	constructor(
		readonly section: PriceSection,
		readonly code: string
	) {
		super(`The price book already has a ${section} line for ${code}`);
	}
}

/** The data to store for a line, checked with the engine's schema for its section. */
function checked(section: PriceSection, code: string, name: string, data: unknown) {
	const r = engineItem(section, code, name, data);
	if (!r.ok) {
		throw new InvalidPriceItem(
			r.issues.map((i) => ({ path: ['data', ...i.path].join('.'), message: i.message }))
		);
	}
	return r.data;
}

/** The store's price-book lines, one section or all, by section and name. */
export async function list(tx: StoreTx, section?: PriceSection): Promise<PriceItem[]> {
	return tx
		.select()
		.from(priceItem)
		.where(
			and(
				eq(priceItem.organizationId, tx.storeId),
				section ? eq(priceItem.section, section) : undefined
			)
		)
		.orderBy(asc(priceItem.section), asc(priceItem.name));
}

export async function read(tx: StoreTx, id: string): Promise<PriceItem | undefined> {
	const [row] = await tx
		.select()
		.from(priceItem)
		.where(and(eq(priceItem.organizationId, tx.storeId), eq(priceItem.id, id)));
	return row;
}

/** The line of a section with this code (a prep kind, existing floor or supply kind), if any. */
export async function readByCode(
	tx: StoreTx,
	section: PriceSection,
	code: string
): Promise<PriceItem | undefined> {
	const [row] = await tx
		.select()
		.from(priceItem)
		.where(
			and(
				eq(priceItem.organizationId, tx.storeId),
				eq(priceItem.section, section),
				eq(priceItem.code, code)
			)
		);
	return row;
}

/**
 * A floor's code is its own id (measures refer to it); other sections key by their kind, one line
 * per kind. The data is checked with the engine's schema first: `InvalidPriceItem` when it does
 * not fit, `DuplicatePriceItem` when the kind already has a line. Nothing is written then.
 */
export async function create(tx: StoreWriteTx, input: PriceItemInput): Promise<PriceItem> {
	const id = crypto.randomUUID();
	const code = input.section === 'floor' ? id : input.code;
	const data = checked(input.section, code, input.name, input.data);
	// A second line of a kind is refused without an error inside the transaction, which would
	// spoil the rest of the caller's work.
	const [row] = await tx
		.insert(priceItem)
		.values({ ...input, data, id, code, organizationId: tx.storeId })
		.onConflictDoNothing({
			target: [priceItem.organizationId, priceItem.section, priceItem.code]
		})
		.returning();
	if (!row) throw new DuplicatePriceItem(input.section, code);
	return row;
}

/**
 * Changes a line's name, data or active flag; undefined when it is not the store's. The line as
 * changed is checked with the engine's schema (`InvalidPriceItem`), so a rename cannot break it.
 * Quotes keep their own copy of every price: a sent quote never changes.
 */
export async function update(
	tx: StoreWriteTx,
	id: string,
	input: Partial<Omit<PriceItemInput, 'section' | 'code'>>
): Promise<PriceItem | undefined> {
	const [current] = await tx
		.select()
		.from(priceItem)
		.where(and(eq(priceItem.organizationId, tx.storeId), eq(priceItem.id, id)))
		.for('update');
	if (!current) return undefined;
	const name = input.name ?? current.name;
	const data = checked(current.section, current.code, name, input.data ?? current.data);
	const [row] = await tx
		.update(priceItem)
		.set({ name, active: input.active, data, updatedAt: new Date() })
		.where(and(eq(priceItem.organizationId, tx.storeId), eq(priceItem.id, id)))
		.returning();
	return row;
}

/**
 * Removes a line. Quotes keep their own copy of every price, so sent quotes are untouched; a
 * measure naming a removed floor is told to choose another.
 */
export async function remove(tx: StoreWriteTx, id: string): Promise<boolean> {
	const deleted = await tx
		.delete(priceItem)
		.where(and(eq(priceItem.organizationId, tx.storeId), eq(priceItem.id, id)))
		.returning({ id: priceItem.id });
	return deleted.length > 0;
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
export async function priceBookFor(tx: StoreTx, currency: string): Promise<PriceBook> {
	return toPriceBook(await list(tx), currency);
}
