/**
 * Tile setting materials in the units they are sold in: thinset mortar by the bag, grout by the
 * bag or pail, backer board by the sheet (or an uncoupling membrane by the roll), each rounded up
 * once for the whole job with the store's waste.
 *
 * - Thinset: area ÷ the ft² one bag covers at the store's trowel notch (the mortar's data sheet
 *   governs; larger tiles take a larger notch and cover less: set the coverage for the notch used).
 * - Grout: the volume of the joints, from the tiles' size, the joint width and its depth
 *   (arithmetic: a tile of L × W in laid with joints J wide fills a module (L + J) × (W + J) in,
 *   of which J × (L + W + J) in² is joint; times the depth D gives the joint volume per module),
 *   ÷ the yield of one bag or pail (the grout's data sheet).
 * - Backer: the area under tile over wood ÷ the ft² one sheet (3 × 5 ft = 15 ft², maker
 *   literature, memory) or one roll of membrane covers.
 */
import { ceilUnits } from './math';

/** A grout joint when the price book gives none (memory: 1/8 in is common for floor tile). */
export const DEFAULT_GROUT_JOINT_IN = 1 / 8;
/** Joint depth when the price book gives none: the tile's thickness (memory: 3/8 in porcelain). */
export const DEFAULT_GROUT_DEPTH_IN = 3 / 8;

/** in³ of grout per ft² of floor for tiles `lengthIn` × `widthIn`, joints `jointIn` wide and `depthIn` deep. */
export function groutCuInPerSqFt(
	lengthIn: number,
	widthIn: number,
	jointIn: number,
	depthIn: number
): number {
	const module = (lengthIn + jointIn) * (widthIn + jointIn);
	const joint = jointIn * (lengthIn + widthIn + jointIn);
	return (144 * joint * depthIn) / module;
}

/** Whole units of a product covering `areaSqFt` (with `wastePct`) at `coverageSqFt` a unit. */
export function unitsByCoverage(areaSqFt: number, coverageSqFt: number, wastePct: number): number {
	return ceilUnits((areaSqFt * (1 + wastePct / 100)) / coverageSqFt);
}

/** Whole bags or pails of grout for `cuIn` of joints (with `wastePct`), each yielding `yieldCuFt`. */
export function groutUnits(cuIn: number, yieldCuFt: number, wastePct: number): number {
	return ceilUnits((cuIn * (1 + wastePct / 100)) / (yieldCuFt * 1728));
}
