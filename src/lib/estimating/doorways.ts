/**
 * Doors over the new floor. Where a door swings in a doorway and the new floor stands higher
 * than the next room's finished floor (the floor the door was hung to clear), the door may bind:
 * a finding asks to check it and undercut it by the rise if it does not clear (common practice;
 * an undercut saw set to the new floor's height, with the new floor's offcut as the gauge).
 * Build-up is the floor as laid plus new 1/4 in underlayment panels when they go down.
 */
import type { FloorProduct } from './pricing';
import type { Check } from './substrate';
import type { DoorwayMeasure } from './types';
import { formatLength } from './units';

/** Height of the new floor above the subfloor, in, when the price book gives its thickness. */
export function buildUpIn(product: FloorProduct, newUnderlayment: boolean): number | undefined {
	return product.thicknessIn === undefined
		? undefined
		: product.thicknessIn + (newUnderlayment ? 0.25 : 0);
}

/** One check per doorway with a door where the new floor rises above the next room's. */
export function doorChecks(
	doorways: readonly DoorwayMeasure[],
	buildUp: number | undefined
): { check: Check; doorway: number }[] {
	const out: { check: Check; doorway: number }[] = [];
	if (buildUp === undefined) return out;
	doorways.forEach((d, k) => {
		if (!d.door || d.nextFloorIn === undefined) return;
		const rise = buildUp - d.nextFloorIn;
		if (!(rise > 1e-9)) return;
		const by = formatLength(rise, 'in', { denominator: 32 });
		out.push({
			doorway: k,
			check: {
				check: 'door_clearance',
				pass: false,
				measured: rise,
				limit: 0,
				unit: 'in',
				message: `Doorway ${k + 1}: the new floor stands ${by} above the next room's where a door swings; check that the door clears it, and undercut the door by ${by} if it does not`,
				rule: 'A door swinging over a floor raised above the one it was hung for is undercut to clear it',
				source: 'common practice',
				suggestedPrep: [{ kind: 'door_undercut', note: `Undercut the door by ${by}` }],
				cautions: ['dust_tools']
			}
		});
	});
	return out;
}
