/**
 * The Calculators page's forms: what each calculator asks for, typed as people type it. Reading
 * and running them is `./evaluate` (the engine and zod), kept apart so that an open calculator
 * draws its form without them.
 *
 * Values are flat strings keyed by the calculator's input path (`readings.0.spanIn`), so a form
 * posts them as they are and a zod issue's path names its field.
 */
// The engine's modules by name, not its index: an open calculator draws its form without the
// engine, which comes with `./evaluate` (importing the index would put all of it in one chunk).
import { JOIST_SIZES, type StoreSettings } from '$lib/estimating/settings';
import { CUIN_PER_US_GAL } from '$lib/estimating/units';
import { draftUnits } from '$lib/measure/draft';
import {
	FLOOR_KIND_LABELS,
	LAYOUT_LABELS,
	options,
	SPECIES_LABELS,
	SUBFLOOR_LABELS
} from '$lib/measure/labels';
import type { CalculatorName, CalculatorResult } from './registry';
import { readNumber } from '$lib/input';

/** What was typed, by field name. */
export type Values = Record<string, string>;

/** The store settings the calculators read; money settings never reach the browser. */
export type CalculatorSettings = Omit<StoreSettings, 'taxes' | 'taxRounding' | 'deposit'>;

/** The settings without the money keys, for the page's load. */
export function calculatorSettings(settings: StoreSettings): CalculatorSettings {
	const { taxes: _t, taxRounding: _r, deposit: _d, ...rest } = settings;
	return rest;
}

type Option = { value: string; label: string };

interface Base {
	/** The input path this field fills, e.g. `spanIn` or `container.atDepthIn`. */
	name: string;
	label: string;
	hint?: string;
	placeholder?: string;
	optional?: boolean;
	/** Asked only when this holds (e.g. coverage fields for a coverage container). */
	when?: (values: Values) => boolean;
}

export type FieldSpec =
	| (Base & { kind: 'length'; size: 'room' | 'small' })
	| (Base & { kind: 'area' })
	| (Base & {
			kind: 'number';
			units?: string[];
			min?: number;
			max?: number;
			integer?: boolean;
			/** Multiplies what was typed into the input's unit (US gal → in³). */
			scale?: number;
	  })
	| (Base & {
			kind: 'select';
			options: Option[] | ((s: CalculatorSettings) => Option[]);
			initial?: string | ((s: CalculatorSettings) => string);
			/** Not part of the input: only chooses which other fields are asked. */
			uiOnly?: boolean;
	  })
	| (Base & { kind: 'text'; maxLength: number });

/** Rows of the same fields (readings, voids); a row left blank is not counted. */
export interface RowsSpec {
	kind: 'rows';
	name: string;
	label: string;
	/** One field per row with `name: ''` makes a list of plain values (`rhPct.0`). */
	fields: FieldSpec[];
	rowLabel: string;
	addLabel: string;
	min: number;
	max: number;
	initialRows: number;
	/** May have no rows at all (cut-outs); other groups always show one to type in. */
	allowNone?: boolean;
	hint?: string;
}

/** A room outline: a rectangle, several rectangles or the walls walked, with cut-outs. */
export interface ShapeSpec {
	kind: 'shape';
	cutouts: boolean;
}

export type Part = FieldSpec | RowsSpec | ShapeSpec;

export interface CalculatorForm {
	parts: Part[];
	/** Where the engine's own refusal is shown when it names no field. */
	failField: string;
	/** Checks across fields that the schema cannot state. */
	finish?: (input: Record<string, unknown>, problems: Problems) => void;
}

export interface Problem {
	message: string;
	/** Nothing typed yet: shown once the field was left or the form sent. */
	missing: boolean;
}
export type Problems = Record<string, Problem>;

const none = { value: '', label: 'Not chosen' };
const floorOptions = [none, ...options(FLOOR_KIND_LABELS)];
const sizeOptions = JOIST_SIZES.map((s) => ({ value: s, label: s }));

const pct = (name: string, label: string, optional = false, hint?: string): FieldSpec => ({
	kind: 'number',
	name,
	label,
	units: ['%'],
	min: 0,
	max: 100,
	optional,
	hint
});
const area = (name: string, label: string, hint?: string): FieldSpec => ({
	kind: 'area',
	name,
	label,
	hint,
	placeholder: 'e.g. 120 or 12 x 10'
});

