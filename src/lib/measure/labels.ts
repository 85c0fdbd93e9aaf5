import type {
	ExistingFloorKind,
	FloorKind,
	Layout,
	PrepKind,
	Species,
	SubfloorKind,
	SupplyKind
} from '$lib/estimating';
import { PREP } from '$lib/estimating/prep';

export const FLOOR_KIND_LABELS: Record<FloorKind, string> = {
	laminate: 'Laminate',
	vinyl_plank: 'Vinyl plank',
	engineered_wood: 'Engineered wood',
	hardwood: 'Solid hardwood',
	ceramic_tile: 'Ceramic or porcelain tile',
	stone_tile: 'Natural stone tile',
	sheet_vinyl: 'Sheet vinyl',
	carpet: 'Carpet'
};

export const LAYOUT_LABELS: Record<Layout, string> = {
	straight: 'Straight',
	diagonal: 'Diagonal',
	herringbone: 'Herringbone'
};

export const EXISTING_FLOOR_LABELS: Record<ExistingFloorKind, string> = {
	carpet: 'Carpet and pad',
	sheet_vinyl: 'Sheet vinyl',
	vinyl_tile: 'Vinyl tile',
	vinyl_plank: 'Vinyl plank',
	laminate: 'Laminate',
	ceramic_tile: 'Ceramic tile',
	hardwood_nailed: 'Nailed hardwood',
	hardwood_glued: 'Glued hardwood'
};

export const SUBFLOOR_LABELS: Record<SubfloorKind, string> = {
	plywood: 'Plywood',
	osb: 'OSB',
	board: 'Boards (planks)',
	concrete: 'Concrete slab'
};

export const SPECIES_LABELS: Record<Species, string> = {
	douglas_fir_larch: 'Douglas fir-larch',
	hem_fir: 'Hem-fir',
	spruce_pine_fir: 'Spruce-pine-fir',
	southern_pine: 'Southern pine'
};

export const SUPPLY_LABELS: Record<SupplyKind, string> = {
	underlayment_panel: 'Underlayment panel',
	fastener: 'Underlayment fasteners',
	patch: 'Patch compound',
	leveller: 'Self-levelling underlayment',
	thinset: 'Thinset mortar',
	grout: 'Grout',
	backer: 'Backer board or membrane',
	baseboard: 'Baseboard (stock lengths)',
	shoe: 'Shoe or quarter-round (stock lengths)'
};

export const PREP_LABELS: Record<PrepKind, string> = Object.fromEntries(
	Object.entries(PREP).map(([k, v]) => [k, v.label])
) as Record<PrepKind, string>;

/** `{ value, label }` pairs for a select, in the labels' order. */
export function options<K extends string>(labels: Record<K, string>) {
	return (Object.keys(labels) as K[]).map((value) => ({ value, label: labels[value] }));
}
