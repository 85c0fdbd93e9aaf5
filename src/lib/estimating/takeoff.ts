/**
 * Quantities that can be bought: cartons, roll drops and seams, underlayment panels and their
 * fasteners, patch, leveller, and the pieces that close a subfloor hole.
 */
import type { Polygon } from 'polygon-clipping';
import { countWithin, LIMITS, LimitError, within } from './limits';
import { ceilTo, ceilUnits, floorUnits, sortShort } from './math';
import type { FasteningSchedule, HoleMethod } from './settings';
import { CUIN_PER_US_GAL, SQIN_PER_SQFT, SQIN_PER_SQYD } from './units';

/** What every takeoff reports besides its numbers, so a page can show the rule. */
export interface Rule {
	rule: string;
	source: string;
}

export interface CartonTakeoff extends Rule {
	areaSqFt: number;
	wastePct: number;
	/** Area with waste, ft². */
	neededSqFt: number;
	cartons: number;
	/** What the cartons cover, ft². */
	suppliedSqFt: number;
}

/**
 * Cartons for carton goods: area × (1 + waste) ÷ carton coverage, rounded up to whole cartons.
 */
export function cartonTakeoff(input: {
	areaSqFt: number;
	wastePct: number;
	coverageSqFt: number;
}): CartonTakeoff {
	const neededSqFt = input.areaSqFt * (1 + input.wastePct / 100);
	const cartons = ceilUnits(neededSqFt / input.coverageSqFt);
	return {
		areaSqFt: input.areaSqFt,
		wastePct: input.wastePct,
		neededSqFt,
		cartons,
		suppliedSqFt: cartons * input.coverageSqFt,
		rule: 'cartons = ⌈area × (1 + waste) ÷ carton coverage⌉',
		source: 'common practice; waste by layout is a store setting with no published standard'
	};
}

export type RollDirection = 'x' | 'y';

export interface Drop {
	/** Index of the strip (one roll width) the drop fills. */
	strip: number;
	/** Where the drop starts along its run, in. */
	startIn: number;
	/** Room length the drop covers, in. */
	coverIn: number;
	/** Length cut from the roll: cover + trim at both ends, in. */
	cutIn: number;
}

export interface RollLayout {
	/** Drops run along this axis of the room outline. */
	direction: RollDirection;
	drops: Drop[];
	seams: number;
	/** Each seam's run on the room's outline (floor on both sides of it), for the drawing. */
	seamLines: SeamLine[];
	seamLengthIn: number;
	/** Total cut length, in. */
	cutLengthIn: number;
	/** Ordered length: cut length rounded up to the order increment, in. */
	orderLengthIn: number;
	orderLinFt: number;
	orderSqFt: number;
	orderSqYd: number;
}

export interface RollTakeoff extends RollLayout, Rule {
	rollWidthIn: number;
	trimPerEndIn: number;
	/** The other direction, for comparison. */
	other: RollLayout;
}

type Edge = [number, number, number, number];

function edgesOf(polygon: Polygon, swap: boolean): Edge[] {
	const edges: Edge[] = [];
	for (const ring of polygon) {
		for (let i = 0, n = ring.length, j = n - 1; i < n; j = i++) {
			const a = ring[j];
			const b = ring[i];
			edges.push(swap ? [a[1], a[0], b[1], b[0]] : [a[0], a[1], b[0], b[1]]);
		}
	}
	return edges;
}

function xAt(e: Edge, y: number): number {
	return e[0] + ((y - e[1]) * (e[2] - e[0])) / (e[3] - e[1]);
}

/**
 * Edges crossing the line y (half-open in y so a vertex counts once), sorted by x there (stably,
 * by insertion into a list kept in order: a room has a few crossings per line, and this runs for
 * every band of every drop).
 */
function crossing(edges: readonly Edge[], y: number): Edge[] {
	const hit: Edge[] = [];
	const xs: number[] = [];
	for (const e of edges) {
		const lo = Math.min(e[1], e[3]);
		const hi = Math.max(e[1], e[3]);
		if (!(lo <= y && y < hi)) continue;
		const x = xAt(e, y);
		let k = hit.length;
		hit.push(e);
		xs.push(x);
		for (; k > 0 && xs[k - 1] - x > 0; k--) {
			hit[k] = hit[k - 1];
			xs[k] = xs[k - 1];
		}
		hit[k] = e;
		xs[k] = x;
	}
	return hit;
}

