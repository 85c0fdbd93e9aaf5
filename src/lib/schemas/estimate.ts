/**
 * zod 4 schemas for the estimating engine's inputs, shared by client and server, and the
 * `calculators` map from which `POST /api/v1/calc/<name>` and the Calculators page are built.
 * Lengths are inches; money is integer cents. Browser-safe: imports only zod and the engine.
 */
import { z } from 'zod';
import {
	BASES,
	cartonTakeoff,
	CAUTIONS,
	cautionTexts,
	defaultSettings,
	EXISTING_FLOOR_KINDS,
	fastenersPerPanel,
	flatnessCheck,
	flatnessRules,
	FLOOR_KINDS,
	formatArea,
	formatLength,
	JOIST_SIZES,
	joistCheck,
	LAYOUTS,
	levellerTakeoff,
	mverChecks,
	parseLength,
	patchTakeoff,
	PREP_KINDS,
	rhChecks,
	rollTakeoff,
	roomOutline,
	roomShape,
	sheathingChecks,
	SPECIES,
	SUBFLOOR_KINDS,
	SUPPLY_KINDS,
	underlaymentTakeoff,
	woodMoistureChecks,
	type EstimateInput,
	type StoreSettings
} from '$lib/estimating';

const inches = (what: string) => z.number().finite().nonnegative().describe(`${what}, in`);
const positiveIn = (what: string) => z.number().finite().positive().describe(`${what}, in`);
const cents = (what: string) => z.number().int().describe(`${what}, integer cents`);
const pct = (what: string) => z.number().finite().min(0).max(100).describe(`${what}, %`);

const floorKindT = z
	.enum(FLOOR_KINDS as [string, ...string[]])
	.describe('Kind of floor') as unknown as z.ZodType<(typeof FLOOR_KINDS)[number]>;
const layout = z.enum(LAYOUTS as [string, ...string[]]) as unknown as z.ZodType<
	(typeof LAYOUTS)[number]
>;
const existingKind = z.enum(EXISTING_FLOOR_KINDS as [string, ...string[]]) as unknown as z.ZodType<
	(typeof EXISTING_FLOOR_KINDS)[number]
>;
const subfloorKind = z.enum(SUBFLOOR_KINDS as [string, ...string[]]) as unknown as z.ZodType<
	(typeof SUBFLOOR_KINDS)[number]
>;
const species = z.enum(SPECIES as [string, ...string[]]) as unknown as z.ZodType<
	(typeof SPECIES)[number]
>;
const joistSize = z.enum(JOIST_SIZES as [string, ...string[]]) as unknown as z.ZodType<
	(typeof JOIST_SIZES)[number]
>;
const prepKind = z.enum(PREP_KINDS as [string, ...string[]]) as unknown as z.ZodType<
	(typeof PREP_KINDS)[number]
>;
const basis = z.enum(BASES as [string, ...string[]]) as unknown as z.ZodType<
	(typeof BASES)[number]
>;
const supplyKind = z.enum(SUPPLY_KINDS as [string, ...string[]]) as unknown as z.ZodType<
	(typeof SUPPLY_KINDS)[number]
>;

// ---------------------------------------------------------------- shapes

const point = z.tuple([z.number().finite(), z.number().finite()]).describe('Corner [x, y], in');
const turn = z
	.union([z.enum(['left', 'right']), z.number().finite().min(-180).max(180)])
	.describe('Turn after the side: left/right (90°) or degrees, positive to the left');

export const shapeSchema = z
	.discriminatedUnion('kind', [
		z.object({
			kind: z.literal('rect'),
			widthIn: positiveIn('Width along x'),
			lengthIn: positiveIn('Length along y'),
			xIn: z.number().finite().optional().describe('Corner x, in'),
			yIn: z.number().finite().optional().describe('Corner y, in')
		}),
		z.object({
			kind: z.literal('rects'),
			rects: z
				.array(
					z.object({
						xIn: z.number().finite().describe('Corner x, in'),
						yIn: z.number().finite().describe('Corner y, in'),
						widthIn: positiveIn('Width along x'),
						lengthIn: positiveIn('Length along y')
					})
				)
				.min(1)
				.describe('Rectangles that together make the room (L, T, U, closets, bays)')
		}),
		z.object({
			kind: z.literal('sides'),
			sides: z
				.array(z.object({ lengthIn: positiveIn('Side length'), turn }))
				.min(3)
				.describe('Sides walked from the start, first heading along +x'),
			xIn: z.number().finite().optional(),
			yIn: z.number().finite().optional()
		}),
		z.object({
			kind: z.literal('points'),
			points: z.array(point).min(3).describe('Corners in order')
		})
	])
	.describe('A room or cut-out outline, in inches');

