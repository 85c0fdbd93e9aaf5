/**
 * What each calculator is called and says it does, and the order the page lists them (the most
 * used first). Plain data, so the list of calculators ships without the engine and the schemas;
 * `registry.ts` builds each calculator on its entry here.
 */
export const CALCULATOR_CATALOGUE = {
	units: {
		title: 'Lengths',
		summary: 'Reads a length as typed (ft-in, fractions, mm, m) and writes it back in every unit.'
	},
	area: {
		title: 'Room area',
		summary:
			'Area and perimeter of a room from rectangles or sides, less its cut-outs, with a drawable outline.'
	},
	cartons: {
		title: 'Cartons',
		summary:
			'Cartons of plank, laminate, wood or tile for an area, with the store waste for the layout.'
	},
	roll: {
		title: 'Roll goods',
		summary: 'Drops, seams, linear feet and square yards of carpet or sheet vinyl for a room.'
	},
	underlayment: {
		title: 'Underlayment panels',
		summary: 'Panels for an area and the fasteners each takes by the fastening schedule.'
	},
	patch: {
		title: 'Patch compound',
		summary: 'Patch for open seams and dents, in whole containers.'
	},
	leveller: {
		title: 'Self-levelling underlayment',
		summary: 'Bags of leveller for an area at an average depth, from the bag yield.'
	},
	joists: {
		title: 'Joist deflection and span',
		summary: 'L/Δ and bending of floor joists against the floor, and the longest span that passes.'
	},
	sheathing: {
		title: 'Sheathing',
		summary: 'Subfloor thickness and span rating against the joist spacing and the floor.'
	},
	flatness: {
		title: 'Flatness',
		summary:
			'Straightedge readings against the floor’s flatness tolerance (large-format tile included).'
	},
	moisture: {
		title: 'Moisture',
		summary:
			'Concrete RH and calcium-chloride MVER with the tests the area needs, and wood MC by board width.'
	}
} as const satisfies Record<string, { title: string; summary: string }>;

export type CalculatorName = keyof typeof CALCULATOR_CATALOGUE;

/** The calculators in the order the page lists them (the most used first). */
export const CALCULATOR_ORDER: readonly CalculatorName[] = [
	'cartons',
	'area',
	'joists',
	'roll',
	'underlayment',
	'patch',
	'leveller',
	'sheathing',
	'flatness',
	'moisture',
	'units'
];

/** Whether a name (from a URL or a form) is one of the calculators. */
export function isCalculatorName(name: unknown): name is CalculatorName {
	return typeof name === 'string' && Object.hasOwn(CALCULATOR_CATALOGUE, name);
}