function merge(intervals: [number, number][]): [number, number][] {
	sortShort(intervals, (a, b) => a[0] - b[0]);
	const out: [number, number][] = [];
	for (const iv of intervals) {
		const last = out[out.length - 1];
		if (last && iv[0] <= last[1] + 1e-9) last[1] = Math.max(last[1], iv[1]);
		else out.push([iv[0], iv[1]]);
	}
	return out;
}

/**
 * Where the floor lies across the band y0..y1, as merged x-intervals: the projection of
 * (floor ∩ band). Between consecutive vertex heights every edge is straight, so each
 * left/right edge pair bounds a trapezoid whose x-extent is read at the sub-band's ends.
 */
function bandIntervals(edges: readonly Edge[], ys: readonly number[], y0: number, y1: number) {
	const cuts = [y0];
	for (const y of ys) if (y > y0 && y < y1) cuts.push(y);
	cuts.push(y1);
	const out: [number, number][] = [];
	for (let k = 0; k + 1 < cuts.length; k++) {
		const ya = cuts[k];
		const yb = cuts[k + 1];
		if (yb - ya < 1e-12) continue;
		const hit = crossing(edges, (ya + yb) / 2);
		for (let i = 0; i + 1 < hit.length; i += 2) {
			const l = hit[i];
			const r = hit[i + 1];
			out.push([Math.min(xAt(l, ya), xAt(l, yb)), Math.max(xAt(r, ya), xAt(r, yb))]);
		}
	}
	return merge(out);
}

/** Floor along the line y, seen from just below or above it (exact: edges are read at y). */
function sideIntervals(
	edges: readonly Edge[],
	ys: readonly number[],
	y: number,
	side: -1 | 1
): [number, number][] {
	let near = y + side;
	for (const v of ys) if (side < 0 ? v < y && v > near : v > y && v < near) near = v;
	const hit = crossing(edges, (y + near) / 2);
	const out: [number, number][] = [];
	for (let i = 0; i + 1 < hit.length; i += 2) out.push([xAt(hit[i], y), xAt(hit[i + 1], y)]);
	return out;
}

/** Where two drops meet along the line y: the runs of floor on both sides of it, [from, to]. */
function seamRuns(edges: readonly Edge[], ys: readonly number[], y: number): [number, number][] {
	const below = sideIntervals(edges, ys, y, -1);
	const above = sideIntervals(edges, ys, y, 1);
	const runs: [number, number][] = [];
	for (const a of below)
		for (const b of above) {
			const from = Math.max(a[0], b[0]);
			const to = Math.min(a[1], b[1]);
			if (to - from > 1e-9) runs.push([from, to]);
		}
	return runs;
}

/** A seam on the room's outline, in its own coordinates (in). */
export interface SeamLine {
	x1: number;
	y1: number;
	x2: number;
	y2: number;
}

