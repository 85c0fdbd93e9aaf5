/**
 * Rounding shared by the engine. Quantities round UP to what can be bought; float noise from
 * exact-looking inputs (e.g. 4.000000000001 cartons) must not buy one more.
 */

/** Relative slack below which a quotient counts as whole. */
const SLACK = 1e-9;

/** Whole units needed for `x`, rounding up but ignoring float noise. Never below 0. */
export function ceilUnits(x: number): number {
	if (!(x > 0)) return 0;
	const r = Math.round(x);
	if (Math.abs(x - r) <= SLACK * Math.max(1, Math.abs(x))) return r;
	return Math.ceil(x);
}

/** Rounds `x` up to a multiple of `step`, ignoring float noise. */
export function ceilTo(x: number, step: number): number {
	return ceilUnits(x / step) * step;
}

/** Rounds down, ignoring float noise (for spans: 15.9999999 ft is 16 ft). */
export function floorUnits(x: number): number {
	const r = Math.round(x);
	if (Math.abs(x - r) <= SLACK * Math.max(1, Math.abs(x))) return r;
	return Math.floor(x);
}

/** Longest list `sortShort` sorts by insertion. */
const SHORT_LIST = 32;

/**
 * Sorts a short list in place, stably (the order `Array.prototype.sort` gives with the same
 * `compare`), by insertion. For the handful of values a room's geometry sorts many times per
 * estimate: the built-in sort copies its list into scratch space on every call, garbage that
 * showed in the benchmark's profile. Insertion is quadratic, so a longer list (a drawing with
 * many corners) goes to the built-in sort, which gives the same order.
 */
export function sortShort<T>(list: T[], compare: (a: T, b: T) => number): T[] {
	if (list.length > SHORT_LIST) return list.sort(compare);
	for (let i = 1; i < list.length; i++) {
		const x = list[i];
		let j = i - 1;
		while (j >= 0 && compare(list[j], x) > 0) {
			list[j + 1] = list[j];
			j--;
		}
		list[j + 1] = x;
	}
	return list;
}

/**
 * Length of the vector (dx, dy): `Math.hypot`'s exact answer, |dx| or |dy|, without calling it
 * for a wall along an axis (most walls: `Math.hypot` is slow beside a plain absolute value).
 */
export function edgeLength(dx: number, dy: number): number {
	if (dx === 0) return Math.abs(dy);
	if (dy === 0) return Math.abs(dx);
	return Math.hypot(dx, dy);
}
