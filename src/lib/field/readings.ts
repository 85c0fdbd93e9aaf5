/**
 * The kinds of reading an installer takes on site and their labels. Plain data, no zod, so the
 * phone's work order can show them without shipping the schema library: the schemas in
 * `$lib/schemas/field` build on these.
 */
export const READING_KIND_VALUES = [
	'flatness',
	'rh',
	'calcium_chloride',
	'wood_mc_subfloor',
	'wood_mc_flooring'
] as const;

export type ReadingKind = (typeof READING_KIND_VALUES)[number];

export const READING_LABELS: Record<ReadingKind, string> = {
	flatness: 'Flatness (straightedge)',
	rh: 'Slab RH probe (%)',
	calcium_chloride: 'Calcium chloride dish',
	wood_mc_subfloor: 'Subfloor moisture (%)',
	wood_mc_flooring: 'Flooring moisture (%)'
};