function layout(
	polygon: Polygon,
	isRect: boolean,
	direction: RollDirection,
	rollWidthIn: number,
	trimPerEndIn: number,
	orderIncrementIn: number
): RollLayout {
	const swap = direction === 'y';
	const edges = edgesOf(polygon, swap);
	let minY = Infinity;
	let maxY = -Infinity;
	let minX = Infinity;
	let maxX = -Infinity;
	const ys: number[] = [];
	for (const e of edges) {
		ys.push(e[1]);
		minY = Math.min(minY, e[1]);
		maxY = Math.max(maxY, e[1]);
		minX = Math.min(minX, e[0]);
		maxX = Math.max(maxX, e[0]);
	}
	sortShort(ys, (a, b) => a - b);
	const strips = ceilUnits((maxY - minY) / rollWidthIn);
	// At most 500 (a 500 ft room in 1 ft rolls) whatever the caller measured.
	const maxStrips = LIMITS.roomSideIn / LIMITS.rollWidthMinIn;
	if (!(strips <= maxStrips))
		throw new LimitError(
			'polygon',
			LIMITS.roomSideIn,
			`The room needs ${strips} drops across; the engine takes rooms up to ${LIMITS.roomSideIn / 12} ft a side`
		);
	const drops: Drop[] = [];
	const seamLines: SeamLine[] = [];
	let seams = 0;
	let seamLengthIn = 0;
	for (let s = 0; s < strips; s++) {
		const y0 = minY + s * rollWidthIn;
		const y1 = Math.min(maxY, y0 + rollWidthIn);
		const intervals: [number, number][] = isRect
			? [[minX, maxX]]
			: bandIntervals(edges, ys, y0, y1);
		for (const [a, b] of intervals)
			drops.push({ strip: s, startIn: a, coverIn: b - a, cutIn: b - a + 2 * trimPerEndIn });
		if (s > 0) {
			const runs: [number, number][] = isRect ? [[minX, maxX]] : seamRuns(edges, ys, y0);
			seams += runs.length;
			for (const [from, to] of runs) {
				seamLengthIn += to - from;
				// where the drawing shows it: only where floor lies on both sides of the seam
				seamLines.push(
					swap ? { x1: y0, y1: from, x2: y0, y2: to } : { x1: from, y1: y0, x2: to, y2: y0 }
				);
			}
		}
	}
	const cutLengthIn = drops.reduce((t, d) => t + d.cutIn, 0);
	const orderLengthIn = ceilTo(cutLengthIn, orderIncrementIn);
	const orderSqIn = orderLengthIn * rollWidthIn;
	return {
		direction,
		drops,
		seams,
		seamLines,
		seamLengthIn,
		cutLengthIn,
		orderLengthIn,
		orderLinFt: orderLengthIn / 12,
		orderSqFt: orderSqIn / SQIN_PER_SQFT,
		orderSqYd: orderSqIn / SQIN_PER_SQYD
	};
}

/**
 * Roll goods (sheet vinyl, carpet): drops at the roll width across the room, each cut to the
 * room's length in its strip plus trim at both ends; seams where strips meet. Both directions
 * are tried and the one with fewer seams is kept (less material on a tie), unless the measure
 * chose the direction.
 */
export function rollTakeoff(input: {
	polygon: Polygon;
	isRect?: boolean;
	rollWidthIn: number;
	trimPerEndIn: number;
	orderIncrementIn: number;
	direction?: RollDirection;
	/**
	 * The axis the room's main light falls along (from its main window or glass door): on a tie
	 * in seams, the drops run along it, so its seams run along the light and cast no shadow line.
	 */
	light?: RollDirection;
}): RollTakeoff {
	within(
		input.rollWidthIn,
		'rollWidthIn',
		'The roll width',
		LIMITS.rollWidthMaxIn,
		'in',
		LIMITS.rollWidthMinIn
	);
	within(input.trimPerEndIn, 'trimPerEndIn', 'The trim per cut end', LIMITS.depthIn, 'in', 0);
	within(
		input.orderIncrementIn,
		'orderIncrementIn',
		'The order increment',
		LIMITS.lengthIn,
		'in',
		1
	);
	let corners = 0;
	for (const ring of input.polygon) corners += ring.length;
	countWithin(corners, 'polygon', 'corners', LIMITS.roomCorners);
	const args = [input.rollWidthIn, input.trimPerEndIn, input.orderIncrementIn] as const;
	const x = layout(input.polygon, !!input.isRect, 'x', ...args);
	const y = layout(input.polygon, !!input.isRect, 'y', ...args);
	let pick: RollLayout;
	if (input.direction) pick = input.direction === 'x' ? x : y;
	// Fewest seams first (a run that fits in one piece is never cut across), then seams along the
	// main light where the measure notes it, then less material (common practice, TRADE.md "sheet
	// goods seams"); the salesperson may choose the direction, e.g. to keep seams out of traffic.
	else if (y.seams !== x.seams) pick = y.seams < x.seams ? y : x;
	else if (x.seams > 0 && input.light) pick = input.light === 'x' ? x : y;
	else if (y.orderLengthIn < x.orderLengthIn - 1e-9) pick = y;
	else pick = x;
	return {
		direction: pick.direction,
		drops: pick.drops,
		seams: pick.seams,
		seamLines: pick.seamLines,
		seamLengthIn: pick.seamLengthIn,
		cutLengthIn: pick.cutLengthIn,
		orderLengthIn: pick.orderLengthIn,
		orderLinFt: pick.orderLinFt,
		orderSqFt: pick.orderSqFt,
		orderSqYd: pick.orderSqYd,
		other: pick === x ? y : x,
		rollWidthIn: input.rollWidthIn,
		trimPerEndIn: input.trimPerEndIn,
		rule: input.direction
			? 'drops at the roll width in the direction chosen on the measure; each cut = run + trim per end; 1 yd² = 9 ft²'
			: `drops at the roll width; each cut = run + trim per end; fewest seams of the two directions, then ${input.light ? 'seams along the main light, then ' : ''}less material; 1 yd² = 9 ft²`,
		source: 'common practice; roll widths and trim per end are store settings'
	};
}

