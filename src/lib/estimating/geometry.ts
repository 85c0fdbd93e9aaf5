/**
 * Room shapes in inches: rectangles, unions of rectangles, polygons from sides and turns or
 * from points, minus cut-outs. Unions and differences go through polygon-clipping; a plain
 * rectangle or a single polygon without cut-outs skips it.
 */
import polygonClipping from 'polygon-clipping';
import type { Polygon, Ring } from 'polygon-clipping';
import { countWithin, LIMITS, LimitError, within } from './limits';
import { edgeLength } from './math';
import { rectUnionRing } from './rect-union';
import { formatLength, SQIN_PER_SQFT } from './units';

export type Point = [number, number];

/** A rectangle `widthIn` along x by `lengthIn` along y, its corner at (`xIn`, `yIn`). */
export interface RectShape {
	kind: 'rect';
	widthIn: number;
	lengthIn: number;
	xIn?: number;
	yIn?: number;
}

/** Rectangles that together make one room (L, T, U shapes, closets, bays). */
export interface RectsShape {
	kind: 'rects';
	rects: { xIn: number; yIn: number; widthIn: number; lengthIn: number }[];
}

/** A turn after a side: `left`/`right` are 90°; a number is degrees, positive to the left. */
export type Turn = 'left' | 'right' | number;

/** A polygon walked side by side from (`xIn`, `yIn`), first heading along +x. */
export interface SidesShape {
	kind: 'sides';
	sides: { lengthIn: number; turn: Turn }[];
	xIn?: number;
	yIn?: number;
}

/** A polygon from its corners, in order. */
export interface PointsShape {
	kind: 'points';
	points: Point[];
}

export type Shape = RectShape | RectsShape | SidesShape | PointsShape;

/** Something in the room that gets no floor: an island, cabinets, a hearth. */
export interface Cutout {
	name: string;
	shape: Shape;
}

export interface BBox {
	minX: number;
	minY: number;
	maxX: number;
	maxY: number;
	widthIn: number;
	lengthIn: number;
}

/** A valid room: area, perimeters and the polygons (outer ring counter-clockwise, then holes). */
export interface RoomShape {
	ok: true;
	areaSqIn: number;
	areaSqFt: number;
	/** Length of every edge of the floor (walls and cut-out faces): trim and transitions. */
	perimeterIn: number;
	/** Perimeter of the room before cut-outs. */
	wallPerimeterIn: number;
	polygon: Polygon;
	bbox: BBox;
	/** A plain rectangle with no cut-outs. */
	isRect: boolean;
	warnings: string[];
}

export interface ShapeError {
	ok: false;
	message: string;
	/** The field at fault, relative to the room: `shape`, `shape.sides.2`, `cutouts.0`... */
	field: string;
}

export type RoomShapeResult = RoomShape | ShapeError;

const EPS = 1e-9;

function ringArea(ring: Ring): number {
	let a = 0;
	for (let i = 0, n = ring.length, j = n - 1; i < n; j = i++) {
		a += (ring[j][0] - ring[i][0]) * (ring[j][1] + ring[i][1]);
	}
	return a / 2;
}

function ringLength(ring: Ring): number {
	let l = 0;
	for (let i = 0, n = ring.length, j = n - 1; i < n; j = i++) {
		l += edgeLength(ring[i][0] - ring[j][0], ring[i][1] - ring[j][1]);
	}
	return l;
}

/** Drops a repeated closing point and consecutive duplicates. */
function openRing(points: readonly Point[]): Ring {
	const out: Ring = [];
	for (const p of points) {
		const last = out[out.length - 1];
		if (!last || Math.abs(last[0] - p[0]) > EPS || Math.abs(last[1] - p[1]) > EPS)
			out.push([p[0], p[1]]);
	}
	if (out.length > 1) {
		const a = out[0];
		const b = out[out.length - 1];
		if (Math.abs(a[0] - b[0]) <= EPS && Math.abs(a[1] - b[1]) <= EPS) out.pop();
	}
	return out;
}

function orient(p: Point, q: Point, r: Point): number {
	const v = (q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]);
	return Math.abs(v) < 1e-9 ? 0 : v;
}

