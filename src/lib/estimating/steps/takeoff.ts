/**
 * The takeoff step: what a room's floor, its tear-out, its new underlayment, trim and transitions
 * and its patch and leveller come to in units that can be bought, and the install and tear-out
 * work to price. Rounding to whole cartons, rolls, panels and bags happens once for the job in
 * the pricing step; a room's own figures here are for its page.
 */
import { countWithin, LIMITS, placed } from '../limits';
import { ceilUnits } from '../math';
import type { PriceIndex } from '../pricing';
import { ROLL_KINDS } from '../settings';
import { formatLength } from '../units';
import {
	cartonTakeoff,
	levellerTakeoff,
	patchTakeoff,
	rollTakeoff,
	underlaymentTakeoff,
	type HoleRepair,
	type LevellerTakeoff,
	type PatchTakeoff,
	type RollTakeoff,
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
					direction: room.floor?.rollDirection,
					light: room.floor?.light
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
		ctx.newUnderlayment ||
		(room.underlayment !== false && holes.some((h) => !h.ignored && h.needsUnderlayment && wood));
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
	// A bare count of transitions (doorways measured one by one are priced with the extras).
	if (room.transitions && room.transitions > 0 && !(room.doorways && room.doorways.length > 0))
		needs.push({ kind: 'transition', measures: { each: room.transitions }, findings: [] });
	return { underlayment, panelSqFt, needs };
}

const floating = (ctx: Pick<RoomContext, 'product'>) =>
	(ctx.product.fastening ??
		(ctx.product.kind === 'hardwood'
			? 'nailed'
			: ctx.product.kind === 'engineered_wood' || ctx.product.kind === 'laminate'
				? 'floating'
				: 'glued')) as 'nailed' | 'glued' | 'floating';

/** How the room's floor is fastened: the product's own, else by its kind. */
export { floating as fasteningOf };

/** Vinyl this thin or thinner telegraphs what is under it like sheet vinyl (common practice). */
export const THIN_VINYL_MAX_IN = 0.125;

/**
 * The new underlayment's seams and fastener heads are skimmed before a floor that shows them:
 * the kinds the store names (sheet vinyl by default), and thin vinyl (a glued-down plank, or one
 * 1/8 in thick or less). Resilient floors telegraph open seams and fastener heads (TRADE.md
 * "Subfloor repairs", common practice).
 */
export function skims(ctx: Pick<RoomContext, 'product' | 'settings'>): boolean {
	const { product, settings: s } = ctx;
	if ((s.underlayment.skimFor ?? []).includes(product.kind)) return true;
	return (
		product.kind === 'vinyl_plank' &&
		(product.fastening === 'glued' ||
			(product.thicknessIn !== undefined && product.thicknessIn <= THIN_VINYL_MAX_IN + 1e-9))
	);
}

/**
 * The rest of a real install, each a price-book item the store may switch off: baseboard and
 * shoe along the walls less doorways; a transition, reducer or threshold per doorway by the
 * step in floor height (2010 ADA Standards §303, memory: up to 1/4 in vertical, to 1/2 in
 * bevelled) and door undercuts; furniture, appliances, toilets; underlay under floating floors,
 * a 6-mil vapour retarder on slabs, felt or paper under nailed wood; carpet pad, tack strip and
 * seams; tile setting materials and a backer or membrane over wood; stairs per step; haul-away
 * by the area torn out; and the flooring's acclimation wait (common practice unless named).
 */
