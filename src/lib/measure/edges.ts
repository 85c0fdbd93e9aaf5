import type { Point } from '$lib/estimating';

/** One outer wall of a room as a drawing labels it: its length and where its label goes. */
export interface EdgeLabel {
	/** The wall's length in inches. */
	lengthIn: number;
	from: Point;
	to: Point;
	/** The wall's middle, in the engine's inches (+y up). */
	mid: Point;
	/** The unit normal pointing out of the room (engine axes), to set the label outside the wall. */
	out: Point;
	/** The label's turn in degrees, clockwise on screen, from -90 (up a side wall) to under 90, so it reads upright. */
	angle: number;
}

/** Points closer than this (inches) are one corner; turns smaller than this (radians) are no turn. */
const SAME_POINT_IN = 1e-6;
const STRAIGHT = 1e-9;

/** -0 as 0, so equal walls compare equal. */
const plain = (n: number) => (n === 0 ? 0 : n);

/** Twice the signed area of a ring: positive when its points run counter-clockwise (+y up). */
function twiceArea(ring: readonly Point[]): number {
	let a = 0;
	for (let i = 0; i < ring.length; i++) {
		const [x1, y1] = ring[i];
		const [x2, y2] = ring[(i + 1) % ring.length];
		a += x1 * y2 - x2 * y1;
	}
	return a;
}

/**
 * The corners of an open ring (the engine keeps rings open), without repeated points or points in
 * the middle of a straight wall: a union of rectangles can leave both.
 */
export function corners(ring: readonly Point[]): Point[] {
	let pts = ring.filter((p, i) => {
		const q = ring[(i + 1) % ring.length];
		return Math.hypot(q[0] - p[0], q[1] - p[1]) > SAME_POINT_IN;
	});
	let changed = true;
	while (changed && pts.length > 3) {
		changed = false;
		for (let i = 0; i < pts.length; i++) {
			const a = pts[(i - 1 + pts.length) % pts.length];
			const b = pts[i];
			const c = pts[(i + 1) % pts.length];
			const cross = (b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0]);
			const scale = Math.hypot(b[0] - a[0], b[1] - a[1]) * Math.hypot(c[0] - b[0], c[1] - b[1]);
			if (Math.abs(cross) <= STRAIGHT * Math.max(scale, 1)) {
				pts = pts.filter((_, j) => j !== i);
				changed = true;
				break;
			}
		}
	}
	return pts;
}

/** Whether a ring is a plain rectangle with walls along the axes. */
export function isAxisRectangle(ring: readonly Point[]): boolean {
	const pts = corners(ring);
	if (pts.length !== 4) return false;
	return pts.every((p, i) => {
		const q = pts[(i + 1) % 4];
		return Math.abs(p[0] - q[0]) <= SAME_POINT_IN || Math.abs(p[1] - q[1]) <= SAME_POINT_IN;
	});
}

/**
 * Every outer wall of a room with its length, in the ring's order: an L-shaped room has six,
 * each leg labelled, not only the overall sizes. A plain rectangle's opposite walls are equal,
 * so it gets two labels (the width along the top, the length down the left side), as before.
 */
export function edgeLabels(outer: readonly Point[]): EdgeLabel[] {
	const pts = corners(outer);
	if (pts.length < 3) return [];
	// Outward is to the right of the direction of travel on a counter-clockwise ring.
	const ccw = twiceArea(pts) > 0;
	const edges = pts.map((from, i): EdgeLabel => {
		const to = pts[(i + 1) % pts.length];
		const dx = to[0] - from[0];
		const dy = to[1] - from[1];
		const lengthIn = Math.hypot(dx, dy);
		const out: Point = ccw
			? [plain(dy / lengthIn), plain(-dx / lengthIn)]
			: [plain(-dy / lengthIn), plain(dx / lengthIn)];
		// On screen +y runs down, so the wall's turn there is the negative of its turn here.
		let angle = (-Math.atan2(dy, dx) * 180) / Math.PI;
		// Upright, and a wall up the side reads from the bottom, as drawings' dimensions do.
		if (angle >= 90 - 1e-9) angle -= 180;
		if (angle < -90 - 1e-9) angle += 180;
		return {
			lengthIn,
			from,
			to,
			mid: [(from[0] + to[0]) / 2, (from[1] + to[1]) / 2],
			out,
			angle: Math.abs(angle) < 1e-9 ? 0 : angle
		};
	});
	if (!isAxisRectangle(pts)) return edges;
	// The top wall (outward +y) and the left wall (outward -x).
	const top = edges.find((e) => e.out[1] > 0.5);
	const left = edges.find((e) => e.out[0] < -0.5);
	return [top, left].filter((e): e is EdgeLabel => e !== undefined);
}