function onSegment(p: Point, q: Point, r: Point): boolean {
	return (
		Math.min(p[0], r[0]) - EPS <= q[0] &&
		q[0] <= Math.max(p[0], r[0]) + EPS &&
		Math.min(p[1], r[1]) - EPS <= q[1] &&
		q[1] <= Math.max(p[1], r[1]) + EPS
	);
}

function segmentsTouch(a: Point, b: Point, c: Point, d: Point): boolean {
	const o1 = orient(a, b, c);
	const o2 = orient(a, b, d);
	const o3 = orient(c, d, a);
	const o4 = orient(c, d, b);
	if (o1 * o2 < 0 && o3 * o4 < 0) return true;
	return (
		(o1 === 0 && onSegment(a, c, b)) ||
		(o2 === 0 && onSegment(a, d, b)) ||
		(o3 === 0 && onSegment(c, a, d)) ||
		(o4 === 0 && onSegment(c, b, d))
	);
}

/** Index of the first edge that crosses or touches a non-neighbouring edge, or -1. */
function firstCrossing(ring: Ring): number {
	const n = ring.length;
	for (let i = 0; i < n; i++) {
		const a = ring[i];
		const b = ring[(i + 1) % n];
		for (let j = i + 1; j < n; j++) {
			const c = ring[j];
			const d = ring[(j + 1) % n];
			const adjacent = j === i + 1 || (i === 0 && j === n - 1);
			if (adjacent) {
				// neighbours share a corner; they fault only by folding back along each other
				const shared = j === i + 1 ? b : a;
				const other1 = j === i + 1 ? a : b;
				const other2 = j === i + 1 ? d : c;
				if (orient(other1, shared, other2) === 0) {
					const dot =
						(other1[0] - shared[0]) * (other2[0] - shared[0]) +
						(other1[1] - shared[1]) * (other2[1] - shared[1]);
					if (dot > 0) return i;
				}
				continue;
			}
			if (segmentsTouch(a, b, c, d)) return i;
		}
	}
	return -1;
}

function turnDegrees(turn: Turn): number {
	if (turn === 'left') return 90;
	if (turn === 'right') return -90;
	return turn;
}

/** Unit vector for a heading; exact on multiples of 90° so rectilinear rooms close exactly. */
function heading(deg: number): Point {
	const d = ((deg % 360) + 360) % 360;
	if (d === 0) return [1, 0];
	if (d === 90) return [0, 1];
	if (d === 180) return [-1, 0];
	if (d === 270) return [0, -1];
	const r = (d * Math.PI) / 180;
	return [Math.cos(r), Math.sin(r)];
}

function rectRing(x: number, y: number, w: number, l: number): Ring {
	return [
		[x, y],
		[x + w, y],
		[x + w, y + l],
		[x, y + l]
	];
}

function bboxOf(rings: readonly Ring[]): BBox {
	let minX = Infinity;
	let minY = Infinity;
	let maxX = -Infinity;
	let maxY = -Infinity;
	for (const ring of rings)
		for (const [x, y] of ring) {
			if (x < minX) minX = x;
			if (y < minY) minY = y;
			if (x > maxX) maxX = x;
			if (y > maxY) maxY = y;
		}
	return { minX, minY, maxX, maxY, widthIn: maxX - minX, lengthIn: maxY - minY };
}

function positive(v: number): boolean {
	return Number.isFinite(v) && v > 0;
}

/** Refuses a length beyond `LIMITS.lengthIn` (500 ft). */
function length(v: number, path: string): void {
	within(v, path, 'A length', LIMITS.lengthIn, 'in');
}

/** Refuses a corner further than `LIMITS.coordinateIn` from the origin. */
function coordinate(v: number | undefined, path: string): void {
	if (v !== undefined)
		within(v, path, 'A corner', LIMITS.coordinateIn, 'in from the origin', -LIMITS.coordinateIn);
}

/** Corners a shape is drawn with, counted before anything is computed from it. */
export function cornersOf(shape: Shape): number {
	if (shape.kind === 'rect') return 4;
	if (shape.kind === 'rects') return 4 * shape.rects.length;
	return shape.kind === 'sides' ? shape.sides.length : shape.points.length;
}