export const cutoutSchema = z.object({
	name: z.string().min(1).max(80).describe('What is there: island, cabinets, hearth'),
	shape: shapeSchema
});

const voidSchema = z.object({
	lengthIn: positiveIn('Length'),
	widthIn: positiveIn('Width (widest point)'),
	depthIn: positiveIn('Depth')
});

// ---------------------------------------------------------------- settings and price book

const rule = z.object({
	gapIn: positiveIn('Gap allowed'),
	overIn: positiveIn('Under a straightedge of'),
	source: z.string()
});
const testRule = z.object({
	first: z.number().int().positive(),
	firstSqFt: z.number().positive(),
	perSqFt: z.number().positive()
});
const fastening = z.object({
	name: z.string(),
	edgeSpacingIn: positiveIn('Edge spacing'),
	fieldSpacingIn: positiveIn('Field spacing'),
	edgeDistanceIn: inches('Distance from the panel edge'),
	source: z.string()
});
const bySize = z.object({
	'2x6': z.number(),
	'2x8': z.number(),
	'2x10': z.number(),
	'2x12': z.number()
});
const byFloor = <T extends z.ZodType>(t: T) =>
	z.object(
		Object.fromEntries(FLOOR_KINDS.map((k) => [k, t])) as Record<(typeof FLOOR_KINDS)[number], T>
	);
const lumber = z.object({
	label: z.string(),
	ePsi: z.number().positive(),
	fbPsi: bySize,
	sizeFactor: z.boolean(),
	source: z.string()
});
const taxGroup = z.enum(['material', 'labour', 'prep', 'removal']);

