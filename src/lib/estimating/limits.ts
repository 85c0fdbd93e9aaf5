/**
 * The most work the engine takes on, in one place. Every bound is far beyond any real job (a
 * store's biggest job is a few dozen rooms, each a few dozen feet a side) and low enough that
 * one request can never stall the server: each of the engine's loops runs at most a bound's
 * number of times, whatever the schema let through. The shared zod schemas
 * (`src/lib/schemas/estimate.ts`, the calculators' inputs, the store's settings and price book)
 * use the same numbers, so a body beyond them is refused with its field before the engine runs;
 * called without a schema, the engine refuses it itself with a `LimitError`.
 */
export const LIMITS = {
	/** Rooms in one job. */
	rooms: 200,
	/** Any length in a room (a side, a span, a hole, a straightedge): 500 ft. */
	lengthIn: 6_000,
	/** A room's extent across, with its cut-outs: 500 ft a side. */
	roomSideIn: 6_000,
	/** How far a corner may lie from the drawing's origin: 1,000 ft. */
	coordinateIn: 12_000,
	/** Any area typed for a room or an area calculator: 500 ft × 500 ft. */
	areaSqFt: 250_000,
	/** Small lengths: a depth, a gap, a thickness, a tolerance, an allowance. */
	depthIn: 12,
	/** Joist spacing, on centre (a store's own rule spans 12–24 in). */
	spacingMinIn: 4,
	spacingMaxIn: 96,
	/** Sides or corners of one outline. */
	outlineCorners: 200,
	/** Rectangles in one room. */
	rects: 50,
	/** Cut-outs in one room, and the corners of all of them together. */
	cutouts: 50,
	cutoutCorners: 200,
	/** Corners of one room once its cut-outs are clipped out. */
	roomCorners: 1_000,
	/** Corners of every room and cut-out in one job. */
	jobCorners: 10_000,
	/** Roll widths: 1–20 ft. */
	rollWidthMinIn: 12,
	rollWidthMaxIn: 240,
	/** Roll drops in one job (one room's is at most its side ÷ the narrowest roll, 500). */
	jobDrops: 10_000,
	/** Holes, seams or dents in one room; readings of one kind in one room. (ASTM F2170 asks
	 * 252 probes for a 250,000 ft² slab.) */
	listItems: 500,
	/** Waste, any percentage. */
	pct: 100,
	/** Hours of work in one job's schedule: about 34 years of 8-hour days. */
	workHours: 100_000,
	/** Hours one step may wait to cure: 12 weeks. */
	cureHours: 2_016,
	/** Quantity of one priced line, in its unit. */
	lineQty: 1_000_000_000,
	/** Amount of one priced line: $10 billion, in cents (sums of 10,000 lines stay exact). */
	lineCents: 1_000_000_000_000,
	/** Any price or cost per unit: $1,000,000, in cents. */
	unitCents: 100_000_000,
	/** Lines in each section of a price book; rows in any list of settings. */
	priceBookLines: 1_000,
	settingsRows: 50,
	/** Items on each side of a change order. */
	changeOrderItems: 10_000,
	/** A length as typed: characters. */
	lengthText: 100,
	/** The longest length the engine writes out: about 158 miles. */
	formatIn: 10_000_000
} as const;

/**
 * Work beyond one of the engine's `LIMITS`. `path` names the field at fault, relative to what
 * the throwing function was given (`rollWidthIn`, `shape.sides`); callers that know where that
 * is in their own input re-throw it with `at`.
 */
export class LimitError extends Error {
	override readonly name = 'LimitError';
	constructor(
		readonly path: string,
		readonly limit: number,
		message: string
	) {
		super(message);
	}

	/** The same refusal, its path under `prefix` (`job.rooms.3` + `shape` → `job.rooms.3.shape`). */
	at(prefix: string): LimitError {
		return new LimitError(this.path ? `${prefix}.${this.path}` : prefix, this.limit, this.message);
	}
}

const number = new Intl.NumberFormat('en-US', { maximumFractionDigits: 3 });
/** A figure for a message: grouped, at most three decimals, `1e+308` as such. */
export const figure = (n: number) =>
	Number.isFinite(n) && Math.abs(n) < 1e15 ? number.format(n) : String(n);

/** Refuses `value` above `max` (or below `min`, or not a number) with a message naming the limit. */
export function within(
	value: number,
	path: string,
	what: string,
	max: number,
	unit = '',
	min = -Infinity
): void {
	if (value <= max && value >= min) return;
	const u = unit ? ` ${unit}` : '';
	const range =
		min === -Infinity ? `at most ${figure(max)}${u}` : `${figure(min)} to ${figure(max)}${u}`;
	throw new LimitError(
		path,
		value > max ? max : min,
		`${what} is ${figure(value)}${u}; the engine takes ${range}`
	);
}

/** Refuses a list longer than `max`. */
export function countWithin(length: number, path: string, what: string, max: number): void {
	if (length <= max) return;
	throw new LimitError(
		path,
		max,
		`${figure(length)} ${what}; the engine takes at most ${figure(max)}`
	);
}

/**
 * Runs `work`; a `LimitError` from it is thrown again with its path placed by `place` (from the
 * path the called function knows to the field in the caller's input).
 */
export function placed<T>(work: () => T, place: (path: string) => string): T {
	try {
		return work();
	} catch (e) {
		if (e instanceof LimitError) throw new LimitError(place(e.path), e.limit, e.message);
		throw e;
	}
}