/** Refuses a shape with more corners, rectangles, or longer sides than the engine takes. */
function checkShape(shape: Shape, field: string): void {
	if (shape.kind === 'rect') {
		length(shape.widthIn, `${field}.widthIn`);
		length(shape.lengthIn, `${field}.lengthIn`);
		coordinate(shape.xIn, `${field}.xIn`);
		coordinate(shape.yIn, `${field}.yIn`);
	} else if (shape.kind === 'rects') {
		countWithin(shape.rects.length, `${field}.rects`, 'rectangles', LIMITS.rects);
		shape.rects.forEach((r, i) => {
			length(r.widthIn, `${field}.rects.${i}.widthIn`);
			length(r.lengthIn, `${field}.rects.${i}.lengthIn`);
			coordinate(r.xIn, `${field}.rects.${i}.xIn`);
			coordinate(r.yIn, `${field}.rects.${i}.yIn`);
		});
	} else if (shape.kind === 'sides') {
		countWithin(shape.sides.length, `${field}.sides`, 'sides', LIMITS.outlineCorners);
		shape.sides.forEach((side, i) => length(side.lengthIn, `${field}.sides.${i}.lengthIn`));
		coordinate(shape.xIn, `${field}.xIn`);
		coordinate(shape.yIn, `${field}.yIn`);
	} else {
		countWithin(shape.points.length, `${field}.points`, 'corners', LIMITS.outlineCorners);
		shape.points.forEach((p, i) => {
			coordinate(p[0], `${field}.points.${i}.0`);
			coordinate(p[1], `${field}.points.${i}.1`);
		});
	}
}

/** Refuses a floor wider or longer than `LIMITS.roomSideIn`, or with too many corners. */
function checkExtent(polygon: Polygon, b: BBox, field: string): void {
	const side = Math.max(b.widthIn, b.lengthIn);
	if (side > LIMITS.roomSideIn)
		throw new LimitError(
			field,
			LIMITS.roomSideIn,
			`The room is ${formatLength(side)} across; the engine takes rooms up to ${formatLength(LIMITS.roomSideIn)} a side`
		);
	let corners = 0;
	for (const ring of polygon) corners += ring.length;
	countWithin(corners, field, 'corners in the room with its cut-outs', LIMITS.roomCorners);
}

type Simple = { ok: true; polygon: Polygon; simple: boolean } | ShapeError;