/** The forms, one per calculator, in the order the page lists them. */
export const forms: Record<CalculatorName, CalculatorForm> = {
	cartons: {
		failField: 'areaSqFt',
		parts: [
			area('areaSqFt', 'Floor area'),
			{ ...area('coverageSqFt', 'Area one carton covers'), placeholder: 'e.g. 20.5' },
			{
				kind: 'select',
				name: 'layout',
				label: 'Layout',
				options: options(LAYOUT_LABELS),
				initial: 'straight'
			},
			pct('wastePct', 'Waste (leave empty for the store’s)', true)
		]
	},
	area: { failField: 'shape', parts: [{ kind: 'shape', cutouts: true }] },
	joists: {
		failField: 'spanIn',
		parts: [
			{ kind: 'select', name: 'size', label: 'Joist size', options: sizeOptions, initial: '2x10' },
			{
				kind: 'select',
				name: 'species',
				label: 'Species (No.2 grade)',
				options: options(SPECIES_LABELS),
				initial: 'spruce_pine_fir'
			},
			{
				kind: 'length',
				size: 'small',
				name: 'spacingIn',
				label: 'Spacing, centre to centre',
				placeholder: 'e.g. 16'
			},
			{
				kind: 'length',
				size: 'room',
				name: 'spanIn',
				label: 'Span between supports',
				placeholder: `e.g. 14' 6"`
			},
			{ kind: 'select', name: 'floorKind', label: 'Floor going over it', options: floorOptions },
			{
				kind: 'number',
				name: 'ratio',
				label: 'Required L/Δ (leave empty for the floor’s)',
				units: [],
				min: 1,
				max: 10000,
				optional: true,
				placeholder: 'e.g. 360'
			},
			{
				kind: 'number',
				name: 'livePsf',
				label: 'Live load, psf (leave empty for the store’s)',
				units: ['psf'],
				min: 1,
				max: 1000,
				optional: true
			},
			{
				kind: 'number',
				name: 'deadPsf',
				label: 'Dead load, psf (leave empty for the store’s)',
				units: ['psf'],
				min: 0,
				max: 1000,
				optional: true
			}
		]
	},
	roll: {
		failField: 'shape',
		parts: [
			{ kind: 'shape', cutouts: false },
			{
				kind: 'length',
				size: 'room',
				name: 'rollWidthIn',
				label: 'Roll width',
				placeholder: 'e.g. 12 or 4 m'
			},
			{
				kind: 'length',
				size: 'small',
				name: 'trimPerEndIn',
				label: 'Trim per cut end (leave empty for the store’s)',
				optional: true
			},
			{
				kind: 'select',
				name: 'direction',
				label: 'Drops run',
				options: [
					{ value: '', label: 'Whichever uses less' },
					{ value: 'x', label: 'Along the width' },
					{ value: 'y', label: 'Along the length' }
				]
			}
		]
	},
	underlayment: {
		failField: 'schedule',
		parts: [
			area('areaSqFt', 'Floor area'),
			{
				kind: 'select',
				name: 'schedule',
				label: 'Fastening schedule',
				options: (s) =>
					Object.entries(s.underlayment.schedules).map(([value, f]) => ({
						value,
						label: f.name
					})),
				initial: (s) => s.underlayment.schedule
			},
			{
				kind: 'number',
				name: 'perBox',
				label: 'Fasteners per box (optional)',
				integer: true,
				min: 1,
				max: 1_000_000,
				optional: true
			}
		]
	},
	patch: {
		failField: 'voids',
		parts: [
			{
				kind: 'rows',
				name: 'voids',
				label: 'Seams and dents',
				rowLabel: 'Seam or dent',
				addLabel: 'Add a seam or dent',
				min: 1,
				max: 30,
				initialRows: 1,
				fields: [
					{ kind: 'length', size: 'room', name: 'lengthIn', label: 'Length' },
					{ kind: 'length', size: 'small', name: 'widthIn', label: 'Width (widest)' },
					{ kind: 'length', size: 'small', name: 'depthIn', label: 'Depth' }
				]
			},
			{
				kind: 'select',
				name: 'containerKind',
				label: 'The container is sold by',
				uiOnly: true,
				options: [
					{ value: 'volume', label: 'Volume (US gallons)' },
					{ value: 'coverage', label: 'Coverage at a depth' }
				],
				initial: 'volume'
			},
			{
				kind: 'number',
				name: 'container.volumeCuIn',
				label: 'Container size, US gal',
				units: ['gal', 'us gal'],
				min: 0.001,
				max: 10000,
				scale: CUIN_PER_US_GAL,
				when: (v) => (v.containerKind || 'volume') === 'volume'
			},
			{
				...area('container.coverageSqFt', 'Area one container covers'),
				placeholder: 'e.g. 25',
				when: (v) => v.containerKind === 'coverage'
			},
			{
				kind: 'length',
				size: 'small',
				name: 'container.atDepthIn',
				label: 'At a depth of',
				when: (v) => v.containerKind === 'coverage'
			},
			pct('wastePct', 'Waste (leave empty for the store’s)', true)
		]
	},
	leveller: {
		failField: 'areaSqFt',
		parts: [
			area('areaSqFt', 'Area to level'),
			{ kind: 'length', size: 'small', name: 'depthIn', label: 'Average depth' },
			{
				kind: 'number',
				name: 'bagYieldCuFt',
				label: 'Bag yield, ft³ (from the data sheet)',
				units: ['ft³', 'ft3', 'cu ft'],
				min: 0.001,
				max: 100,
				placeholder: 'e.g. 0.45'
			},
			pct('wastePct', 'Waste (leave empty for the store’s)', true)
		]
	},
	sheathing: {
		failField: 'thicknessIn',
		parts: [
			{
				kind: 'select',
				name: 'kind',
				label: 'Subfloor',
				options: (['plywood', 'osb', 'board'] as const).map((k) => ({
					value: k,
					label: SUBFLOOR_LABELS[k]
				})),
				initial: 'plywood'
			},
			{
				kind: 'length',
				size: 'small',
				name: 'thicknessIn',
				label: 'Thickness',
				placeholder: 'e.g. 5/8 or 19/32'
			},
			{
				kind: 'text',
				name: 'spanRating',
				label: 'Span rating stamped on the panel (optional)',
				maxLength: 12,
				optional: true,
				placeholder: 'e.g. 32/16'
			},
			{ kind: 'length', size: 'small', name: 'joistSpacingIn', label: 'Joist spacing' },
			{ kind: 'select', name: 'floorKind', label: 'Floor going over it', options: floorOptions }
		]
	},
	flatness: {
		failField: 'readings',
		parts: [
			{
				kind: 'select',
				name: 'floorKind',
				label: 'Floor going down',
				options: options(FLOOR_KIND_LABELS),
				initial: 'ceramic_tile'
			},
			{
				kind: 'select',
				name: 'subfloor',
				label: 'Over',
				options: [
					{ value: 'wood', label: 'A wood subfloor' },
					{ value: 'concrete', label: 'Concrete' }
				],
				initial: 'wood'
			},
			{
				kind: 'length',
				size: 'small',
				name: 'tileEdgesIn.0',
				label: 'Tile length (tile only)',
				optional: true
			},
			{
				kind: 'length',
				size: 'small',
				name: 'tileEdgesIn.1',
				label: 'Tile width (tile only)',
				optional: true
			},
			{
				kind: 'rows',
				name: 'readings',
				label: 'Straightedge readings',
				rowLabel: 'Reading',
				addLabel: 'Add a reading',
				min: 1,
				max: 30,
				initialRows: 1,
				fields: [
					{
						kind: 'length',
						size: 'room',
						name: 'spanIn',
						label: 'Straightedge length',
						placeholder: `e.g. 10'`
					},
					{
						kind: 'length',
						size: 'small',
						name: 'gapIn',
						label: 'Largest gap under it',
						placeholder: 'e.g. 3/16'
					}
				]
			}
		]
	},
	moisture: {
		failField: 'areaSqFt',
		parts: [
			area('areaSqFt', 'Floor area tested'),
			{
				kind: 'rows',
				name: 'rhPct',
				label: 'Concrete RH probes (in-situ), %',
				rowLabel: 'Probe',
				addLabel: 'Add a probe',
				min: 0,
				max: 50,
				initialRows: 1,
				fields: [pct('', 'RH, %')]
			},
			pct('rhLimitPct', 'RH limit (leave empty for the store’s)', true),
			{
				kind: 'rows',
				name: 'calciumChloride',
				label: 'Calcium chloride tests',
				rowLabel: 'Test',
				addLabel: 'Add a test',
				min: 0,
				max: 20,
				initialRows: 1,
				fields: [
					{
						kind: 'number',
						name: 'gainGrams',
						label: 'Dish weight gain, g',
						units: ['g'],
						min: 0,
						max: 1000
					},
					{ ...area('areaSqFt', 'Area under the dome'), placeholder: 'e.g. 0.25' },
					{
						kind: 'number',
						name: 'hours',
						label: 'Hours under the dome',
						units: ['h', 'hours'],
						min: 1,
						max: 1000
					}
				]
			},
			{
				kind: 'number',
				name: 'mverLimit',
				label: 'MVER limit, lb/1000 ft²/24 h (leave empty for the store’s)',
				min: 0.01,
				max: 100,
				optional: true
			},
			{
				kind: 'rows',
				name: 'woodMc.subfloorPct',
				label: 'Wood subfloor moisture readings, % MC',
				rowLabel: 'Subfloor reading',
				addLabel: 'Add a subfloor reading',
				min: 0,
				max: 50,
				initialRows: 1,
				fields: [pct('', 'MC, %')]
			},
			{
				kind: 'rows',
				name: 'woodMc.flooringPct',
				label: 'Wood flooring moisture readings, % MC',
				rowLabel: 'Flooring reading',
				addLabel: 'Add a flooring reading',
				min: 0,
				max: 50,
				initialRows: 1,
				fields: [pct('', 'MC, %')]
			},
			{
				kind: 'length',
				size: 'small',
				name: 'woodMc.boardWidthIn',
				label: 'Flooring board width (wood only)',
				optional: true
			}
		],
		finish: (input, problems) => {
			const wood = input.woodMc as
				{ subfloorPct?: number[]; flooringPct?: number[]; boardWidthIn?: number } | undefined;
			if (wood) {
				if (!wood.subfloorPct?.length && !wood.flooringPct?.length) delete input.woodMc;
				else if (!wood.subfloorPct?.length)
					problems['woodMc.subfloorPct'] = {
						message: 'Add a subfloor reading to compare the flooring with',
						missing: true
					};
				else {
					wood.subfloorPct ??= [];
					wood.flooringPct ??= [];
				}
			}
			if (
				!(input.rhPct as unknown[] | undefined)?.length &&
				!(input.calciumChloride as unknown[] | undefined)?.length &&
				!input.woodMc &&
				!problems['woodMc.subfloorPct']
			)
				problems.rhPct = {
					message: 'Enter at least one reading: an RH probe, a calcium chloride test or wood',
					missing: true
				};
		}
	},
	units: {
		failField: 'text',
		parts: [
			{
				kind: 'text',
				name: 'text',
				label: 'Length as typed',
				maxLength: 80,
				placeholder: `e.g. 12' 6 1/2" or 3810 mm`
			},
			{
				kind: 'select',
				name: 'defaultUnit',
				label: 'A plain number is in',
				options: [
					{ value: 'in', label: 'Inches' },
					{ value: 'ft', label: 'Feet' },
					{ value: 'mm', label: 'Millimetres' },
					{ value: 'cm', label: 'Centimetres' },
					{ value: 'm', label: 'Metres' }
				],
				initial: (s) => s.units.defaultLengthUnit
			}
		]
	}
};

