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