export const settingsSchema = z
	.object({
		units: z.object({
			system: z.enum(['imperial', 'metric']),
			defaultLengthUnit: z.enum(['in', 'ft', 'mm', 'cm', 'm'])
		}),
		wastePct: z.object({
			straight: pct('Waste'),
			diagonal: pct('Waste'),
			herringbone: pct('Waste')
		}),
		geometry: z.object({ closureToleranceIn: inches('Closure tolerance') }),
		roll: z.object({
			trimPerEndIn: inches('Trim per cut end'),
			orderIncrementIn: positiveIn('Order increment')
		}),
		underlayment: z.object({
			panelWidthIn: positiveIn('Panel width'),
			panelLengthIn: positiveIn('Panel length'),
			wastePct: pct('Waste'),
			schedule: z.string(),
			schedules: z.record(z.string(), fastening),
			requiredFor: z.array(floorKindT)
		}),
		repairs: z.object({
			ignoreHoleUnderIn: inches('Ignore holes smaller than'),
			roughCutAllowanceIn: inches('Rough-cut allowance'),
			joistThicknessIn: positiveIn('Joist thickness'),
			defaultJoistSpacingIn: positiveIn('Joist spacing when not measured'),
			defaultSubfloorIn: positiveIn('Subfloor thickness when not measured'),
			backingLapIn: inches('Backing lap'),
			holeMethod: byFloor(z.enum(['blocking', 'backing', 'blocking_underlayment'])),
			patchWastePct: pct('Waste'),
			levellerWastePct: pct('Waste'),
			lowSpotDepthFactor: z.number().min(0).max(1),
			lowSpotAreaSqFt: z.number().nonnegative()
		}),
		joists: z.object({
			livePsf: z.number().positive(),
			deadPsf: z.number().nonnegative(),
			cd: z.number().positive(),
			cr: z.number().positive(),
			cf: bySize,
			depthIn: bySize,
			widthIn: z.number().positive(),
			lumber: z.object({
				douglas_fir_larch: lumber,
				hem_fir: lumber,
				spruce_pine_fir: lumber,
				southern_pine: lumber
			}),
			ratio: z.partialRecord(floorKindT, z.number().positive()),
			defaultRatio: z.number().positive(),
			spanRounding: z.enum(['down', 'nearest'])
		}),
		sheathing: z.object({
			boardMinIn: z.array(
				z.object({ maxSpacingIn: z.number().positive(), minIn: z.number().positive() })
			),
			spanRatingFloorIn: z.record(z.string(), z.number().positive()),
			floorMinIn: z.partialRecord(
				floorKindT,
				z.array(
					z.object({
						maxSpacingIn: z.number().positive(),
						plywoodIn: z.number().positive(),
						osbIn: z.number().positive()
					})
				)
			)
		}),
		flatness: z.object({
			rules: z.object({
				tile: z.array(rule),
				large_tile: z.array(rule),
				resilient_concrete: z.array(rule),
				resilient_wood: z.array(rule),
				wood: z.array(rule)
			}),
			largeTileEdgeIn: positiveIn('Large-format edge')
		}),
		moisture: z.object({
			rhLimitPct: pct('RH limit'),
			mverLimit: z.number().positive(),
			rhTests: testRule,
			mverTests: testRule,
			woodSubfloorMaxPct: pct('Subfloor MC limit'),
			woodDiffStripPct: pct('Strip MC difference'),
			woodDiffWidePct: pct('Wide plank MC difference'),
			wideFromIn: positiveIn('Wide plank from')
		}),
		schedule: z.object({
			workdayHours: z.number().positive().max(24),
			dayStartHour: z.number().min(0).max(23),
			crewSqFtPerDay: byFloor(z.number().positive()),
			removalSqFtPerHour: z.number().positive(),
			prepHoursPerUnit: z.record(z.string(), z.number().nonnegative()),
			cureHours: z.record(z.string(), z.number().nonnegative())
		}),
		taxes: z.array(
			z.object({
				name: z.string(),
				rateBps: z
					.number()
					.int()
					.min(0)
					.max(10_000)
					.describe('Rate in basis points (825 = 8.25 %)'),
				groups: z.array(taxGroup).describe('Line groups this tax applies to')
			})
		),
		taxRounding: z.enum(['half_up', 'half_even', 'up', 'down']),
		deposit: z.object({
			percentBps: z.number().int().min(0).max(10_000),
			minimumCents: cents('Minimum deposit').nonnegative()
		}),
		asbestosBuiltBefore: z.number().int()
	})
	.describe("The store's settings: every trade default the engine uses");

const container = z.union([
	z.object({ volumeCuIn: z.number().positive().describe('Container volume, in³') }),
	z.object({ coverageSqFt: z.number().positive(), atDepthIn: positiveIn('Coverage depth') })
]);

export const floorProductSchema = z.object({
	id: z.string().min(1),
	name: z.string().min(1).describe('Store name, e.g. "Oak plank 7 in"'),
	kind: floorKindT,
	fastening: z.enum(['nailed', 'glued', 'floating']).optional(),
	cartonSqFt: z.number().positive().optional().describe('ft² per carton (carton goods)'),
	rollWidthIn: positiveIn('Roll width (roll goods)').optional(),
	tileEdgesIn: z.array(z.number().positive()).optional().describe('Tile edges, in'),
	boardWidthIn: positiveIn('Board width').optional(),
	material: z.object({
		basis: z.enum(['carton', 'sqft', 'roll_sqyd', 'roll_linft']),
		priceCents: cents('Price per unit').nonnegative(),
		costCents: cents('Store cost per unit').nonnegative().optional()
	}),
	labourCentsPerSqFt: cents('Install price per ft²').nonnegative(),
	payCentsPerSqFt: cents('Installer pay per ft²').nonnegative(),
	needs: z
		.object({
			deflectionRatio: z.number().positive().optional(),
			rhLimitPct: pct('RH limit').optional(),
			mverLimit: z.number().positive().optional(),
			flatness: z.array(rule).optional(),
			underlayment: z.boolean().optional()
		})
		.optional()
		.describe("What this floor needs, overriding the store's defaults (maker's instructions)")
});

