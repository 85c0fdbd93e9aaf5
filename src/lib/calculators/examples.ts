/**
 * One valid body for each calculator, in the API's units (inches, ft², %): the OpenAPI
 * document shows them with the engine's answer, and the API tests send them.
 */
import type { CalculatorName } from './registry';

export const calculatorExamples: Record<CalculatorName, Record<string, unknown>> = {
	cartons: { areaSqFt: 120, coverageSqFt: 20.5, layout: 'straight' },
	area: {
		shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
		cutouts: [
			{ name: 'Island', shape: { kind: 'rect', xIn: 40, yIn: 40, widthIn: 48, lengthIn: 30 } }
		]
	},
	joists: {
		size: '2x10',
		species: 'spruce_pine_fir',
		spacingIn: 16,
		spanIn: 168,
		floorKind: 'ceramic_tile'
	},
	roll: { shape: { kind: 'rect', widthIn: 144, lengthIn: 120 }, rollWidthIn: 144 },
	underlayment: { areaSqFt: 300, perBox: 1000 },
	patch: {
		voids: [{ lengthIn: 96, widthIn: 0.25, depthIn: 0.125 }],
		container: { volumeCuIn: 231 }
	},
	leveller: { areaSqFt: 100, depthIn: 0.25, bagYieldCuFt: 0.45 },
	sheathing: { kind: 'plywood', thicknessIn: 0.625, joistSpacingIn: 16, floorKind: 'hardwood' },
	flatness: {
		floorKind: 'ceramic_tile',
		subfloor: 'wood',
		tileEdgesIn: [12, 24],
		readings: [{ spanIn: 120, gapIn: 0.125 }]
	},
	moisture: { areaSqFt: 1500, rhPct: [72, 74, 76] },
	units: { text: `12' 6 1/2"` }
};