export { CALCULATOR_ORDER, isCalculatorName } from './catalogue';

/** The options of a select field for this store. */
export function optionsOf(field: FieldSpec & { kind: 'select' }, s: CalculatorSettings) {
	return typeof field.options === 'function' ? field.options(s) : field.options;
}

function initialOf(field: FieldSpec & { kind: 'select' }, s: CalculatorSettings) {
	const initial = typeof field.initial === 'function' ? field.initial(s) : field.initial;
	return initial ?? optionsOf(field, s)[0]?.value ?? '';
}

/** Rows shown for a group: what the values say (`voids.rows`), within its bounds. */
export function rowCount(values: Values, rows: RowsSpec): number {
	const typed = readNumber(values[`${rows.name}.rows`] ?? '', { label: 'the rows', integer: true });
	const count = typed.ok ? typed.value : rows.initialRows;
	const least = rows.allowNone ? rows.min : Math.max(rows.min, 1);
	return Math.min(rows.max, Math.max(least, count));
}

export type ShapeKind = 'rect' | 'rects' | 'sides';
export const SHAPE_KINDS: Option[] = [
	{ value: 'rect', label: 'A rectangle' },
	{ value: 'rects', label: 'Rectangles joined (L, T, closets)' },
	{ value: 'sides', label: 'Walk the walls' }
];
export const TURNS: Option[] = [
	{ value: 'left', label: 'Turn left 90°' },
	{ value: 'right', label: 'Turn right 90°' },
	{ value: '45', label: 'Turn left 45°' },
	{ value: '-45', label: 'Turn right 45°' }
];

