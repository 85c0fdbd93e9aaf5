/**
 * A fast path for the commonest room drawing: a room made of axis-aligned rectangles (an L, a
 * T, a kitchen with a bay). General polygon clipping (polygon-clipping's sweep line) was the
 * largest single cost of an estimate, yet rectangles only ever meet along grid lines, so their
 * union can be read off a grid: coordinate compression, a filled flag per cell, and one walk
 * round the filled cells' boundary.
 *
 * It answers only the plain case, exactly as polygon-clipping does (the same corners, counter-
 * clockwise, starting at the lowest corner of the leftmost wall, collinear points dropped; the
 * property spec pins this against polygon-clipping). Anything else returns `null` and the
 * caller falls back to polygon-clipping: separate areas, holes, two areas meeting at a single
 * corner (a pinch point), and coordinates so close together that polygon-clipping's own
 * rounding would snap them.
 */
import type { Ring } from 'polygon-clipping';
import { sortShort } from './math';

export interface Rect {
	xIn: number;
	yIn: number;
	widthIn: number;
	lengthIn: number;
}

/**
 * Distinct coordinates closer than this (in) are left to polygon-clipping, which snaps nearly
 * equal values; far below anything measured on site, far above double rounding at room sizes.
 */
const MIN_GAP = 1e-6;

/** Sorted distinct values, or `null` when two are too close (or one is -0) to be taken as is. */
function gridLines(values: number[]): number[] | null {
	sortShort(values, (a, b) => a - b);
	const out: number[] = [];
	for (const v of values) {
		if (!Number.isFinite(v) || Object.is(v, -0)) return null;
		const last = out.length > 0 ? out[out.length - 1] : undefined;
		if (last === v) continue;
		if (last !== undefined && v - last < MIN_GAP) return null;
		out.push(v);
	}
	// polygon-clipping also snaps values within its epsilon of zero to zero
	for (const v of out) if (v !== 0 && Math.abs(v) < MIN_GAP) return null;
	return out;
}

/** Index of `v` in the sorted `lines` (it is there). */
function lineIndex(lines: readonly number[], v: number): number {
	let lo = 0;
	let hi = lines.length - 1;
	while (lo < hi) {
		const mid = (lo + hi) >> 1;
		if (lines[mid] < v) lo = mid + 1;
		else hi = mid;
	}
	return lo;
}

// Directions of a boundary edge, the floor on its left: +x, +y, -x, -y.
const DX = [1, 0, -1, 0];
const DY = [0, 1, 0, -1];
const NONE = -1;

/**
 * The outline of the rectangles' union as one open ring (counter-clockwise, starting at the
 * lowest corner of the leftmost wall), or `null` when it is not one area without holes or
 * pinch points, or its coordinates need polygon-clipping's rounding: then use polygon-clipping.
 * Every rectangle must have a width and a length above zero.
 */
export function rectUnionRing(rects: readonly Rect[]): Ring | null {
	const xValues: number[] = [];
	const yValues: number[] = [];
	for (const r of rects) xValues.push(r.xIn, r.xIn + r.widthIn);
	for (const r of rects) yValues.push(r.yIn, r.yIn + r.lengthIn);
	const xs = gridLines(xValues);
	const ys = gridLines(yValues);
	if (!xs || !ys) return null;
	const cols = xs.length - 1;
	const rows = ys.length - 1;

	// Which grid cells the rectangles cover.
	const filled = new Uint8Array(cols * rows);
	for (const r of rects) {
		const i1 = lineIndex(xs, r.xIn + r.widthIn);
		const j1 = lineIndex(ys, r.yIn + r.lengthIn);
		for (let j = lineIndex(ys, r.yIn); j < j1; j++)
			for (let i = lineIndex(xs, r.xIn); i < i1; i++) filled[j * cols + i] = 1;
	}
	const cell = (i: number, j: number) =>
		i >= 0 && j >= 0 && i < cols && j < rows && filled[j * cols + i] === 1;

	// The boundary as directed unit edges, the floor on the left; at most one leaves a corner of
	// the grid, else two areas meet at that point (a pinch point).
	const width = xs.length;
	const out = new Int8Array(width * ys.length).fill(NONE);
	let edges = 0;
	const edge = (i: number, j: number, dir: number): boolean => {
		const k = j * width + i;
		if (out[k] !== NONE) return false;
		out[k] = dir;
		edges++;
		return true;
	};
	for (let j = 0; j < rows; j++)
		for (let i = 0; i < cols; i++) {
			if (!cell(i, j)) continue;
			if (!cell(i, j - 1) && !edge(i, j, 0)) return null;
			if (!cell(i + 1, j) && !edge(i + 1, j, 1)) return null;
			if (!cell(i, j + 1) && !edge(i + 1, j + 1, 2)) return null;
			if (!cell(i - 1, j) && !edge(i, j + 1, 3)) return null;
		}

	// Walk from the lowest corner of the leftmost wall; keep the points where the walk turns.
	let j0 = 0;
	while (!cell(0, j0)) j0++;
	const ring: Ring = [];
	let i = 0;
	let j = j0;
	let prev = 3; // arriving down the leftmost wall
	let walked = 0;
	do {
		const dir = out[j * width + i];
		if (dir === NONE) return null; // cannot happen: every boundary corner has a way on
		if (dir !== prev) ring.push([xs[i], ys[j]]);
		prev = dir;
		i += DX[dir];
		j += DY[dir];
		walked++;
	} while (i !== 0 || j !== j0);
	// A boundary edge the walk did not reach belongs to a hole or another area.
	return walked === edges ? ring : null;
}