/** Turns a shape into one polygon (outer ring counter-clockwise), or says why it cannot. */
function shapePolygon(shape: Shape, field: string, closureToleranceIn: number): Simple {
	if (shape.kind === 'rect') {
		if (!positive(shape.widthIn) || !positive(shape.lengthIn))
			return { ok: false, field, message: 'A rectangle needs a width and a length above zero' };
		return {
			ok: true,
			simple: true,
			polygon: [rectRing(shape.xIn ?? 0, shape.yIn ?? 0, shape.widthIn, shape.lengthIn)]
		};
	}
	if (shape.kind === 'rects') {
		if (shape.rects.length === 0)
			return { ok: false, field, message: 'Add at least one rectangle' };
		for (let i = 0; i < shape.rects.length; i++) {
			const r = shape.rects[i];
			if (!positive(r.widthIn) || !positive(r.lengthIn))
				return {
					ok: false,
					field: `${field}.rects.${i}`,
					message: `Rectangle ${i + 1} needs a width and a length above zero`
				};
		}
		if (shape.rects.length === 1) {
			const r = shape.rects[0];
			return { ok: true, simple: true, polygon: [rectRing(r.xIn, r.yIn, r.widthIn, r.lengthIn)] };
		}
		// Rectangles making one area without holes: their outline off a grid, as polygon-clipping
		// gives it (rect-union.ts); anything else goes to polygon-clipping below.
		const ring = rectUnionRing(shape.rects);
		if (ring) return { ok: true, simple: false, polygon: [ring] };
		const polys: Polygon[] = shape.rects.map((r) => [
			rectRing(r.xIn, r.yIn, r.widthIn, r.lengthIn)
		]);
		// One multipolygon of every rectangle (they may overlap): no list spread into the call.
		const union = polygonClipping.union(polys);
		if (union.length !== 1)
			return {
				ok: false,
				field,
				message: `The rectangles make ${union.length} separate areas: they must overlap or share a wall`
			};
		return { ok: true, simple: false, polygon: closedToOpen(union[0]) };
	}
	let ring: Ring;
	if (shape.kind === 'sides') {
		if (shape.sides.length < 3)
			return { ok: false, field, message: 'A room drawn by its sides needs at least 3 sides' };
		let x = shape.xIn ?? 0;
		let y = shape.yIn ?? 0;
		let deg = 0;
		const pts: Point[] = [[x, y]];
		for (let i = 0; i < shape.sides.length; i++) {
			const side = shape.sides[i];
			if (!positive(side.lengthIn))
				return {
					ok: false,
					field: `${field}.sides.${i}`,
					message: `Side ${i + 1} needs a length above zero`
				};
			const [dx, dy] = heading(deg);
			x += dx * side.lengthIn;
			y += dy * side.lengthIn;
			pts.push([x, y]);
			deg += turnDegrees(side.turn);
		}
		const gap = Math.hypot(x - pts[0][0], y - pts[0][1]);
		if (gap > closureToleranceIn)
			return {
				ok: false,
				field,
				message: `The sides end ${formatLength(gap)} from where they start: the outline is not closed`
			};
		pts[pts.length - 1] = [pts[0][0], pts[0][1]];
		ring = openRing(pts);
	} else {
		if (shape.points.some((p) => !Number.isFinite(p[0]) || !Number.isFinite(p[1])))
			return { ok: false, field, message: 'Every corner needs two numbers' };
		ring = openRing(shape.points);
	}
	if (ring.length < 3) return { ok: false, field, message: 'A polygon needs at least 3 corners' };
	const area = ringArea(ring);
	if (Math.abs(area) < EPS && ring.every((p) => orient(ring[0], ring[1], p) === 0))
		return { ok: false, field, message: 'The outline has no area' };
	const crossing = firstCrossing(ring);
	if (crossing >= 0)
		return {
			ok: false,
			field,
			message: `The outline crosses itself at edge ${crossing + 1}: walls may not cross or overlap`
		};
	if (area < 0) ring.reverse();
	return { ok: true, simple: true, polygon: [ring] };
}

/** Even-odd point-in-polygon over every ring. */
function inside(poly: Polygon, [x, y]: Point): boolean {
	let c = false;
	for (const ring of poly)
		for (let i = 0, n = ring.length, j = n - 1; i < n; j = i++) {
			const [xi, yi] = ring[i];
			const [xj, yj] = ring[j];
			if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) c = !c;
		}
	return c;
}

function ringsTouch(a: Ring, b: Ring): boolean {
	for (let i = 0, n = a.length, j = n - 1; i < n; j = i++)
		for (let k = 0, m = b.length, l = m - 1; k < m; l = k++)
			if (segmentsTouch(a[j], a[i], b[l], b[k])) return true;
	return false;
}

/**
 * Whether every cut-out (a single ring) lies strictly inside the floor, touching no wall and
 * no other cut-out: then no clipping is needed.
 */
function apartInside(room: Polygon, cuts: readonly Polygon[]): boolean {
	for (let i = 0; i < cuts.length; i++) {
		const c = cuts[i][0];
		if (!inside(room, c[0])) return false;
		for (const ring of room) if (ringsTouch(c, ring)) return false;
		for (let j = 0; j < i; j++) {
			const d = cuts[j][0];
			if (ringsTouch(c, d) || inside(cuts[j], c[0]) || inside(cuts[i], d[0])) return false;
		}
	}
	return true;
}

/** polygon-clipping closes its rings (first point repeated); the engine keeps them open. */
function closedToOpen(poly: Polygon): Polygon {
	return poly.map((ring) => ring.slice(0, -1));
}

function openToClosed(poly: Polygon): Polygon {
	return poly.map((ring) => [...ring, ring[0]]);
}

function polygonArea(poly: Polygon): number {
	let a = Math.abs(ringArea(poly[0]));
	for (let i = 1; i < poly.length; i++) a -= Math.abs(ringArea(poly[i]));
	return a;
}

function polygonPerimeter(poly: Polygon): number {
	let l = 0;
	for (const ring of poly) l += ringLength(ring);
	return l;
}