export const priceBookSchema = z
	.object({
		currency: z.string().length(3),
		floors: z.array(floorProductSchema),
		prep: z.array(
			z.object({
				kind: prepKind,
				name: z.string().optional(),
				basis,
				priceCents: cents('Customer price per unit').nonnegative(),
				payCents: cents('Installer pay per unit').nonnegative(),
				costCents: cents('Store cost per unit').nonnegative().optional()
			})
		),
		removal: z.array(
			z.object({
				existing: existingKind,
				basis: z.enum(['sqft', 'room']),
				priceCents: cents('Customer price per unit').nonnegative(),
				payCents: cents('Installer pay per unit').nonnegative()
			})
		),
		supplies: z.array(
			z.object({
				kind: supplyKind,
				name: z.string(),
				basis,
				priceCents: cents('Price per unit').nonnegative(),
				costCents: cents('Store cost per unit').nonnegative().optional(),
				perBox: z.number().int().positive().optional(),
				container: container.optional(),
				bagYieldCuFt: z.number().positive().optional().describe('Bag yield, ft³ (data sheet)')
			})
		)
	})
	.describe("The store's price book; every price is integer cents per unit of its basis");

// ---------------------------------------------------------------- the measure

const flatnessReading = z.object({
	spanIn: positiveIn('Straightedge length'),
	gapIn: inches('Largest gap under it'),
	kind: z.enum(['low', 'high']).optional(),
	areaSqFt: z.number().positive().optional().describe('Area to level, ft²')
});
const calciumChloride = z.object({
	gainGrams: z.number().nonnegative().describe('Dish weight gain, g'),
	areaSqFt: z.number().positive().describe('Area under the dome, ft²'),
	hours: z.number().positive().describe('Exposure, h')
});

export const roomSchema = z.object({
	id: z.string().min(1).max(64),
	name: z.string().min(1).max(80),
	shape: shapeSchema,
	cutouts: z.array(cutoutSchema).optional(),
	floor: z
		.object({
			productId: z.string().min(1),
			layout,
			rollDirection: z.enum(['x', 'y']).optional()
		})
		.optional()
		.describe('The new floor (required to price the room)'),
	remove: z.array(existingKind).optional().describe('Existing floors to tear out, top first'),
	subfloor: z.object({
		kind: subfloorKind,
		thicknessIn: positiveIn('Subfloor thickness').optional(),
		spanRating: z.string().optional().describe('Panel span rating, e.g. 32/16')
	}),
	underlayment: z.boolean().optional(),
	trim: z.boolean().optional(),
	transitions: z.number().int().nonnegative().optional(),
	repairs: z
		.object({
			holes: z
				.array(
					z.object({
						widthIn: positiveIn('Across the joists'),
						lengthIn: positiveIn('Along the joists')
					})
				)
				.optional(),
			seams: z.array(voidSchema).optional(),
			dents: z.array(voidSchema).optional(),
			fasteners: z.union([z.boolean(), z.object({ areaSqFt: z.number().positive() })]).optional()
		})
		.optional(),
	joists: z
		.object({
			size: joistSize,
			species,
			spacingIn: positiveIn('On-centre spacing'),
			spanIn: positiveIn('Span'),
			runs: z.enum(['x', 'y']).optional()
		})
		.optional(),
	readings: z
		.object({
			flatness: z.array(flatnessReading).optional(),
			rhPct: z.array(pct('In-situ RH')).optional(),
			calciumChloride: z.array(calciumChloride).optional(),
			woodMc: z
				.object({ subfloorPct: z.array(pct('MC')), flooringPct: z.array(pct('MC')) })
				.optional()
		})
		.optional()
});

export const jobSchema = z.object({
	builtYear: z.number().int().min(1600).max(2200).optional().describe('Year the house was built'),
	rooms: z.array(roomSchema).min(1).max(200)
});

/** `POST /api/v1/estimates/preview`: the whole job with its settings and price book. */
export const estimateInputSchema = z.object({
	job: jobSchema,
	settings: settingsSchema,
	priceBook: priceBookSchema
});

// Compile-time guard: what the schema accepts is what the engine takes.
const _fits: (x: z.infer<typeof estimateInputSchema>) => EstimateInput = (x) => x;
void _fits;

// ---------------------------------------------------------------- calculators

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

const calc = <S extends z.ZodType>(c: Calculator<S>) => c;
const planning = [CAUTIONS.planning_aid];

