/**
 * The calculators: each one's title, its input schema (built from the engine's shared schemas,
 * so every number and list has the engine's bound) and its run function, from which
 * `POST /api/v1/calc/<name>`, the Calculators page and the OpenAPI document are built.
 * Browser-safe: imports only zod, the engine and the shared schemas.
 *
 * A run never throws for work beyond the engine's `LIMITS`: it answers `ok: false` with the
 * `field` at fault, the `message` and the `limit` passed, which the API turns into a 400.
 */
import { z } from 'zod';
import { CALCULATOR_CATALOGUE } from './catalogue';
import {
	cartonTakeoff,
	CAUTIONS,
	cautionTexts,
	defaultSettings,
	fastenersPerPanel,
	flatnessCheck,
	flatnessRules,
	FLOOR_KINDS,
	formatArea,
	formatLength,
	joistCheck,
	LimitError,
	levellerTakeoff,
	LIMITS,
	mverChecks,
	parseLength,
	patchTakeoff,
	rhChecks,
	rollTakeoff,
	roomOutline,
	roomShape,
	sheathingChecks,
	underlaymentTakeoff,
	within,
	woodMoistureChecks,
	type StoreSettings
} from '$lib/estimating';
import {
	areaSqFt,
	bagYieldCuFt,
	bounded,
	calciumChlorideSchema,
	containerSchema,
	cutoutsSchema,
	flatnessReadingSchema,
	floorKindT,
	joistSize,
	layout,
	list,
	pct,
	positiveIn,
	readings,
	shapeSchema,
	smallIn,
	spacingIn,
	species,
	tileEdgesIn,
	voidSchema
} from '$lib/schemas/estimate';

/** A calculator's answer: its numbers with the rule, its source and the cautions to show. */
export interface CalculatorResult {
	ok: boolean;
	rule: string;
	source: string;
	cautions: string[];
	[key: string]: unknown;
}

interface Calculator<S extends z.ZodType> {
	title: string;
	summary: string;
	input: S;
	run: (input: z.infer<S>, settings?: StoreSettings) => CalculatorResult;
}

/** A refusal of work beyond the engine's limits, as a calculator's answer. */
export interface CalculatorRefusal extends CalculatorResult {
	ok: false;
	/** The input field at fault (`shape.sides`, `rhPct`). */
	field: string;
	message: string;
	/** The bound that was passed (`LIMITS`). */
	limit: number;
}

/** Whether an answer is a refusal of work beyond the engine's limits (a 400, not a 200). */
export function isRefusal(r: CalculatorResult): r is CalculatorRefusal {
	return r.ok === false && typeof r.limit === 'number' && typeof r.field === 'string';
}

/**
 * A calculator whose run answers a `LimitError` as a refusal. `fields` names, for the engine
 * function's own field, the calculator's input field (`readingsPct` → `rhPct`).
 */
const calc = <S extends z.ZodType>(
	c: Calculator<S>,
	fields: Record<string, string> = {}
): Calculator<S> => ({
	...c,
	run: (input, settings) => {
		try {
			return c.run(input, settings);
		} catch (e) {
			if (!(e instanceof LimitError)) throw e;
			const [head, ...rest] = e.path.split('.');
			const field = [fields[head] ?? head, ...rest].join('.');
			return {
				ok: false,
				field,
				message: e.message,
				limit: e.limit,
				rule: '',
				source: '',
				cautions: []
			};
		}
	}
});
const planning = [CAUTIONS.planning_aid];