/** The rows groups a shape part uses, so the page can add and remove them like any other. */
export const SHAPE_ROWS: Record<'rects' | 'sides' | 'cutouts', RowsSpec> = {
	rects: {
		kind: 'rows',
		name: 'shape.rects',
		label: 'Rectangles',
		rowLabel: 'Rectangle',
		addLabel: 'Add a rectangle',
		min: 1,
		max: 20,
		initialRows: 2,
		fields: [
			{ kind: 'length', size: 'room', name: 'x', label: 'From the left', optional: true },
			{ kind: 'length', size: 'room', name: 'y', label: 'From the bottom', optional: true },
			{ kind: 'length', size: 'room', name: 'width', label: 'Width' },
			{ kind: 'length', size: 'room', name: 'length', label: 'Length' }
		]
	},
	sides: {
		kind: 'rows',
		name: 'shape.sides',
		label: 'Walls, walked from the first corner',
		rowLabel: 'Wall',
		addLabel: 'Add a wall',
		min: 3,
		max: 60,
		initialRows: 4,
		hint: 'The first wall runs to the right; after each wall, turn as the room does.',
		fields: [
			{ kind: 'length', size: 'room', name: 'length', label: 'Length' },
			{ kind: 'select', name: 'turn', label: 'Then', options: TURNS, initial: 'left' }
		]
	},
	cutouts: {
		kind: 'rows',
		name: 'cutouts',
		label: 'Cut-outs (no floor: islands, cabinets, hearths)',
		rowLabel: 'Cut-out',
		addLabel: 'Add a cut-out',
		min: 0,
		max: 20,
		initialRows: 0,
		allowNone: true,
		fields: [
			{ kind: 'text', name: 'name', label: 'What', maxLength: 60, optional: true },
			{ kind: 'length', size: 'room', name: 'x', label: 'From the left', optional: true },
			{ kind: 'length', size: 'room', name: 'y', label: 'From the bottom', optional: true },
			{ kind: 'length', size: 'room', name: 'width', label: 'Width' },
			{ kind: 'length', size: 'room', name: 'length', label: 'Length' }
		]
	}
};