export interface FastenerCount extends Rule {
	perimeter: number;
	field: number;
	perPanel: number;
}

/** Fasteners along one edge: first and last at the ends, none further apart than `spacing`. */
function edgeRow(lengthIn: number, s: FasteningSchedule): number {
	return ceilUnits((lengthIn - 2 * s.edgeDistanceIn) / s.edgeSpacingIn) + 1;
}

/** Field lines at multiples of the field spacing, none closer than half a spacing to an edge. */
function fieldLines(lengthIn: number, s: FasteningSchedule): number {
	return Math.max(0, floorUnits(lengthIn / s.fieldSpacingIn - 0.5));
}

/**
 * Fasteners in one panel: edge rows at the edge distance and edge spacing (corners counted
 * once), plus a field grid at the field spacing each way.
 */
export function fastenersPerPanel(
	panel: { widthIn: number; lengthIn: number },
	schedule: FasteningSchedule
): FastenerCount {
	const perimeter =
		2 * edgeRow(panel.widthIn, schedule) + 2 * edgeRow(panel.lengthIn, schedule) - 4;
	const field = fieldLines(panel.widthIn, schedule) * fieldLines(panel.lengthIn, schedule);
	return {
		perimeter,
		field,
		perPanel: perimeter + field,
		rule: scheduleRule(schedule),
		source: schedule.source
	};
}

/** The last schedule's rule text and the figures it was written from. */
let lastRule = { edge: NaN, distance: NaN, field: NaN, text: '' };

/**
 * A fastening schedule in words. Every room under new underlayment asks for the same store
 * schedule, so the text is written once and reused while its three figures stay the same.
 */
function scheduleRule(schedule: FasteningSchedule): string {
	const { edgeSpacingIn: edge, edgeDistanceIn: distance, fieldSpacingIn: field } = schedule;
	if (edge !== lastRule.edge || distance !== lastRule.distance || field !== lastRule.field)
		lastRule = {
			edge,
			distance,
			field,
			text: `edges ${edge} in o.c. at ${distance} in from the edge, field ${field} in each way`
		};
	return lastRule.text;
}

export interface UnderlaymentTakeoff extends Rule {
	panels: number;
	panelSqFt: number;
	fastenersPerPanel: number;
	fasteners: number;
	/** Boxes, when fasteners are sold by the box. */
	boxes?: number;
	schedule: FasteningSchedule;
}

/** Underlayment panels over an area (waste allowed) and the fasteners they take. */
export function underlaymentTakeoff(input: {
	areaSqFt: number;
	wastePct: number;
	panel: { widthIn: number; lengthIn: number };
	schedule: FasteningSchedule;
	perBox?: number;
}): UnderlaymentTakeoff {
	const panelSqFt = (input.panel.widthIn * input.panel.lengthIn) / SQIN_PER_SQFT;
	const panels = ceilUnits((input.areaSqFt * (1 + input.wastePct / 100)) / panelSqFt);
	const count = fastenersPerPanel(input.panel, input.schedule);
	const fasteners = panels * count.perPanel;
	return {
		panels,
		panelSqFt,
		fastenersPerPanel: count.perPanel,
		fasteners,
		boxes: input.perBox ? ceilUnits(fasteners / input.perBox) : undefined,
		schedule: input.schedule,
		rule: `panels = ⌈area × (1 + waste) ÷ ${panelSqFt} ft²⌉; ${count.rule}`,
		source: `APA product literature (published) for the panel; ${input.schedule.source} for fasteners`
	};
}

