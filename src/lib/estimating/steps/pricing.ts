/**
 * The pricing step: items to price become lines in integer cents from the price book (with the
 * installer's pay and the store's cost beside them), and the job's materials are rounded up once
 * for the whole job: cartons and roll length per product, panels, fasteners, patch and leveller.
 * A price that is missing, or priced per a unit the item cannot be counted in, is an error with
 * the path of the field to fix; the other lines still price.
 */
import { LimitError } from '../limits';
import { ceilUnits } from '../math';
import { OPTIONAL_PREP, PREP } from '../prep';
import { priceQty, type PayLine, type PriceIndex, type PriceLine } from '../pricing';
import type { StoreSettings } from '../settings';
import { levellerTakeoff, patchTakeoff, underlaymentTakeoff, type Void } from '../takeoff';
import type { EstimateError, RoomResult } from '../types';
import type {
	CautionEvent,
	HoursEntry,
	ItemRequest,
	PrepNeed,
	RoomContext,
	WorkItem
} from './room';
import { prepHours, SLAB_PATCH } from './schedule';

export interface Priced {
	lines: PriceLine[];
	pay: PayLine[];
	/** Store cost of the lines whose price has one. */
	costCents: number;
	/** False when a material line has no cost in the price book. */
	costComplete: boolean;
	errors: EstimateError[];
	/** The cautions of the requests, tied to their lines where they were priced. */
	cautions: CautionEvent[];
	/** The line each item became, by the item's place in the list (none for an error). */
	itemLines: (PriceLine | undefined)[];
	/** Items the store has switched off (no price-book line): named, never priced. */
	skipped: { roomId?: string; message: string }[];
}

/**
 * Prices items in order. A request with `measures` is priced by the measure its price's basis
 * names; a quantity of zero or less makes no line. `roomName` names the room in messages.
 */
export function priceItems(
	items: readonly WorkItem[],
	index: PriceIndex,
	s: StoreSettings,
	roomName: (roomId: string) => string | undefined
): Priced {
	const out: Priced = {
		lines: [],
		pay: [],
		costCents: 0,
		costComplete: true,
		errors: [],
		cautions: [],
		itemLines: [],
		skipped: []
	};
	for (const item of items) {
		if ('error' in item) {
			out.errors.push(item.error);
			out.itemLines.push(undefined);
			continue;
		}
		const line = priceOne(item, index, s, roomName, out);
		out.itemLines.push(line);
		for (const kind of item.cautions ?? [])
			out.cautions.push({ kind, roomId: item.roomId, lineId: line?.id });
	}
	return out;
}

function priceOne(
	item: ItemRequest,
	index: PriceIndex,
	s: StoreSettings,
	roomName: (roomId: string) => string | undefined,
	out: Priced
): PriceLine | undefined {
	const price = index.resolve(item.ref);
	if (typeof price === 'string' && item.ref.type === 'prep' && OPTIONAL_PREP.has(item.ref.kind)) {
		const name = item.roomId ? roomName(item.roomId) : undefined;
		out.skipped.push({
			roomId: item.roomId,
			message: `Not on the quote: ${PREP[item.ref.kind].label.toLowerCase()}${name !== undefined ? ` in ${name}` : ''} (the price book has no line for "${item.ref.kind}")`
		});
		return undefined;
	}
	if (typeof price === 'string') {
		const name = item.roomId ? roomName(item.roomId) : undefined;
		out.errors.push({
			path: item.path,
			roomId: item.roomId,
			message: name !== undefined ? `${price} (needed in ${name})` : price
		});
		return undefined;
	}
	let qty = item.qty;
	if (item.measures) {
		const m = item.measures[price.basis];
		if (m === undefined) {
			out.errors.push({
				path: item.path,
				roomId: item.roomId,
				message: `"${price.name}" is priced per ${price.basis}, which does not fit ${item.ref.type === 'prep' ? item.ref.kind : 'this item'}`
			});
			return undefined;
		}
		qty = m;
	}
	if (!(qty > 0)) return undefined;
	let priced: ReturnType<typeof priceQty>;
	try {
		priced = priceQty(item, price, s, qty);
	} catch (e) {
		if (e instanceof LimitError) throw new LimitError(item.path, e.limit, e.message);
		throw e;
	}
	out.lines.push(priced.line);
	if (priced.pay) out.pay.push(priced.pay);
	if (priced.costCents !== undefined) out.costCents += priced.costCents;
	else if (priced.line.group === 'material') out.costComplete = false;
	return priced.line;
}

/**
 * The room's prep as items to price, each measured in every unit it can be priced by, hours
 * included (so a price book may price prep by the hour).
 */
