/**
 * The checks step: the room's joists, sheathing, flatness and moisture against what its floor
 * needs. Each check becomes a finding; a failed one asks for the prep that fixes it. Planning
 * aids, never an engineer's stamp.
 */
import { cautionTexts } from '../cautions';
import type { RoomShape } from '../geometry';
import { countWithin, LIMITS } from '../limits';
import { formatLength } from '../units';
import type { FloorProduct } from '../pricing';
import type { Measures } from '../prep';
import type { FloorKind, StoreSettings } from '../settings';
import {
	flatnessCheck,
	flatnessRules,
	iJoistCheck,
	joistCheck,
	panelMinimumIn,
	panelText,
	mverChecks,
	rhChecks,
	sheathingChecks,
	woodMoistureChecks,
	type Check,
	type SuggestedPrep
} from '../substrate';
import type { Finding } from '../types';
import type { CautionEvent, NeedEvent, RoomContext } from './room';

export interface Checks {
	findings: Finding[];
	needs: NeedEvent[];
	/** Low spots to level: area and average depth. */
	levelAreas: { areaSqFt: number; depthIn: number }[];
	warnings: string[];
	cautions: CautionEvent[];
	/** Moisture tests taken on this room's part of a slab, by kind. */
	slabReadings?: { rh: number; cc: number; needsTests: boolean };
}

function ratioFor(kind: FloorKind, product: FloorProduct, s: StoreSettings): number {
	return product.needs?.deflectionRatio ?? s.joists.ratio[kind] ?? s.joists.defaultRatio;
}

/** Joists under a room: its extent across them ÷ spacing, plus one. */
export function joistCount(
	room: RoomShape,
	runs: 'x' | 'y' | undefined,
	spacingIn: number
): number {
	const { widthIn, lengthIn } = room.bbox;
	const along = runs ?? (widthIn <= lengthIn ? 'x' : 'y');
	const across = along === 'x' ? lengthIn : widthIn;
	return Math.floor(across / spacingIn) + 1;
}