/** A patch container: its volume, or a coverage at a stated depth. */
export type PatchContainer = { volumeCuIn: number } | { coverageSqFt: number; atDepthIn: number };

export interface Void {
	lengthIn: number;
	widthIn: number;
	depthIn: number;
}

export interface PatchTakeoff extends Rule {
	volumeCuIn: number;
	volumeUsGal: number;
	containerCuIn: number;
	containers: number;
}

/** Cubic inches a container holds. */
export function containerVolume(c: PatchContainer): number {
	return 'volumeCuIn' in c ? c.volumeCuIn : c.coverageSqFt * SQIN_PER_SQFT * c.atDepthIn;
}

/** Patch for open seams and dents: Σ length × width × depth, with waste, in whole containers. */
export function patchTakeoff(input: {
	voids: readonly Void[];
	wastePct: number;
	container: PatchContainer;
}): PatchTakeoff {
	countWithin(input.voids.length, 'voids', 'seams and dents', LIMITS.rooms * 2 * LIMITS.listItems);
	const volumeCuIn = input.voids.reduce((t, v) => t + v.lengthIn * v.widthIn * v.depthIn, 0);
	const containerCuIn = containerVolume(input.container);
	return {
		volumeCuIn,
		volumeUsGal: volumeCuIn / CUIN_PER_US_GAL,
		containerCuIn,
		containers: ceilUnits((volumeCuIn * (1 + input.wastePct / 100)) / containerCuIn),
		rule: 'volume = Σ length × width × depth; containers = ⌈volume × (1 + waste) ÷ container⌉',
		source: 'geometry; container size from the product data sheet'
	};
}

export interface LevellerTakeoff extends Rule {
	/** Volume to fill, ft³. */
	volumeCuFt: number;
	/** ft² one bag covers at the average depth (single area only). */
	coverageSqFtPerBag?: number;
	bags: number;
}

/**
 * Self-levelling underlayment: coverage = bag yield (ft³) × 12 ÷ depth (in); bags rounded up.
 * Several areas add their volumes before rounding.
 */
export function levellerTakeoff(input: {
	areas: readonly { areaSqFt: number; depthIn: number }[];
	bagYieldCuFt: number;
	wastePct: number;
}): LevellerTakeoff {
	countWithin(input.areas.length, 'areas', 'areas to level', LIMITS.rooms * LIMITS.listItems);
	const volumeCuFt = input.areas.reduce((t, a) => t + (a.areaSqFt * a.depthIn) / 12, 0);
	const single = input.areas.length === 1 ? input.areas[0] : undefined;
	return {
		volumeCuFt,
		coverageSqFtPerBag: single ? (input.bagYieldCuFt * 12) / single.depthIn : undefined,
		bags: ceilUnits((volumeCuFt * (1 + input.wastePct / 100)) / input.bagYieldCuFt),
		rule: 'coverage = yield (ft³) × 12 ÷ depth (in); bags = ⌈area × (1 + waste) ÷ coverage⌉',
		source: 'TRADE.md Quantities; yield from the product data sheet'
	};
}

/** Adds the rough-cut allowance to a measured length (common practice: 1/2 in). */
export function roughCut(lengthIn: number, allowanceIn = 0.5): number {
	return lengthIn + allowanceIn;
}

/**
 * The fewest joist bays a hole `widthIn` across the joists opens, wherever it lies (arithmetic):
 * one while it fits in the clear bay; past that it reaches over a joist into the next bay, one
 * more bay for each further joist spacing. A 15 in hole at 16 in o.c. (clear bay 14.5 in) opens
 * 2 bays; a 32 in hole opens 3 (14.5 + 16 = 30.5 in is the most two bays can hold).
 */