export function prepItems(
	needs: readonly PrepNeed[],
	ctx: Pick<RoomContext, 'room' | 'settings'>
): { requests: ItemRequest[]; prep: RoomResult['prep']; hours: HoursEntry[] } {
	const { room, settings: s } = ctx;
	const out = {
		requests: [] as ItemRequest[],
		prep: [] as RoomResult['prep'],
		hours: [] as HoursEntry[]
	};
	for (const p of needs) {
		const h = prepHours(p.kind, p.measures, s);
		p.measures.hour = h;
		out.prep.push({ kind: p.kind, qty: p.measures });
		out.requests.push({
			ref: { type: 'prep', kind: p.kind },
			roomId: room.id,
			qty: 0,
			description: `${PREP[p.kind].label} — ${room.name}`,
			findingIds: p.findings.map((f) => f.id),
			path: 'priceBook.prep',
			measures: p.measures
		});
		// On a slab, cracks and dents are filled after the barrier, with the primer and leveller
		// (common practice; the barrier's data sheet governs): scheduled there, not before it.
		const slab =
			room.subfloor.kind === 'concrete' && (p.kind === 'seam_patch' || p.kind === 'dent_patch');
		out.hours.push([slab ? SLAB_PATCH : p.kind, h]);
	}
	return out;
}

/** What the rooms add up to for the job's order, before rounding. */
export interface JobOrder {
	/** Area with waste by carton product, ft². */
	cartonSqFt: Map<string, number>;
	/** Cut length by roll product, in. */
	rollCutIn: Map<string, number>;
	/** Area under new underlayment, ft². */
	panelSqFt: number;
	voids: Void[];
	levelAreas: { areaSqFt: number; depthIn: number }[];
}

/** The job's materials, rounded up once per product or supply, in a fixed order. */
export function materialItems(
	order: JobOrder,
	index: PriceIndex,
	s: StoreSettings
): { items: WorkItem[]; cautions: CautionEvent[] } {
	const items: WorkItem[] = [];
	const cautions: CautionEvent[] = [];
	for (const [productId, sqFt] of order.cartonSqFt) {
		const p = index.floors.get(productId)!;
		const cartons = ceilUnits(sqFt / p.cartonSqFt!);
		items.push({
			ref: { type: 'floor', productId },
			qty: 0,
			description: `${p.name} — ${cartons} cartons`,
			path: 'priceBook.floors',
			measures: { carton: cartons, sqft: cartons * p.cartonSqFt! }
		});
	}
	for (const [productId, cutIn] of order.rollCutIn) {
		const p = index.floors.get(productId)!;
		const lengthIn = ceilUnits(cutIn / s.roll.orderIncrementIn) * s.roll.orderIncrementIn;
		items.push({
			ref: { type: 'floor', productId },
			qty: 0,
			description: `${p.name} — ${lengthIn / 12} lin ft of ${p.rollWidthIn! / 12} ft roll`,
			path: 'priceBook.floors',
			measures: { roll_linft: lengthIn / 12, roll_sqyd: (lengthIn * p.rollWidthIn!) / 1296 }
		});
	}
	if (order.panelSqFt > 0) {
		const u = underlaymentTakeoff({
			areaSqFt: order.panelSqFt,
			wastePct: s.underlayment.wastePct,
			panel: { widthIn: s.underlayment.panelWidthIn, lengthIn: s.underlayment.panelLengthIn },
			schedule: s.underlayment.schedules[s.underlayment.schedule],
			perBox: index.supplies.get('fastener')?.perBox
		});
		items.push(
			{
				ref: { type: 'supply', kind: 'underlayment_panel' },
				qty: 0,
				description: `Underlayment panels — ${u.panels}`,
				path: 'priceBook.supplies',
				measures: { panel: u.panels, each: u.panels }
			},
			{
				ref: { type: 'supply', kind: 'fastener' },
				qty: 0,
				description: `Underlayment fasteners — ${u.fasteners} (${u.schedule.name})`,
				path: 'priceBook.supplies',
				measures: { each: u.fasteners, box: u.boxes }
			}
		);
		cautions.push({ kind: 'dust_tools' });
	}
	if (order.voids.length > 0) {
		const supply = index.supplies.get('patch');
		if (supply?.container) {
			const t = patchTakeoff({
				voids: order.voids,
				wastePct: s.repairs.patchWastePct,
				container: supply.container
			});
			items.push({
				ref: { type: 'supply', kind: 'patch' },
				qty: 0,
				description: `${supply.name} — ${t.containers}`,
				path: 'priceBook.supplies',
				measures: { container: t.containers, each: t.containers }
			});
		} else
			items.push({
				error: {
					path: 'priceBook.supplies',
					message: supply
						? `${supply.name}: container size is missing`
						: 'No price for supply "patch"'
				}
			});
	}
	if (order.levelAreas.length > 0) {
		const supply = index.supplies.get('leveller');
		if (supply?.bagYieldCuFt) {
			const t = levellerTakeoff({
				areas: order.levelAreas,
				bagYieldCuFt: supply.bagYieldCuFt,
				wastePct: s.repairs.levellerWastePct
			});
			items.push({
				ref: { type: 'supply', kind: 'leveller' },
				qty: 0,
				description: `${supply.name} — ${t.bags} bags`,
				path: 'priceBook.supplies',
				measures: { bag: t.bags, each: t.bags }
			});
		} else
			items.push({
				error: {
					path: 'priceBook.supplies',
					message: supply
						? `${supply.name}: bag yield is missing`
						: 'No price for supply "leveller"'
				}
			});
	}
	return { items, cautions };
}