/** Every check the room's measure allows, in a fixed order: joists, sheathing, flatness, moisture. */
export function checksStep(ctx: RoomContext): Checks {
	const { room, product, settings: s, shape, wood } = ctx;
	const kind = product.kind;
	const area = shape.areaSqFt;
	const out: Checks = { findings: [], needs: [], levelAreas: [], warnings: [], cautions: [] };
	const need = (kind: NeedEvent['kind'], measures: Measures, f: Finding) =>
		out.needs.push({ kind, measures, findings: [f] });
	let n = 0;
	const addFinding = (c: Check): Finding => {
		const f: Finding = {
			id: `${room.id}:${c.check}:${n++}`,
			roomId: room.id,
			check: c.check,
			pass: c.pass,
			measured: c.measured,
			limit: c.limit,
			unit: c.unit,
			message: c.message,
			rule: c.rule,
			source: c.source,
			suggestedPrep: c.suggestedPrep,
			cautions: c.cautions,
			cautionTexts: cautionTexts(c.cautions),
			lineIds: []
		};
		out.findings.push(f);
		for (const k of c.cautions) out.cautions.push({ kind: k, roomId: room.id });
		return f;
	};
	/** Each suggested prep of a check, measured by `measure`. */
	const fix = (c: Check, measure: (p: SuggestedPrep) => Measures) => {
		const f = addFinding(c);
		for (const p of c.suggestedPrep) need(p.kind, measure(p), f);
	};

	// Bad input the schema lets through: said plainly, naming the limit (IRC Table R502.3.1(2),
	// published, prints spacings of 12, 16, 19.2 and 24 in; its longest spans are about 26 ft, memory).
	if (room.joists && wood) {
		const { spacingIn, spanIn } = room.joists;
		if (spacingIn < 12 || spacingIn > 24)
			out.warnings.push(
				`Joist spacing ${spacingIn} in is outside 12–24 in, the spacings the IRC span tables print: check the measure`
			);
		if (spanIn > 26 * 12)
			out.warnings.push(
				`A joist span of ${formatLength(spanIn)} is beyond any span the IRC table prints (about 26 ft): check the measure and have a licensed professional confirm`
			);
	}
	if (room.joists?.iJoist && wood) {
		const jm = room.joists;
		const ratio =
			product.needs?.deflectionRatio ?? s.joists.iJoistRatio?.[kind] ?? ratioFor(kind, product, s);
		const ei = jm.iJoist!.eiLbIn2;
		if (ei === undefined)
			out.warnings.push(
				`I-joists: enter EI from the maker's data to check deflection (L/${ratio} under this floor)`
			);
		else {
			const c = iJoistCheck(
				{ eiLbIn2: ei, spacingIn: jm.spacingIn, spanIn: jm.spanIn, ratio, label: jm.iJoist!.label },
				s.joists
			);
			fix(c, () => ({ room: 1, each: 1 }));
		}
	} else if (room.joists && wood) {
		const jm = room.joists;
		const j = joistCheck(
			{
				size: jm.size,
				species: jm.species,
				spacingIn: jm.spacingIn,
				spanIn: jm.spanIn,
				ratio: ratioFor(kind, product, s)
			},
			s.joists
		);
		for (const c of j.checks)
			fix(c, (p) =>
				p.kind === 'joist_sister'
					? { each: joistCount(shape, jm.runs, ctx.spacingIn), room: 1 }
					: { room: 1, each: 1 }
			);
	} else if (wood && (kind === 'ceramic_tile' || kind === 'stone_tile')) {
		out.warnings.push(
			'Joists were not measured: the deflection check for tile or stone was not run'
		);
	}

	const sub = room.subfloor;
	if (wood && sub.thicknessIn !== undefined) {
		const checks = sheathingChecks(
			{
				kind: sub.kind as 'plywood' | 'osb' | 'board',
				thicknessIn: sub.thicknessIn,
				spanRating: sub.spanRating,
				joistSpacingIn: ctx.spacingIn,
				spacingAssumed: ctx.spacingAssumed,
				floorKind: kind
			},
			s.sheathing
		);
		for (const c of checks) fix(c, () => ({ sqft: area, room: 1 }));
	}

	// Tile and stone need their subfloor: ceramic over one layer at least the trade's minimum
	// (with a backer or membrane, priced with the tile), stone over two layers (TCNA Handbook
	// floor methods, memory; TRADE.md).
	const tile = s.tile;
	if (wood && tile && (kind === 'ceramic_tile' || kind === 'stone_tile') && sub.kind === 'board') {
		// Board (plank) sheathing moves board by board: tile and stone go over a panel layer
		// laid on it, then the backer or membrane (TCNA Handbook floor methods, memory).
		const stone = kind === 'stone_tile';
		fix(
			{
				check: 'tile_subfloor',
				pass: false,
				measured: 0,
				limit: 1,
				unit: 'panel layers',
				message: `${stone ? 'Natural stone' : 'Ceramic tile'} over board sheathing: lay a structural panel layer over the boards first${stone ? ' (stone needs two layers in all)' : ''}, then a backer board or membrane.`,
				rule: 'tile and stone over wood: a panel subfloor, never boards alone; then backer or membrane',
				source:
					'TCNA Handbook floor methods (memory); the tile and membrane makers’ instructions govern',
				suggestedPrep: [
					{
						kind: 'subfloor_overlay',
						note: 'Lay a plywood panel layer over the boards, glued and screwed, joints offset from the boards’ joints.'
					}
				],
				cautions: ['planning_aid', 'maker_instructions', 'structure']
			},
			() => ({ sqft: area, room: 1 })
		);
	}
	if (wood && tile && (kind === 'ceramic_tile' || kind === 'stone_tile') && sub.kind !== 'board') {
		const layers = sub.layers ?? 1;
		const stone = kind === 'stone_tile';
		if (stone || layers < 2) {
			const thick = sub.thicknessIn;
			const need = stone ? tile.stoneLayers : 1;
			const thinSingle =
				!stone &&
				thick !== undefined &&
				panelMinimumIn(thick) < panelMinimumIn(tile.singleLayerMinIn) - 1e-9;
			const pass = stone ? layers >= need : !thinSingle;
			if (stone || thick !== undefined)
				fix(
					{
						check: 'tile_subfloor',
						pass,
						measured: stone ? layers : thick!,
						limit: stone ? need : tile.singleLayerMinIn,
						unit: stone ? 'layers' : 'in',
						message: stone
							? `Natural stone over ${layers} panel layer${layers === 1 ? '' : 's'}; stone needs ${need} layers and a backer or membrane.`
							: `Ceramic tile over a single layer of ${panelText(thick!)}; a single layer needs at least ${panelText(tile.singleLayerMinIn)}${pass ? ', with a backer board or membrane (priced with the tile)' : ': add a second layer, then a backer board or membrane'}.`,
						rule: stone
							? `natural stone: ${need} layers of panel subfloor, then backer or membrane`
							: `ceramic tile: one layer ≥ ${panelText(tile.singleLayerMinIn)} with backer or membrane, or two layers`,
						source:
							'TCNA Handbook floor methods (memory); the tile and membrane makers’ instructions govern',
						suggestedPrep: pass
							? []
							: [
									{
										kind: 'subfloor_overlay',
										note: 'Add a second panel layer, glued and screwed, joints offset from the first.'
									}
								],
						cautions: ['planning_aid', 'maker_instructions', 'structure']
					},
					() => ({ sqft: area, room: 1 })
				);
			else
				out.warnings.push(
					'Subfloor thickness not measured: the single-layer check for tile was not run'
				);
		}
	}

	const readings = room.readings ?? {};
	// Each list's path is only written out for a refusal (this runs for every room).
	const listWithin = (n: number, list: string, what: string) => {
		if (n > LIMITS.listItems)
			countWithin(n, `${ctx.path}.readings.${list}`, what, LIMITS.listItems);
	};
	listWithin(readings.flatness?.length ?? 0, 'flatness', 'readings');
	listWithin(readings.rhPct?.length ?? 0, 'rhPct', 'readings');
	listWithin(readings.calciumChloride?.length ?? 0, 'calciumChloride', 'tests');
	listWithin(readings.woodMc?.subfloorPct.length ?? 0, 'woodMc.subfloorPct', 'readings');
	listWithin(readings.woodMc?.flooringPct.length ?? 0, 'woodMc.flooringPct', 'readings');
	const rules =
		product.needs?.flatness ??
		flatnessRules(kind, wood ? 'wood' : 'concrete', s.flatness, product.tileEdgesIn);
	if (rules && rules.length > 0) {
		for (const r of readings.flatness ?? []) {
			const c = flatnessCheck(r, rules);
			const f = addFinding(c);
			if (c.pass) continue;
			if (r.kind === 'high') need('grind', { each: 1, room: 1 }, f);
			else {
				const a = Math.min(area, r.areaSqFt ?? s.repairs.lowSpotAreaSqFt);
				const depth = r.gapIn * s.repairs.lowSpotDepthFactor;
				need('level', { sqft: a, sqft_per_eighth_in: a * (depth / 0.125), each: 1, room: 1 }, f);
				out.levelAreas.push({ areaSqFt: a, depthIn: depth });
			}
		}
	}

	if (!wood) {
		const rh = readings.rhPct ?? [];
		const cc = readings.calciumChloride ?? [];
		// Every floor but carpet has a moisture limit on a slab: its tests come before it.
		out.slabReadings = { rh: rh.length, cc: cc.length, needsTests: kind !== 'carpet' };
		// A barrier covers the room. How many tests the slab needs is counted for the whole slab,
		// once, by the estimate (ASTM F2170 §10.1, F1869: per slab, not per room).
		const barrier = () => ({ sqft: area, room: 1 });
		if (rh.length > 0) {
			const limitPct = product.needs?.rhLimitPct ?? s.moisture.rhLimitPct;
			fix(rhChecks({ readingsPct: rh, areaSqFt: area, limitPct }, s.moisture)[0], barrier);
		}
		if (cc.length > 0) {
			const limit = product.needs?.mverLimit ?? s.moisture.mverLimit;
			fix(mverChecks({ tests: cc, areaSqFt: area, limit }, s.moisture)[0], barrier);
		}
		if (rh.length === 0 && cc.length === 0 && kind !== 'carpet')
			out.warnings.push(
				'No moisture readings for a concrete subfloor: the slab’s RH tests are on the quote and in the schedule, before any barrier or floor'
			);
	} else if (readings.woodMc) {
		const checks = woodMoistureChecks(
			{
				subfloorPct: readings.woodMc.subfloorPct,
				flooringPct: readings.woodMc.flooringPct,
				boardWidthIn: product.boardWidthIn
			},
			s.moisture
		);
		for (const c of checks) fix(c, () => ({ each: 1, room: 1 }));
	}
	return out;
}
