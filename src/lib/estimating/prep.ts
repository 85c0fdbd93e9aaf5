/**
 * The prep kinds the engine emits, and the measures each can be priced by. A price-book line
 * for a prep kind picks one of its measures as its basis.
 */

export type PrepKind =
	| 'fastener_removal'
	| 'hole_repair'
	| 'seam_patch'
	| 'dent_patch'
	| 'underlayment'
	| 'level'
	| 'grind'
	| 'joist_sister'
	| 'structural_consult'
	| 'subfloor_overlay'
	| 'moisture_barrier'
	| 'moisture_retest'
	| 'moisture_test'
	| 'trim'
	| 'transition';

/** How a price-book line counts: by the piece, area, length, depth-area, time, room, or a sellable unit. */
export type Basis =
	| 'each'
	| 'sqft'
	| 'linft'
	| 'sqft_per_eighth_in'
	| 'hour'
	| 'room'
	| 'carton'
	| 'roll_sqyd'
	| 'roll_linft'
	| 'panel'
	| 'box'
	| 'bag'
	| 'container';

export const BASES: readonly Basis[] = [
	'each',
	'sqft',
	'linft',
	'sqft_per_eighth_in',
	'hour',
	'room',
	'carton',
	'roll_sqyd',
	'roll_linft',
	'panel',
	'box',
	'bag',
	'container'
];

export interface PrepInfo {
	label: string;
	/** The measure hours per unit are counted in (settings.schedule.prepHoursPerUnit). */
	unit: Basis;
}

export const PREP: Record<PrepKind, PrepInfo> = {
	fastener_removal: { label: 'Pull leftover fasteners, sweep and vacuum', unit: 'sqft' },
	hole_repair: { label: 'Close subfloor hole (blocking/backing and infill)', unit: 'each' },
	seam_patch: { label: 'Fill open seams with patch', unit: 'linft' },
	dent_patch: { label: 'Fill dents and voids with patch', unit: 'each' },
	underlayment: { label: 'Install underlayment panels', unit: 'sqft' },
	level: { label: 'Level low spots (patch or self-levelling underlayment)', unit: 'sqft' },
	grind: { label: 'Grind or plane high spots', unit: 'each' },
	joist_sister: { label: 'Sister joists', unit: 'each' },
	structural_consult: { label: 'Structural review by a licensed professional', unit: 'room' },
	subfloor_overlay: { label: 'Add a structural panel layer over the subfloor', unit: 'sqft' },
	moisture_barrier: { label: 'Moisture barrier the floor maker allows', unit: 'sqft' },
	moisture_retest: { label: 'Let dry or acclimate, then retest moisture', unit: 'each' },
	moisture_test: { label: 'Moisture tests still needed', unit: 'each' },
	trim: { label: 'Trim along walls and cut-outs', unit: 'linft' },
	transition: { label: 'Transition strips', unit: 'each' }
};

export const PREP_KINDS = Object.keys(PREP) as PrepKind[];

/** Quantities of one prep item in each measure it can be priced by. */
export type Measures = Partial<Record<Basis, number>>;
