/**
 * The repairs step: what was measured wrong with the old subfloor (fasteners left behind, holes,
 * open seams, dents) becomes prep, the pieces that close each hole, and the voids to fill.
 */
import { countWithin, LIMITS } from '../limits';
import { holeRepair, type HoleRepair, type Void } from '../takeoff';
import type { CautionEvent, NeedEvent, RoomContext } from './room';

export interface Repairs {
	holes: HoleRepair[];
	/** Open seams, then dents: what the patch fills. */
	voids: Void[];
	needs: NeedEvent[];
	cautions: CautionEvent[];
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
	for (const list of ['holes', 'seams', 'dents'] as const)
		countWithin(rep[list]?.length ?? 0, `${ctx.path}.repairs.${list}`, list, LIMITS.listItems);
	const needs: NeedEvent[] = [];
	const cautions: CautionEvent[] = [];

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
			subfloorThicknessIn: room.subfloor.thicknessIn ?? s.repairs.defaultSubfloorIn,
			joistSpacingIn: ctx.spacingIn,
			joistThicknessIn: s.repairs.joistThicknessIn,
			backingLapIn: s.repairs.backingLapIn,
			roughCutAllowanceIn: s.repairs.roughCutAllowanceIn
		});
		holes.push(r);
		if (!r.ignored) repaired++;
	}
	if (repaired > 0) {
		needs.push({ kind: 'hole_repair', measures: { each: repaired, room: 1 }, findings: [] });
		cautions.push({ kind: 'dust_tools', roomId: room.id });
	}

	const seams = rep.seams ?? [];
	const dents = rep.dents ?? [];
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
	return { holes, voids: seams.concat(dents), needs, cautions };
}