export function extrasTakeoff(
	ctx: RoomContext,
	roll: RollTakeoff | undefined
): { needs: NeedEvent[]; hours: HoursEntry[]; warnings: string[] } {
	const { room, product, settings: s, shape, wood } = ctx;
	const kind = product.kind;
	const area = shape.areaSqFt;
	const needs: NeedEvent[] = [];
	const hours: HoursEntry[] = [];
	const warnings: string[] = [];
	const none: readonly never[] = [];
	/** An item with its first measure above zero (no list built per call: the engine is hot). */
	const add = (k: NeedEvent['kind'], measures: NeedEvent['measures']) => {
		for (const b in measures) {
			if ((measures[b as keyof typeof measures] ?? 0) > 0)
				needs.push({ kind: k, measures, findings: none });
			return;
		}
	};
	const doorways = room.doorways ?? [];
	if (doorways.length > LIMITS.listItems)
		countWithin(doorways.length, `${ctx.path}.doorways`, 'doorways', LIMITS.listItems);
	let doorsIn = 0;
	for (const d of doorways) doorsIn += d.widthIn;
	const wallLinFt = ceilUnits(Math.max(0, shape.wallPerimeterIn - doorsIn) / 12);

	const base = room.base ?? {};
	if (base.baseboard === 'reset' || base.shoe === 'reset')
		add('base_reset', { linft: wallLinFt, room: 1 });
	if (base.baseboard === 'new') add('base_new', { linft: wallLinFt, room: 1 });
	if (base.shoe === 'new') add('shoe_new', { linft: wallLinFt, room: 1 });

	// Floor height at each doorway: the new floor's build-up against the next room's floor.
	const rules = s.doorways ?? { flushMaxIn: 0.25, bevelMaxIn: 0.5 };
	const buildUpIn =
		product.thicknessIn === undefined
			? undefined
			: product.thicknessIn + (ctx.newUnderlayment ? 0.25 : 0);
	let transitions = 0;
	let reducers = 0;
	let thresholds = 0;
	let undercuts = 0;
	doorways.forEach((d, k) => {
		if (buildUpIn === undefined || d.nextFloorIn === undefined) {
			transitions++;
			return;
		}
		const step = buildUpIn - d.nextFloorIn;
		const rise = Math.abs(step);
		if (rise <= rules.flushMaxIn + 1e-9) transitions++;
		else if (rise <= rules.bevelMaxIn + 1e-9) reducers++;
		else {
			thresholds++;
			warnings.push(
				`Doorway ${k + 1}: the new floor is ${formatLength(rise, 'in')} ${step > 0 ? 'above' : 'below'} the next room's; more than ${formatLength(rules.bevelMaxIn, 'in')} needs a ramped threshold (2010 ADA Standards §303.4, memory)`
			);
		}
		if (d.door && step > 1e-9) undercuts++;
	});
	add('transition', { each: transitions });
	add('reducer', { each: reducers });
	add('threshold', { each: thresholds });
	add('door_undercut', { each: undercuts });
	if (room.furniture) add('furniture', { room: 1, each: 1 });
	add('appliance_reset', { each: room.appliances ?? 0 });
	add('toilet_reset', { each: room.toilets ?? 0 });
	add('stairs', { each: room.stairs ?? 0 });

	// What goes under and with the floor.
	const fastening = floating(ctx);
	if (kind === 'ceramic_tile' || kind === 'stone_tile') {
		add('tile_setting', { sqft: area, room: 1 });
		if (wood) add('tile_backer', { sqft: area, room: 1 });
	}
	const underlay = product.needs?.underlay ?? (fastening === 'floating' && kind !== 'vinyl_plank');
	if (underlay) add('underlay', { sqft: area, room: 1 });
	if (!wood && fastening === 'floating' && kind !== 'carpet' && kind !== 'sheet_vinyl')
		add('vapour_retarder', { sqft: area, room: 1 });
	if (wood && fastening === 'nailed') add('felt_paper', { sqft: area, room: 1 });
	if (kind === 'carpet') {
		add('carpet_pad', { sqft: area, room: 1 });
		add('tack_strip', { linft: wallLinFt, room: 1 });
		if (roll && roll.seamLengthIn > 0)
			add('carpet_seam', { linft: roll.seamLengthIn / 12, each: roll.seams, room: 1 });
	}
	if (ctx.newUnderlayment && skims(ctx)) add('underlayment_skim', { sqft: area, room: 1 });
	const layers = room.remove?.length ?? 0;
	if (layers > 0) add('haul_away', { sqft: area * layers, room: 1 });
	const acclimation = s.schedule.acclimationHours?.[kind] ?? 0;
	if (acclimation > 0) hours.push(['wait:acclimation', acclimation]);
	return { needs, hours, warnings };
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
