/**
 * The repairs step: what was measured wrong with the old subfloor (fasteners left behind, holes,
 * open seams, dents) becomes prep, the pieces that close each hole, and the voids to fill.
 */
import { countWithin, LIMITS } from '../limits';
import { holeRepair, type HoleRepair, type Void } from '../takeoff';
import type { CautionEvent, NeedEvent, RoomContext } from './room';
import { fasteningOf } from './takeoff';

/**
 * What lies between the old wood subfloor and the new floor and covers its open seams and
 * dents, if anything: new underlayment panels, a tile backer or membrane, carpet pad, the
 * underlay of a floating floor, or a nailed wood floor over felt. Only where the floor goes
 * straight onto the subfloor (resilient or glued floors) are they filled (TRADE.md "Subfloor
 * repairs": resilient floors telegraph them; common practice).
 */
export function seamCover(
	ctx: Pick<RoomContext, 'newUnderlayment' | 'wood' | 'product'>
): string | undefined {
	if (ctx.newUnderlayment) return 'the new underlayment';
	if (!ctx.wood) return undefined;
	const { product } = ctx;
	const kind = product.kind;
	if (kind === 'ceramic_tile' || kind === 'stone_tile') return 'the backer board or membrane';
	if (kind === 'carpet') return 'the carpet pad';
	const fastening = fasteningOf(ctx);
	if (fastening === 'nailed') return 'the nailed wood floor';
	if (product.needs?.underlay ?? (fastening === 'floating' && kind !== 'vinyl_plank'))
		return 'the floating floor’s underlay';
	return undefined;
}

export interface Repairs {
	holes: HoleRepair[];
	/** Open seams, then dents: what the patch fills. */
	voids: Void[];
	needs: NeedEvent[];
	cautions: CautionEvent[];
	warnings: string[];
}

/**
 * Fasteners to pull (the whole room or an area), holes closed by the floor's method (backing for
 * nailed wood, blocking for glued or floating wood; the store's method by floor otherwise;
 * TRADE.md "Subfloor repairs", common practice), seams and dents to patch.
 */
export function repairsStep(ctx: RoomContext): Repairs {
	const { room, product, settings: s, shape } = ctx;
	const kind = product.kind;
	const area = shape.areaSqFt;
	const rep = room.repairs ?? {};
	for (const list of ['holes', 'seams', 'dents'] as const) {
		const n = rep[list]?.length ?? 0;
		// the path is only written out for a refusal (this runs for every room)
		if (n > LIMITS.listItems) countWithin(n, `${ctx.path}.repairs.${list}`, list, LIMITS.listItems);
	}
	const needs: NeedEvent[] = [];
	const cautions: CautionEvent[] = [];
	const warnings: string[] = [];
	const declined = room.underlayment === false;
	const subfloorIn = room.subfloor.thicknessIn ?? s.repairs.defaultSubfloorIn;
	/** Small holes filled with patch, and the joints of infills no underlayment covers. */
	const patchVoids: Void[] = [];

	if (rep.fasteners) {
		const a = rep.fasteners === true ? area : Math.min(area, rep.fasteners.areaSqFt);
		needs.push({ kind: 'fastener_removal', measures: { sqft: a, room: 1 }, findings: [] });
	}

	// Backing gives nailed wood something to nail into; glued or floating wood gets blocking.
	const woodFloor = kind === 'hardwood' || kind === 'engineered_wood';
	const nailed = (product.fastening ?? (kind === 'hardwood' ? 'nailed' : 'floating')) === 'nailed';
	const method = woodFloor && !nailed ? 'blocking' : s.repairs.holeMethod[kind];
	const holes: HoleRepair[] = [];
	let repaired = 0;
	for (const h of rep.holes ?? []) {
		const r = holeRepair({
			widthIn: h.widthIn,
			lengthIn: h.lengthIn,
			method,
			newUnderlayment: ctx.newUnderlayment,
			ignoreUnderIn: s.repairs.ignoreHoleUnderIn,
			// An infill is cut from subfloor-thickness plywood, never from the underlayment.
			subfloorThicknessIn: subfloorIn,
			joistSpacingIn: ctx.spacingIn,
			joistThicknessIn: s.repairs.joistThicknessIn,
			backingLapIn: s.repairs.backingLapIn,
			roughCutAllowanceIn: s.repairs.roughCutAllowanceIn,
			underlaymentDeclined: declined
		});
		holes.push(r);
		if (r.patched)
			patchVoids.push({ lengthIn: h.lengthIn, widthIn: h.widthIn, depthIn: subfloorIn });
		else if (!r.ignored) {
			repaired++;
			// Under a floor that wanted underlayment the customer declined, the infill's joints are
			// skimmed flush instead (TRADE.md: resilient floors telegraph open seams).
			if (declined && r.method === 'blocking_underlayment')
				patchVoids.push({
					lengthIn: 2 * (h.widthIn + h.lengthIn),
					widthIn: 0.125,
					depthIn: 0.0625
				});
		}
	}
	if (repaired > 0) {
		needs.push({ kind: 'hole_repair', measures: { each: repaired, room: 1 }, findings: [] });
		cautions.push({ kind: 'dust_tools', roomId: room.id });
		if (ctx.spacingAssumed)
			warnings.push(
				`Joists were not measured: blocking and backing are cut for ${ctx.spacingIn} in o.c. (assumed, not found); confirm on site`
			);
	}
	if (declined && holes.some((h) => !h.ignored && h.method === 'blocking_underlayment'))
		warnings.push(
			'Underlayment declined: holes are blocked with a flush infill and its joints skimmed; no underlayment is added'
		);

	// What goes over the old subfloor covers its open seams and dents: they are filled only
	// where the floor goes straight onto it (TRADE.md "Subfloor repairs", common practice).
	const cover = seamCover(ctx);
	const covered = cover !== undefined;
	const seams = covered ? [] : (rep.seams ?? []);
	const dents = (covered ? [] : (rep.dents ?? [])).concat(patchVoids);
	if (covered && ((rep.seams?.length ?? 0) > 0 || (rep.dents?.length ?? 0) > 0))
		warnings.push(
			`Open seams and dents in the old subfloor are covered by ${cover}: not filled, not charged`
		);
	if (seams.length > 0)
		needs.push({
			kind: 'seam_patch',
			measures: {
				linft: seams.reduce((t, v) => t + v.lengthIn, 0) / 12,
				each: seams.length,
				room: 1
			},
			findings: []
		});
	if (dents.length > 0)
		needs.push({
			kind: 'dent_patch',
			measures: {
				each: dents.length,
				sqft: dents.reduce((t, v) => t + v.lengthIn * v.widthIn, 0) / 144,
				room: 1
			},
			findings: []
		});
	return { holes, voids: seams.concat(dents), needs, cautions, warnings };
}