export function baysSpanned(widthIn: number, spacingIn: number, clearIn: number): number {
	if (!(widthIn > clearIn)) return 1;
	return 1 + ceilUnits((widthIn - clearIn) / spacingIn);
}

export interface RepairPiece {
	name: 'blocking' | 'infill' | 'backing';
	count: number;
	/** Measured size, in. */
	lengthIn: number;
	widthIn: number;
	thicknessIn: number;
	/** Length to rough-cut (measured + allowance), in. */
	cutLengthIn: number;
	cutWidthIn: number;
}

export interface HoleRepair extends Rule {
	ignored: boolean;
	/** A small hole with nothing over it: filled with patch (a void), no pieces. */
	patched?: boolean;
	method: HoleMethod;
	pieces: RepairPiece[];
	/** New underlayment must go over the repair. */
	needsUnderlayment: boolean;
}

/**
 * How a hole in the subfloor is closed for the floor going over it (TRADE.md "Subfloor
 * repairs", common practice): blocking between the joists plus a flush infill (tile,
 * resilient), or backing plus infill for a nailing surface (nailed wood). Holes smaller than
 * `ignoreUnderIn` need nothing when a new underlayment panel covers them.
 */
export function holeRepair(input: {
	widthIn: number;
	lengthIn: number;
	method: HoleMethod;
	newUnderlayment: boolean;
	ignoreUnderIn: number;
	subfloorThicknessIn: number;
	joistSpacingIn: number;
	joistThicknessIn: number;
	backingLapIn: number;
	roughCutAllowanceIn: number;
	/** The customer declined new underlayment over this room. */
	underlaymentDeclined?: boolean;
}): HoleRepair {
	const size = Math.max(input.widthIn, input.lengthIn);
	const source = 'common practice (TRADE.md "Subfloor repairs")';
	// A declined underlayment is never put back by a repair: the infill is skimmed instead.
	const needsUnderlayment =
		input.method === 'blocking_underlayment' && input.underlaymentDeclined !== true;
	if (size < input.ignoreUnderIn)
		return input.newUnderlayment
			? {
					ignored: true,
					method: input.method,
					pieces: [],
					needsUnderlayment: false,
					rule: `holes under ${input.ignoreUnderIn} in need no patch under new underlayment`,
					source
				}
			: {
					ignored: false,
					patched: true,
					method: input.method,
					pieces: [],
					needsUnderlayment: false,
					rule: `holes under ${input.ignoreUnderIn} in with no new underlayment over them are filled with patch, not blocked`,
					source
				};
	const a = input.roughCutAllowanceIn;
	const piece = (
		name: RepairPiece['name'],
		count: number,
		lengthIn: number,
		widthIn: number,
		thicknessIn: number
	): RepairPiece => ({
		name,
		count,
		lengthIn,
		widthIn,
		thicknessIn,
		cutLengthIn: roughCut(lengthIn, a),
		cutWidthIn: roughCut(widthIn, a)
	});
	const infill = piece('infill', 1, input.lengthIn, input.widthIn, input.subfloorThicknessIn);
	const pieces: RepairPiece[] = [];
	// Blocking and backing fit between the joists: cut to the clear bay (spacing less the joist's
	// thickness: 14.5 in at 16 in o.c., arithmetic), one piece (or pair) for each bay the hole spans.
	const clear = input.joistSpacingIn - input.joistThicknessIn;
	const bays = baysSpanned(input.widthIn, input.joistSpacingIn, clear);
	if (input.method === 'backing') {
		const lap = 2 * input.backingLapIn;
		pieces.push(
			piece('backing', bays, input.lengthIn + lap, clear, input.subfloorThicknessIn),
			infill
		);
	} else {
		// 2x4 blocking, dressed 1.5 × 3.5 in: NDS Supplement Table 1B (published)
		pieces.push(piece('blocking', 2 * bays, clear, 3.5, 1.5), infill);
	}
	return {
		ignored: false,
		method: input.method,
		pieces,
		needsUnderlayment,
		rule:
			input.method === 'backing'
				? 'backing under the hole and a flush infill, for a nailing surface'
				: 'blocking between the joists at both sides of the hole and a flush infill of the subfloor thickness',
		source
	};
}