export const calculators = {
	units: calc({
		title: 'Lengths',
		summary: 'Reads a length as typed (ft-in, fractions, mm, m) and writes it back in every unit.',
		input: z.object({
			text: z.string().max(80).describe('A length as typed, e.g. 12\' 6 1/2"'),
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
			return {
				ok: true,
				inches: r.inches,
				ftIn: formatLength(r.inches),
				mm: formatLength(r.inches, 'mm'),
				m: formatLength(r.inches, 'm'),
				...base
			};
		}
	}),
	area: calc({
		title: 'Room area',
		summary:
			'Area and perimeter of a room from rectangles or sides, less its cut-outs, with a drawable outline.',
		input: z.object({ shape: shapeSchema, cutouts: z.array(cutoutSchema).optional() }),
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
		title: 'Cartons',
		summary:
			'Cartons of plank, laminate, wood or tile for an area, with the store waste for the layout.',
		input: z.object({
			areaSqFt: z.number().positive().describe('Floor area, ft²'),
			coverageSqFt: z.number().positive().describe('ft² per carton'),
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
	roll: calc({
		title: 'Roll goods',
		summary: 'Drops, seams, linear feet and square yards of carpet or sheet vinyl for a room.',
		input: z.object({
			shape: shapeSchema,
			rollWidthIn: positiveIn('Roll width'),
			trimPerEndIn: inches('Trim per cut end').optional(),
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
	}),
	underlayment: calc({
		title: 'Underlayment panels',
		summary: 'Panels for an area and the fasteners each takes by the fastening schedule.',
		input: z.object({
			areaSqFt: z.number().positive(),
			schedule: z.string().optional().describe('A schedule key in the store settings'),
			perBox: z.number().int().positive().optional()
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
		title: 'Patch compound',
		summary: 'Patch for open seams and dents, in whole containers.',
		input: z.object({
			voids: z.array(voidSchema).min(1),
			container,
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
		title: 'Self-levelling underlayment',
		summary: 'Bags of leveller for an area at an average depth, from the bag yield.',
		input: z.object({
			areaSqFt: z.number().positive(),
			depthIn: positiveIn('Average depth'),
			bagYieldCuFt: z.number().positive().describe('Bag yield, ft³ (data sheet)'),
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
		title: 'Joist deflection and span',
		summary: 'L/Δ and bending of floor joists against the floor, and the longest span that passes.',
		input: z.object({
			size: joistSize,
			species,
			spacingIn: positiveIn('On-centre spacing'),
			spanIn: positiveIn('Span'),
			floorKind: floorKindT.optional(),
			ratio: z.number().positive().optional().describe('Required L/Δ (overrides the floor)'),
			livePsf: z.number().positive().optional(),
			deadPsf: z.number().nonnegative().optional()
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
		title: 'Sheathing',
		summary: 'Subfloor thickness and span rating against the joist spacing and the floor.',
		input: z.object({
			kind: z.enum(['plywood', 'osb', 'board']),
			thicknessIn: positiveIn('Thickness'),
			spanRating: z.string().optional(),
			joistSpacingIn: positiveIn('Joist spacing'),
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
		title: 'Flatness',
		summary:
			'Straightedge readings against the floor’s flatness tolerance (large-format tile included).',
		input: z.object({
			floorKind: floorKindT,
			subfloor: z.enum(['wood', 'concrete']),
			tileEdgesIn: z.array(z.number().positive()).optional(),
			readings: z.array(flatnessReading).min(1)
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
	moisture: calc({
		title: 'Moisture',
		summary:
			'Concrete RH and calcium-chloride MVER with the tests the area needs, and wood MC by board width.',
		input: z.object({
			areaSqFt: z.number().positive(),
			rhPct: z.array(pct('In-situ RH')).optional(),
			rhLimitPct: pct('RH limit').optional(),
			calciumChloride: z.array(calciumChloride).optional(),
			mverLimit: z.number().positive().optional(),
			woodMc: z
				.object({
					subfloorPct: z.array(pct('MC')),
					flooringPct: z.array(pct('MC')),
					boardWidthIn: positiveIn('Board width').optional()
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
	})
};

export type CalculatorName = keyof typeof calculators;
