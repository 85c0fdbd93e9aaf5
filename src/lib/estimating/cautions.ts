/**
 * Caution texts shown beside results (TRADE.md "Cautions to show"). Results are planning aids,
 * never an engineer's stamp.
 */

export type CautionKind =
	'planning_aid' | 'maker_instructions' | 'structure' | 'asbestos' | 'moisture' | 'dust_tools';

export const CAUTION_KINDS: readonly CautionKind[] = [
	'planning_aid',
	'maker_instructions',
	'structure',
	'asbestos',
	'moisture',
	'dust_tools'
];

export const CAUTIONS: Record<CautionKind, string> = {
	planning_aid:
		'A planning aid, not an engineering design: confirm with the flooring maker’s instructions and local building codes.',
	maker_instructions:
		'Confirm with the flooring maker’s installation instructions and local codes; the maker’s instructions take precedence.',
	structure:
		'Joists and structure: cutting, notching or sistering joists or removing walls needs a licensed professional and may need a permit. Confirm with local building codes.',
	asbestos:
		'Older floors: sheet vinyl, tile and their adhesive in older homes can contain asbestos. Have them tested before tear-out; do not sand, grind or dry-scrape them.',
	moisture:
		'Moisture: follow the flooring maker’s limits for the subfloor; a reading over the limit means wait and retest or use the barrier the maker allows.',
	dust_tools:
		'Dust and power tools: wear eye, ear and lung protection; set the saw blade just deeper than the panel, never to full depth over a finished subfloor.'
};

/** The caution texts for a set of kinds, in a stable order. */
export function cautionTexts(kinds: readonly CautionKind[]): string[] {
	// A plain loop: this runs for every finding, and a filter-then-map chain made two lists.
	const texts: string[] = [];
	for (const k of CAUTION_KINDS) if (kinds.includes(k)) texts.push(CAUTIONS[k]);
	return texts;
}
