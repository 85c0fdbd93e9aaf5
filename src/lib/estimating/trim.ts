/**
 * Baseboard and shoe bought in stock lengths. Trim is sold in whole pieces of a fixed length
 * (8, 12 and 16 ft are usual: common practice, memory; the store's price book says its own), so
 * the walls are cut from whole pieces: each wall is a run, a run longer than a piece is joined
 * from full pieces and one cut piece, every cut piece gets an allowance for squaring and coping
 * its ends (a store setting; 2 in by default, memory), and the cut pieces are packed into stock
 * lengths first-fit decreasing, so an offcut from one wall trims a shorter one, in any room of
 * the job. Pure and bounded: past `PACK_MAX` pieces the packing falls back to total length.
 */
import { ceilUnits, edgeLength } from './math';
import type { Point } from './geometry';

/** Waste on setting materials and backer, and the trim allowance, when the store set none. */
export const INSTALL_SUPPLY_DEFAULTS = {
	/** Waste on thinset, grout and backer (memory: 10 % is the usual allowance). */
	wastePct: 10,
	/** Added to each cut piece of trim for squaring and coping its ends, in (memory). */
	trimEndAllowanceIn: 2
} as const;

/** Above this many cut pieces in a job, stock lengths are counted by total length (still rounded up). */
export const PACK_MAX = 2_000;

const EPS = 1e-9;

/** The wall runs of an outline: the length of each edge of its outer ring, in. */
export function wallRuns(outer: readonly Point[]): number[] {
	const runs: number[] = [];
	const n = outer.length;
	for (let i = 0; i < n; i++) {
		const a = outer[i];
		const b = outer[(i + 1) % n];
		const len = edgeLength(b[0] - a[0], b[1] - a[1]);
		if (len > EPS) runs.push(len);
	}
	return runs;
}

/**
 * Takes each doorway out of the runs. Where a doorway sits is not measured, so it is put in the
 * longest run left (splitting it into two equal runs); a doorway wider than every run takes that
 * run away. With very many doorways and walls it is taken off the total instead (same length).
 */
export function lessDoorways(runs: readonly number[], doorwaysIn: readonly number[]): number[] {
	const out = [...runs];
	if (doorwaysIn.length * out.length > 20_000) {
		let left = doorwaysIn.reduce((t, w) => t + Math.max(0, w), 0);
		for (let i = 0; i < out.length && left > 0; i++) {
			const take = Math.min(out[i], left);
			out[i] -= take;
			left -= take;
		}
		return out.filter((r) => r > EPS);
	}
	for (const w of doorwaysIn) {
		if (!(w > 0) || out.length === 0) continue;
		let k = 0;
		for (let i = 1; i < out.length; i++) if (out[i] > out[k]) k = i;
		const rest = out[k] - w;
		if (rest > EPS) out.splice(k, 1, rest / 2, rest / 2);
		else out.splice(k, 1);
	}
	return out;
}

/** The pieces one run is cut into: full stock lengths, and the last piece with its allowance. */
export function runPieces(runIn: number, stockIn: number, allowanceIn: number): number[] {
	if (!(runIn > EPS)) return [];
	const n = ceilUnits(runIn / stockIn);
	const pieces: number[] = [];
	for (let i = 1; i < n; i++) pieces.push(stockIn);
	const last = runIn - (n - 1) * stockIn;
	pieces.push(Math.min(stockIn, last + allowanceIn));
	return pieces;
}

export interface StockTakeoff {
	/** Stock lengths to buy. */
	pieces: number;
	stockLengthIn: number;
	/** Trim actually run along the walls, in (before allowances). */
	runIn: number;
	/** Offcut left over, in. */
	offcutIn: number;
}

/**
 * Stock lengths for the runs: each run cut into pieces (`runPieces`), the pieces packed into
 * stock lengths first-fit decreasing.
 */
export function stockLengths(
	runs: readonly number[],
	stockIn: number,
	allowanceIn: number
): StockTakeoff {
	if (!(stockIn > 0)) throw new RangeError('stock length must be above zero');
	const cut: number[] = [];
	let runIn = 0;
	for (const r of runs) {
		runIn += Math.max(0, r);
		for (const p of runPieces(r, stockIn, allowanceIn)) cut.push(p);
	}
	const total = cut.reduce((t, p) => t + p, 0);
	let pieces: number;
	if (cut.length > PACK_MAX) pieces = ceilUnits(total / stockIn);
	else {
		cut.sort((a, b) => b - a);
		// Room left in each stock length bought so far.
		const left: number[] = [];
		for (const p of cut) {
			let i = 0;
			while (i < left.length && left[i] < p - EPS) i++;
			if (i === left.length) left.push(stockIn - p);
			else left[i] -= p;
		}
		pieces = left.length;
	}
	return { pieces, stockLengthIn: stockIn, runIn, offcutIn: pieces * stockIn - total };
}
