/**
 * What the estimate's steps pass to each other: one room with everything a step reads about it,
 * the prep it asks for, the items to price, the cautions it raises and the hours it adds. Steps
 * are pure: they read a `RoomContext` and return these; `estimate()` folds them in room order.
 */
import type { CautionKind } from '../cautions';
import type { RoomShape } from '../geometry';
import type { FloorProduct, ItemRef } from '../pricing';
import type { Measures, PrepKind } from '../prep';
import type { StoreSettings } from '../settings';
import type { EstimateError, Finding, RoomMeasure } from '../types';

/** One room, valid in shape and with a floor from the price book, ready for its steps. */
export interface RoomContext {
	room: RoomMeasure;
	/** `job.rooms.<i>`: where its fields are in the input. */
	path: string;
	shape: RoomShape;
	product: FloorProduct;
	/** `priceBook.floors.<k>`: where its floor's fields are in the input. */
	productPath: string;
	settings: StoreSettings;
	/** Year the house was built, if known (asbestos caution). */
	builtYear?: number;
	/** Anything but concrete. */
	wood: boolean;
	/** Joist spacing as measured, or the store's assumption. */
	spacingIn: number;
	/** The spacing is the store's assumption: say so, never state it as found. */
	spacingAssumed: boolean;
	/** New underlayment panels go over the subfloor (room, floor or store default). */
	newUnderlayment: boolean;
}

/** The room as the steps see it; `undefined` for fields a missing joist measure leaves out. */
export function roomContext(
	room: RoomMeasure,
	i: number,
	shape: RoomShape,
	product: FloorProduct,
	productIndex: number,
	settings: StoreSettings,
	builtYear: number | undefined
): RoomContext {
	const wood = room.subfloor.kind !== 'concrete';
	return {
		room,
		path: `job.rooms.${i}`,
		shape,
		product,
		productPath: `priceBook.floors.${productIndex}`,
		settings,
		builtYear,
		wood,
		spacingIn: room.joists?.spacingIn ?? settings.repairs.defaultJoistSpacingIn,
		spacingAssumed: room.joists === undefined,
		newUnderlayment:
			wood &&
			(room.underlayment ??
				product.needs?.underlayment ??
				settings.underlayment.requiredFor.includes(product.kind))
	};
}

/** A prep item asked for once: its quantity in every measure it can be priced by. */
export interface NeedEvent {
	kind: PrepKind;
	measures: Measures;
	findings: readonly Finding[];
}

/** A prep item a room needs, after every ask for it is added up. */
export interface PrepNeed {
	kind: PrepKind;
	measures: Measures;
	findings: Finding[];
}

/** Readings add up (each low spot, each missing test); whole-room fixes count once. */
const ADDITIVE = new Set<PrepKind>(['level', 'grind', 'moisture_test']);

/**
 * Adds up the asks for each prep kind, in the order each kind was first asked for. A kind asked
 * for once keeps its ask's own `measures` object; one asked for again gets a new one.
 */
export function mergeNeeds(events: readonly NeedEvent[]): PrepNeed[] {
	const needs: PrepNeed[] = [];
	/** The events whose `measures` each need still holds as its own. */
	const firsts: Measures[] = [];
	for (const e of events) {
		let k = 0;
		while (k < needs.length && needs[k].kind !== e.kind) k++;
		const had = needs[k];
		if (!had) {
			needs.push({ kind: e.kind, measures: e.measures, findings: e.findings.slice() });
			firsts.push(e.measures);
			continue;
		}
		if (had.measures === firsts[k]) had.measures = { ...had.measures };
		const additive = ADDITIVE.has(e.kind);
		for (const [b, v] of Object.entries(e.measures) as [keyof Measures, number][])
			had.measures[b] =
				additive && b !== 'room' ? (had.measures[b] ?? 0) + v : Math.max(had.measures[b] ?? 0, v);
		for (const f of e.findings) if (!had.findings.includes(f)) had.findings.push(f);
	}
	return needs;
}

/** A caution raised by a room, a line, or the whole job. */
export interface CautionEvent {
	kind: CautionKind;
	roomId?: string;
	lineId?: string;
}

/** Something to price: quantity `qty`, or the quantity in the price's basis from `measures`. */
export interface ItemRequest {
	ref: ItemRef;
	roomId?: string;
	qty: number;
	description?: string;
	findingIds?: string[];
	/** Where a missing price is reported. */
	path: string;
	measures?: Measures;
	/** Cautions the priced line carries (the room's too when it is not priced). */
	cautions?: CautionKind[];
}

/** Work hours added to a schedule key (`install`, `removal`, a prep kind). */
export type HoursEntry = readonly [key: string, hours: number];

/** An item to price, or a problem found while taking the job's materials off. */
export type WorkItem = ItemRequest | { error: EstimateError };