export const calculators = {
	units: calc(
		{
			...CALCULATOR_CATALOGUE.units,
			input: z.object({
				text: z
					.string()
					.max(80, 'At most 80 characters')
					.describe('A length as typed, e.g. 12\' 6 1/2"'),
				defaultUnit: z.enum(['in', 'ft', 'mm', 'cm', 'm']).optional()
			}),
			run: ({ text, defaultUnit }, s = defaultSettings) => {
				const r = parseLength(text, defaultUnit ?? s.units.defaultLengthUnit);
				const base = {
					rule: '1 in = 25.4 mm exactly; 1 ft = 0.3048 m',
					source: 'international yard (1959), exact',
					cautions: []
				};
				if (!r.ok) return { ok: false, message: r.message, ...base };
				within(r.inches, 'inches', 'The length', LIMITS.formatIn, 'in');
				return {
					ok: true,
					inches: r.inches,
					ftIn: formatLength(r.inches),
					mm: formatLength(r.inches, 'mm'),
					m: formatLength(r.inches, 'm'),
					...base
				};
			}
		},
		{ inches: 'text' }
	),
	area: calc({
		...CALCULATOR_CATALOGUE.area,
		input: z.object({ shape: shapeSchema, cutouts: cutoutsSchema.optional() }),
		run: ({ shape, cutouts }, s = defaultSettings) => {
			const r = roomShape(shape, cutouts, { closureToleranceIn: s.geometry.closureToleranceIn });
			const base = {
				rule: 'area of the outline less cut-outs (polygon union and difference)',
				source: 'geometry',
				cautions: []
			};
			if (!r.ok) return { ok: false, field: r.field, message: r.message, ...base };
			return {
				ok: true,
				areaSqFt: r.areaSqFt,
				areaText: {
					sqft: formatArea(r.areaSqFt),
					sqyd: formatArea(r.areaSqFt, 'sqyd'),
					sqm: formatArea(r.areaSqFt, 'sqm')
				},
				perimeterIn: r.perimeterIn,
				wallPerimeterIn: r.wallPerimeterIn,
				outline: roomOutline(r),
				warnings: r.warnings,
				...base
			};
		}
	}),
	cartons: calc({
		...CALCULATOR_CATALOGUE.cartons,
		input: z.object({
			areaSqFt: areaSqFt('Floor area'),
			coverageSqFt: bounded('Carton coverage', 0.1, 1_000, 'ft²').describe('ft² per carton'),
			layout: layout.optional(),
			wastePct: pct('Waste (overrides the layout)').optional()
		}),
		run: (i, s = defaultSettings) => ({
			ok: true,
			...cartonTakeoff({
				areaSqFt: i.areaSqFt,
				coverageSqFt: i.coverageSqFt,
				wastePct: i.wastePct ?? s.wastePct[i.layout ?? 'straight']
			}),
			cautions: [CAUTIONS.maker_instructions]
		})
	}),
	roll: calc(
		{
			...CALCULATOR_CATALOGUE.roll,
			input: z.object({
				shape: shapeSchema,
				rollWidthIn: bounded(
					'Roll width',
					LIMITS.rollWidthMinIn,
					LIMITS.rollWidthMaxIn,
					'in'
				).describe('Roll width, in: 1–20 ft'),
				trimPerEndIn: smallIn('Trim per cut end').optional(),
				direction: z.enum(['x', 'y']).optional()
			}),
			run: (i, s = defaultSettings) => {
				const r = roomShape(i.shape);
				if (!r.ok)
					return {
						ok: false,
						field: r.field,
						message: r.message,
						rule: '',
						source: '',
						cautions: []
					};
				return {
					ok: true,
					...rollTakeoff({
						polygon: r.polygon,
						isRect: r.isRect,
						rollWidthIn: i.rollWidthIn,
						trimPerEndIn: i.trimPerEndIn ?? s.roll.trimPerEndIn,
						orderIncrementIn: s.roll.orderIncrementIn,
						direction: i.direction
					}),
					cautions: [CAUTIONS.maker_instructions]
				};
			}
		},
		{ polygon: 'shape' }
	),
	underlayment: calc({
		...CALCULATOR_CATALOGUE.underlayment,
		input: z.object({
			areaSqFt: areaSqFt('Area'),
			schedule: z.string().max(64).optional().describe('A schedule key in the store settings'),
			perBox: bounded('Per box', 1, 1_000_000).int().optional()
		}),
		run: (i, s = defaultSettings) => {
			const schedule = s.underlayment.schedules[i.schedule ?? s.underlayment.schedule];
			if (!schedule)
				return {
					ok: false,
					message: `No fastening schedule "${i.schedule}"`,
					rule: '',
					source: '',
					cautions: []
				};
			const panel = {
				widthIn: s.underlayment.panelWidthIn,
				lengthIn: s.underlayment.panelLengthIn
			};
			return {
				ok: true,
				...underlaymentTakeoff({
					areaSqFt: i.areaSqFt,
					wastePct: s.underlayment.wastePct,
					panel,
					schedule,
					perBox: i.perBox
				}),
				count: fastenersPerPanel(panel, schedule),
				cautions: [CAUTIONS.maker_instructions, CAUTIONS.dust_tools]
			};
		}
	}),
	patch: calc({
		...CALCULATOR_CATALOGUE.patch,
		input: z.object({
			voids: list(voidSchema, 'seams and dents', LIMITS.listItems).min(1),
			container: containerSchema,
			wastePct: pct('Waste').optional()
		}),
		run: (i, s = defaultSettings) => ({
			ok: true,
			...patchTakeoff({
				voids: i.voids,
				container: i.container,
				wastePct: i.wastePct ?? s.repairs.patchWastePct
			}),
			cureHours: s.schedule.cureHours.seam_patch,
			cautions: [CAUTIONS.maker_instructions]
		})
	}),
	leveller: calc({
		...CALCULATOR_CATALOGUE.leveller,
		input: z.object({
			areaSqFt: areaSqFt('Area'),
			depthIn: positiveIn('Average depth', LIMITS.depthIn),
			bagYieldCuFt,
			wastePct: pct('Waste').optional()
		}),
		run: (i, s = defaultSettings) => ({
			ok: true,
			...levellerTakeoff({
				areas: [{ areaSqFt: i.areaSqFt, depthIn: i.depthIn }],
				bagYieldCuFt: i.bagYieldCuFt,
				wastePct: i.wastePct ?? s.repairs.levellerWastePct
			}),
			cautions: [CAUTIONS.maker_instructions]
		})
	}),
	joists: calc({
		...CALCULATOR_CATALOGUE.joists,
		input: z.object({
			size: joistSize,
			species,
			spacingIn: spacingIn('On-centre spacing'),
			spanIn: positiveIn('Span'),
			floorKind: floorKindT.optional(),
			ratio: bounded('L/Δ', 1, 10_000).optional().describe('Required L/Δ (overrides the floor)'),
			livePsf: bounded('Live load', 1, 1_000, 'psf').optional(),
			deadPsf: bounded('Dead load', 0, 1_000, 'psf').optional()
		}),
		run: (i, s = defaultSettings) => {
			const ratio =
				i.ratio ?? (i.floorKind && s.joists.ratio[i.floorKind]) ?? s.joists.defaultRatio;
			const r = joistCheck({ ...i, ratio }, s.joists);
			return {
				ok: true,
				pass: r.checks.every((c) => c.pass),
				...r,
				rule: r.checks.map((c) => c.rule).join('; '),
				source: r.checks[0].source,
				cautions: cautionTexts(['planning_aid', 'structure'])
			};
		}
	}),
	sheathing: calc({
		...CALCULATOR_CATALOGUE.sheathing,
		input: z.object({
			kind: z.enum(['plywood', 'osb', 'board']),
			thicknessIn: positiveIn('Thickness', LIMITS.depthIn),
			spanRating: z.string().max(12).optional(),
			joistSpacingIn: spacingIn('Joist spacing'),
			floorKind: floorKindT.optional()
		}),
		run: (i, s = defaultSettings) => {
			const checks = sheathingChecks(i, s.sheathing);
			return {
				ok: true,
				pass: checks.every((c) => c.pass),
				checks,
				rule: checks.map((c) => c.rule).join('; '),
				source: checks.map((c) => c.source).join('; '),
				cautions: cautionTexts(['planning_aid', 'structure'])
			};
		}
	}),
	flatness: calc({
		...CALCULATOR_CATALOGUE.flatness,
		input: z.object({
			floorKind: floorKindT,
			subfloor: z.enum(['wood', 'concrete']),
			tileEdgesIn: tileEdgesIn.optional(),
			readings: readings(flatnessReadingSchema).min(1)
		}),
		run: (i, s = defaultSettings) => {
			const rules = flatnessRules(
				i.floorKind as (typeof FLOOR_KINDS)[number],
				i.subfloor,
				s.flatness,
				i.tileEdgesIn
			);
			if (!rules)
				return {
					ok: true,
					pass: true,
					checks: [],
					rule: 'no flatness rule for this floor',
					source: '',
					cautions: planning
				};
			const checks = i.readings.map((r) => flatnessCheck(r, rules));
			return {
				ok: true,
				pass: checks.every((c) => c.pass),
				checks,
				rule: rules
					.map((r) => `${formatLength(r.gapIn, 'in')} in ${formatLength(r.overIn)}`)
					.join(' and '),
				source: [...new Set(rules.map((r) => r.source))].join('; '),
				cautions: [CAUTIONS.maker_instructions]
			};
		}
	}),
	moisture: calc(
		{
			...CALCULATOR_CATALOGUE.moisture,
			input: z.object({
				areaSqFt: areaSqFt('Slab area'),
				rhPct: readings(pct('In-situ RH')).optional(),
				rhLimitPct: pct('RH limit').optional(),
				calciumChloride: readings(calciumChlorideSchema).optional(),
				mverLimit: bounded('MVER limit', 0, 100, 'lb/1000 ft²/24 h').optional(),
				woodMc: z
					.object({
						subfloorPct: readings(pct('MC')),
						flooringPct: readings(pct('MC')),
						boardWidthIn: positiveIn('Board width', 24).optional()
					})
					.optional()
			}),
			run: (i, s = defaultSettings) => {
				const checks = [
					...(i.rhPct?.length
						? rhChecks(
								{
									readingsPct: i.rhPct,
									areaSqFt: i.areaSqFt,
									limitPct: i.rhLimitPct ?? s.moisture.rhLimitPct
								},
								s.moisture
							)
						: []),
					...(i.calciumChloride?.length
						? mverChecks(
								{
									tests: i.calciumChloride,
									areaSqFt: i.areaSqFt,
									limit: i.mverLimit ?? s.moisture.mverLimit
								},
								s.moisture
							)
						: []),
					...(i.woodMc ? woodMoistureChecks(i.woodMc, s.moisture) : [])
				];
				return {
					ok: true,
					pass: checks.every((c) => c.pass),
					checks,
					rule: checks.map((c) => c.rule).join('; '),
					source: [...new Set(checks.map((c) => c.source))].join('; '),
					cautions: cautionTexts(['planning_aid', 'moisture'])
				};
			}
		},
		{
			readingsPct: 'rhPct',
			tests: 'calciumChloride',
			subfloorPct: 'woodMc.subfloorPct',
			flooringPct: 'woodMc.flooringPct'
		}
	)
};

export type CalculatorName = keyof typeof calculators;
