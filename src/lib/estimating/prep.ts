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
	| 'transition'
	| 'underlayment_skim'
	| 'primer'
	| 'tile_backer'
	| 'tile_setting'
	| 'underlay'
	| 'vapour_retarder'
	| 'felt_paper'
	| 'carpet_pad'
	| 'tack_strip'
	| 'carpet_seam'
	| 'base_reset'
	| 'base_new'
	| 'shoe_new'
	| 'reducer'
	| 'threshold'
	| 'door_undercut'
	| 'furniture'
	| 'appliance_reset'
	| 'toilet_reset'
	| 'stairs'
	| 'haul_away'
	| 'trip_charge'
	| 'minimum_job';

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
	transition: { label: 'Transition strips', unit: 'each' },
	underlayment_skim: {
		label: 'Skim underlayment seams and fastener heads',
		unit: 'sqft'
	},
	primer: { label: 'Prime before the leveller is poured', unit: 'sqft' },
	tile_backer: { label: 'Backer board or membrane under tile', unit: 'sqft' },
	tile_setting: { label: 'Set and grout tile', unit: 'sqft' },
	underlay: { label: 'Underlay under the floating floor', unit: 'sqft' },
	vapour_retarder: { label: '6-mil vapour retarder on the slab', unit: 'sqft' },
	felt_paper: { label: 'Felt or paper under nailed wood', unit: 'sqft' },
	carpet_pad: { label: 'Carpet pad', unit: 'sqft' },
	tack_strip: { label: 'Tack strip', unit: 'linft' },
	carpet_seam: { label: 'Carpet seams: tape and seaming', unit: 'linft' },
	base_reset: { label: 'Remove and reinstall baseboard and shoe', unit: 'linft' },
	base_new: { label: 'New baseboard', unit: 'linft' },
	shoe_new: { label: 'New shoe or quarter-round', unit: 'linft' },
	reducer: { label: 'Reducers at doorways', unit: 'each' },
	threshold: { label: 'Thresholds at doorways', unit: 'each' },
	door_undercut: { label: 'Undercut doors', unit: 'each' },
	furniture: { label: 'Move furniture out and back', unit: 'room' },
	appliance_reset: { label: 'Disconnect and reset appliances', unit: 'each' },
	toilet_reset: { label: 'Pull and reset toilets', unit: 'each' },
	stairs: { label: 'Stairs: treads, risers and nosings', unit: 'each' },
	haul_away: { label: 'Haul away and dispose of old flooring', unit: 'sqft' },
	trip_charge: { label: 'Trip charge', unit: 'each' },
	minimum_job: { label: 'Minimum job charge', unit: 'each' }
};

/**
 * Items a store may switch off (leave out of its price book, or mark inactive): a room that
 * calls for one without a price gets a warning naming it, never an error and never a price.
 */
export const OPTIONAL_PREP: ReadonlySet<PrepKind> = new Set<PrepKind>([
	'underlayment_skim',
	'primer',
	'tile_backer',
	'tile_setting',
	'underlay',
	'vapour_retarder',
	'felt_paper',
	'carpet_pad',
	'tack_strip',
	'carpet_seam',
	'base_reset',
	'base_new',
	'shoe_new',
	'reducer',
	'threshold',
	'door_undercut',
	'furniture',
	'appliance_reset',
	'toilet_reset',
	'stairs',
	'haul_away',
	'trip_charge',
	'minimum_job'
]);

export const PREP_KINDS = Object.keys(PREP) as PrepKind[];

/** Quantities of one prep item in each measure it can be priced by. */
export type Measures = Partial<Record<Basis, number>>;
