/**
 * The takeoff step: what a room's floor, its tear-out, its new underlayment, trim and transitions
 * and its patch and leveller come to in units that can be bought, and the install and tear-out
 * work to price. Rounding to whole cartons, rolls, panels and bags happens once for the job in
 * the pricing step; a room's own figures here are for its page.
 */
import { placed } from '../limits';
import { ceilUnits } from '../math';
import type { PriceIndex } from '../pricing';
import { ROLL_KINDS } from '../settings';
import {
	cartonTakeoff,
	levellerTakeoff,
	patchTakeoff,
	rollTakeoff,
	underlaymentTakeoff,
	type HoleRepair,
	type LevellerTakeoff,
	type PatchTakeoff,
	type UnderlaymentTakeoff,
	type Void
} from '../takeoff';
import type { EstimateError, RoomResult } from '../types';
import type { HoursEntry, ItemRequest, NeedEvent, RoomContext } from './room';

/** Tear-out of these in an older house carries the asbestos caution (TRADE.md "Cautions"). */
const ASBESTOS_FLOORS = new Set(['sheet_vinyl', 'vinyl_tile', 'ceramic_tile', 'hardwood_glued']);

export type FloorTakeoff =
	| {
			ok: true;
			floor: NonNullable<RoomResult['floor']>;
			/** What the room adds to the job's order: area with waste, or roll cut length. */
			order: { productId: string; cartonSqFt?: number; rollCutIn?: number };
			/** The install and each tear-out, in that order. */
			requests: ItemRequest[];
			hours: HoursEntry[];
	  }
	| { ok: false; error: EstimateError };

/**
 * The room's floor (cartons with the layout's waste, or roll drops), its install and the floors
 * torn out. A roll product without a width or a carton product without its coverage stops the
 * room here.
 */
export function floorTakeoff(ctx: RoomContext): FloorTakeoff {
	const { room, product, productPath, settings: s, shape, path } = ctx;
	const kind = product.kind;
	const area = shape.areaSqFt;
	let floor: NonNullable<RoomResult['floor']>;
	let order: { productId: string; cartonSqFt?: number; rollCutIn?: number };
	if (ROLL_KINDS.includes(kind)) {
		if (!(product.rollWidthIn && product.rollWidthIn > 0))
			return {
				ok: false,
				error: {
					path: `${productPath}.rollWidthIn`,
					roomId: room.id,
					message: `${product.name}: roll width is missing`
				}
			};
		const rollWidthIn = product.rollWidthIn;
		const roll = placed(
			() =>
				rollTakeoff({
					polygon: shape.polygon,
					isRect: shape.isRect,
					rollWidthIn,
					trimPerEndIn: s.roll.trimPerEndIn,
					orderIncrementIn: s.roll.orderIncrementIn,
					direction: room.floor?.rollDirection
				}),
			(field) =>
				field === 'rollWidthIn'
					? `${productPath}.rollWidthIn`
					: field === 'polygon'
						? `${path}.shape`
						: `settings.roll.${field}`
		);
		floor = { productId: product.id, kind, roll };
		order = { productId: product.id, rollCutIn: roll.cutLengthIn };
	} else {
		if (!(product.cartonSqFt && product.cartonSqFt > 0))
			return {
				ok: false,
				error: {
					path: `${productPath}.cartonSqFt`,
					roomId: room.id,
					message: `${product.name}: carton coverage is missing`
				}
			};
		const cartons = cartonTakeoff({
			areaSqFt: area,
			wastePct: s.wastePct[room.floor!.layout],
			coverageSqFt: product.cartonSqFt
		});
		floor = { productId: product.id, kind, cartons };
		order = { productId: product.id, cartonSqFt: cartons.neededSqFt };
	}

	const requests: ItemRequest[] = [
		{
			ref: { type: 'install', productId: product.id },
			roomId: room.id,
			qty: area,
			description: `Install ${product.name} — ${room.name}`,
			path: `${productPath}.labourCentsPerSqFt`
		}
	];
	const hours: HoursEntry[] = [
		['install', (area / s.schedule.crewSqFtPerDay[kind]) * s.schedule.workdayHours]
	];
	const oldHouse = ctx.builtYear === undefined || ctx.builtYear < s.asbestosBuiltBefore;
	(room.remove ?? []).forEach((existing, k) => {
		requests.push({
			ref: { type: 'removal', existing },
			roomId: room.id,
			qty: 1,
			description: `Remove ${existing.replace(/_/g, ' ')} — ${room.name}`,
			path: `${path}.remove.${k}`,
			measures: { sqft: area, room: 1 },
			cautions:
				ASBESTOS_FLOORS.has(existing) && oldHouse ? ['dust_tools', 'asbestos'] : ['dust_tools']
		});
		hours.push(['removal', area / s.schedule.removalSqFtPerHour]);
	});
	return { ok: true, floor, order, requests, hours };
}

/**
 * New underlayment panels (where the floor needs them or a resilient floor's hole repair calls
 * for them), trim along every edge of the floor, and transition strips.
 */
export function coverTakeoff(
	ctx: RoomContext,
	holes: readonly HoleRepair[]
): { underlayment?: UnderlaymentTakeoff; panelSqFt: number; needs: NeedEvent[] } {
	const { room, settings: s, shape, wood } = ctx;
	const area = shape.areaSqFt;
	const needs: NeedEvent[] = [];
	let underlayment: UnderlaymentTakeoff | undefined;
	let panelSqFt = 0;
	const underlay =
		ctx.newUnderlayment || holes.some((h) => !h.ignored && h.needsUnderlayment && wood);
	if (underlay) {
		underlayment = underlaymentTakeoff({
			areaSqFt: area,
			wastePct: s.underlayment.wastePct,
			panel: { widthIn: s.underlayment.panelWidthIn, lengthIn: s.underlayment.panelLengthIn },
			schedule: s.underlayment.schedules[s.underlayment.schedule]
		});
		panelSqFt = area;
		needs.push({
			kind: 'underlayment',
			measures: { sqft: area, panel: underlayment.panels, room: 1 },
			findings: []
		});
	}
	if (room.trim)
		needs.push({
			kind: 'trim',
			measures: { linft: ceilUnits(shape.perimeterIn / 12), room: 1 },
			findings: []
		});
	if (room.transitions && room.transitions > 0)
		needs.push({ kind: 'transition', measures: { each: room.transitions }, findings: [] });
	return { underlayment, panelSqFt, needs };
}

/** The room's own patch and leveller, when the price book says what a container or bag holds. */
export function supplyTakeoff(
	voids: readonly Void[],
	levelAreas: readonly { areaSqFt: number; depthIn: number }[],
	index: PriceIndex,
	ctx: Pick<RoomContext, 'settings'>
): { patch?: PatchTakeoff; leveller?: LevellerTakeoff } {
	const s = ctx.settings;
	const out: { patch?: PatchTakeoff; leveller?: LevellerTakeoff } = {};
	const container = index.supplies.get('patch')?.container;
	if (voids.length > 0 && container)
		out.patch = patchTakeoff({ voids, wastePct: s.repairs.patchWastePct, container });
	const bagYieldCuFt = index.supplies.get('leveller')?.bagYieldCuFt;
	if (levelAreas.length > 0 && bagYieldCuFt)
		out.leveller = levellerTakeoff({
			areas: levelAreas,
			bagYieldCuFt,
			wastePct: s.repairs.levellerWastePct
		});
	return out;
}