/**
 * The floor of a room: its shape less its cut-outs, with area (in², ft²), perimeters and
 * outline. Invalid input (self-crossing, open, zero area, disconnected) comes back as
 * `{ ok: false, field, message }`; a shape beyond the engine's `LIMITS` (a side over 500 ft,
 * over 200 corners, 50 cut-outs) throws a `LimitError` naming the field, before any work.
 */
export function roomShape(
	shape: Shape,
	cutouts: readonly Cutout[] = [],
	options: { closureToleranceIn?: number } = {}
): RoomShapeResult {
	const tol = options.closureToleranceIn ?? 0.25;
	within(tol, 'closureToleranceIn', 'The closure tolerance', LIMITS.depthIn, 'in');
	checkShape(shape, 'shape');
	countWithin(cutouts.length, 'cutouts', 'cut-outs', LIMITS.cutouts);
	let cutCorners = 0;
	cutouts.forEach((c, i) => {
		checkShape(c.shape, `cutouts.${i}.shape`);
		cutCorners += cornersOf(c.shape);
	});
	countWithin(cutCorners, 'cutouts', 'corners of cut-outs', LIMITS.cutoutCorners);
	const base = shapePolygon(shape, 'shape', tol);
	if (!base.ok) return base;
	const wallPerimeterIn = polygonPerimeter(base.polygon);
	const warnings: string[] = [];
	let polygon = base.polygon;
	if (cutouts.length > 0) {
		const cuts: Polygon[] = [];
		let cutArea = 0;
		for (let i = 0; i < cutouts.length; i++) {
			const c = shapePolygon(cutouts[i].shape, `cutouts.${i}`, tol);
			if (!c.ok)
				return { ok: false, field: c.field, message: `Cut-out "${cutouts[i].name}": ${c.message}` };
			cuts.push(c.polygon);
			cutArea += polygonArea(c.polygon);
		}
		if (apartInside(polygon, cuts)) {
			// Cut-outs clear of the walls and of each other are holes as they are.
			polygon = [...polygon, ...cuts.map((c) => [...c[0]].reverse())];
		} else {
			const result = polygonClipping.difference(openToClosed(polygon), cuts.map(openToClosed));
			if (result.length === 0)
				return { ok: false, field: 'cutouts', message: 'The cut-outs cover the whole room' };
			if (result.length > 1)
				return {
					ok: false,
					field: 'cutouts',
					message: `The cut-outs split the room into ${result.length} separate areas`
				};
			polygon = closedToOpen(result[0]);
			const removed = polygonArea(base.polygon) - polygonArea(polygon);
			if (Math.abs(removed - cutArea) > 1e-6 * Math.max(1, cutArea))
				warnings.push(
					'Cut-outs overlap each other or reach past the walls: only the floor they cover is removed'
				);
		}
	}
	const bbox = bboxOf(polygon);
	checkExtent(polygon, bbox, 'shape');
	const areaSqIn = polygonArea(polygon);
	if (!(areaSqIn > EPS)) return { ok: false, field: 'shape', message: 'The room has no area' };
	return {
		ok: true,
		areaSqIn,
		areaSqFt: areaSqIn / SQIN_PER_SQFT,
		perimeterIn: cutouts.length > 0 ? polygonPerimeter(polygon) : wallPerimeterIn,
		wallPerimeterIn,
		polygon,
		bbox,
		isRect: shape.kind === 'rect' && cutouts.length === 0,
		warnings
	};
}

/** A room outline ready to draw to scale: rings in inches and an SVG `viewBox`. */
export interface Outline {
	outer: Point[];
	holes: Point[][];
	bbox: BBox;
	/** `minX minY width length`; flip y (scale(1,-1)) to draw +y up. */
	viewBox: string;
	/** Roll goods: where each seam between drops runs, only where floor lies on both sides of it. */
	seams?: { x1: number; y1: number; x2: number; y2: number }[];
}

/** Drawable outline of a valid room, so the UI can draw it as SVG. */
export function roomOutline(room: RoomShape): Outline {
	const b = room.bbox;
	return {
		outer: room.polygon[0],
		holes: room.polygon.slice(1),
		bbox: b,
		viewBox: `${b.minX} ${b.minY} ${b.widthIn} ${b.lengthIn}`
	};
}

/** Signed area helpers shared with the roll takeoff. */
export { ringArea, polygonArea };