/** Every rows group of a form (its own and its shape's), for adding and removing rows. */
export function rowsOf(name: CalculatorName): RowsSpec[] {
	return forms[name].parts.flatMap((p) =>
		p.kind === 'rows'
			? [p]
			: p.kind === 'shape'
				? [SHAPE_ROWS.rects, SHAPE_ROWS.sides, ...(p.cutouts ? [SHAPE_ROWS.cutouts] : [])]
				: []
	);
}

/** The values with one more row in a group (the no-JavaScript "Add" button posts this). */
export function addRow(values: Values, calculator: CalculatorName, group: string): Values {
	const rows = rowsOf(calculator).find((r) => r.name === group);
	if (!rows) return values;
	return { ...values, [`${group}.rows`]: String(Math.min(rows.max, rowCount(values, rows) + 1)) };
}

/** The values without row `index` of a group; the rows after it move up. */
export function removeRow(
	values: Values,
	calculator: CalculatorName,
	group: string,
	index: number
): Values {
	const rows = rowsOf(calculator).find((r) => r.name === group);
	if (!rows) return values;
	const count = rowCount(values, rows);
	if (count <= (rows.allowNone ? rows.min : Math.max(rows.min, 1)) || index < 0 || index >= count)
		return values;
	const out: Values = {};
	const prefix = `${group}.`;
	for (const [key, value] of Object.entries(values)) {
		if (!key.startsWith(prefix)) {
			out[key] = value;
			continue;
		}
		const m = /^(\d+)(\..*)?$/.exec(key.slice(prefix.length));
		if (!m) continue;
		const i = Number(m[1]);
		if (i < index) out[key] = value;
		else if (i > index) out[`${prefix}${i - 1}${m[2] ?? ''}`] = value;
	}
	out[`${group}.rows`] = String(count - 1);
	return out;
}

/** The value a field shows: what was typed, or a select's first choice for this store. */
export function valueOf(values: Values, field: FieldSpec, key: string, s: CalculatorSettings) {
	const typed = values[key];
	if (typed !== undefined) return typed;
	return field.kind === 'select' ? initialOf(field, s) : '';
}

/** What a field reads a plain number as, for the hint under it. */
export function hintOf(field: FieldSpec, s: CalculatorSettings): string | undefined {
	if (field.hint) return field.hint;
	const units = draftUnits(s);
	if (field.kind === 'length') {
		const unit = { ft: 'Feet', m: 'Metres', in: 'Inches', mm: 'Millimetres' }[
			units[field.size] as 'ft' | 'm' | 'in' | 'mm'
		];
		return `${unit} unless you type a unit (12' 6 1/2", 3810 mm)`;
	}
	if (field.kind === 'area')
		return `${units.room === 'm' ? 'm²' : 'ft²'} unless you type a unit, or two sides (12' x 10')`;
	return undefined;
}

export interface Evaluation {
	/** Problems by field name, row (`readings.1`) or group (`readings`). */
	problems: Problems;
	/** How each readable length or area was read, to show beside it. */
	readAs: Record<string, string>;
	/** The calculator's input, once everything could be read. */
	input?: unknown;
	result?: CalculatorResult;
}
