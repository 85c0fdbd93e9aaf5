/**
 * zod 4 schemas for the estimating engine's inputs, shared by client and server: a room's shape,
 * the measure, the store's settings and its price book. Lengths are inches; money is integer
 * cents. Every number and list has the engine's own bound (`LIMITS`, `$lib/estimating/limits`),
 * so a body beyond them is refused here with its field, before the engine runs. Browser-safe:
 * imports only zod and the engine. The calculators' inputs are built from these pieces
 * (`$lib/calculators/registry`).
 */
import { z } from 'zod';
import {
	BASES,
	EXISTING_FLOOR_KINDS,
	FLOOR_KINDS,
	JOIST_SIZES,
	LAYOUTS,
	LIMITS,
	PREP_KINDS,
	SPECIES,
	SUBFLOOR_KINDS,
	SUPPLY_KINDS,
	type EstimateInput
} from '$lib/estimating';

const grouped = (n: number) => n.toLocaleString('en-US');

/** A number from `min` to `max` (finite), with messages naming both. */
export const bounded = (what: string, min: number, max: number, unit = '') => {
	const u = unit ? ` ${unit}` : '';
	return z
		.number()
		.finite()
		.min(min, `${what}: at least ${grouped(min)}${u}`)
		.max(max, `${what}: at most ${grouped(max)}${u}`);
};
/** A number above 0 up to `max` (finite): one message for a value at or below 0, not two. */
const aboveZero = (what: string, max: number, unit = '') => {
	const u = unit ? ` ${unit}` : '';
	return z
		.number()
		.finite()
		.positive(`${what}: more than 0${u}`)
		.max(max, `${what}: at most ${grouped(max)}${u}`);
};
/** A length in inches, 0 up to `max` (500 ft unless said). */
export const inches = (what: string, max: number = LIMITS.lengthIn) =>
	bounded(what, 0, max, 'in').describe(`${what}, in`);
/** A length in inches above 0, up to `max` (500 ft unless said). */
export const positiveIn = (what: string, max: number = LIMITS.lengthIn) =>
	aboveZero(what, max, 'in').describe(`${what}, in`);
/** Integer cents from 0 to $1,000,000 a unit. */
const cents = (what: string) =>
	bounded(what, 0, LIMITS.unitCents, 'cents').int().describe(`${what}, integer cents`);
/** A percentage, 0–100. */
export const pct = (what: string) => bounded(what, 0, LIMITS.pct, '%').describe(`${what}, %`);
/** An area above 0 ft², up to a 500 × 500 ft room. */
export const areaSqFt = (what: string) =>
	aboveZero(what, LIMITS.areaSqFt, 'ft²').describe(`${what}, ft²`);
/** A list of at most `max` items. */
export const list = <T extends z.ZodType>(item: T, what: string, max: number) =>
	z.array(item).max(max, `At most ${grouped(max)} ${what}`);
/** A short text (a name, a source, a key). */
const text = (max = 200) => z.string().max(max, `At most ${max} characters`);
/** A corner's coordinate, within 1,000 ft of the drawing's origin. */
const coordinate = (what: string) =>
	bounded(what, -LIMITS.coordinateIn, LIMITS.coordinateIn, 'in').describe(`${what}, in`);
/** A number up to `max`, above 0. */
const positive = (what: string, max: number, unit = '') => aboveZero(what, max, unit);

export const floorKindT = z
	.enum(FLOOR_KINDS as [string, ...string[]])
	.describe('Kind of floor') as unknown as z.ZodType<(typeof FLOOR_KINDS)[number]>;
export const layout = z.enum(LAYOUTS as [string, ...string[]]) as unknown as z.ZodType<
	(typeof LAYOUTS)[number]
>;
const existingKind = z.enum(EXISTING_FLOOR_KINDS as [string, ...string[]]) as unknown as z.ZodType<
	(typeof EXISTING_FLOOR_KINDS)[number]
>;
const subfloorKind = z.enum(SUBFLOOR_KINDS as [string, ...string[]]) as unknown as z.ZodType<
	(typeof SUBFLOOR_KINDS)[number]
>;
export const species = z.enum(SPECIES as [string, ...string[]]) as unknown as z.ZodType<
	(typeof SPECIES)[number]
>;
export const joistSize = z.enum(JOIST_SIZES as [string, ...string[]]) as unknown as z.ZodType<
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

/** Joist spacing on centre, 4–96 in. */
export const spacingIn = (what: string) =>
	bounded(what, LIMITS.spacingMinIn, LIMITS.spacingMaxIn, 'in').describe(`${what}, in`);
/** A small length (depth, gap, thickness, tolerance), 0–12 in. */
export const smallIn = (what: string) => inches(what, LIMITS.depthIn);
/** Readings of one kind in a room. */
export const readings = <T extends z.ZodType>(item: T) => list(item, 'readings', LIMITS.listItems);

// ---------------------------------------------------------------- shapes

const point = z
	.tuple([coordinate('Corner x'), coordinate('Corner y')])
	.describe('Corner [x, y], in');
const turn = z
	.union([z.enum(['left', 'right']), bounded('Turn', -180, 180, '°')])
	.describe('Turn after the side: left/right (90°) or degrees, positive to the left');

export const shapeSchema = z
	.discriminatedUnion('kind', [
		z.object({
			kind: z.literal('rect'),
			widthIn: positiveIn('Width along x'),
			lengthIn: positiveIn('Length along y'),
			xIn: coordinate('Corner x').optional(),
			yIn: coordinate('Corner y').optional()
		}),
		z.object({
			kind: z.literal('rects'),
			rects: list(
				z.object({
					xIn: coordinate('Corner x'),
					yIn: coordinate('Corner y'),
					widthIn: positiveIn('Width along x'),
					lengthIn: positiveIn('Length along y')
				}),
				'rectangles',
				LIMITS.rects
			)
				.min(1)
				.describe('Rectangles that together make the room (L, T, U, closets, bays)')
		}),
		z.object({
			kind: z.literal('sides'),
			sides: list(
				z.object({ lengthIn: positiveIn('Side length'), turn }),
				'sides',
				LIMITS.outlineCorners
			)
				.min(3)
				.describe('Sides walked from the start, first heading along +x'),
			xIn: coordinate('Start x').optional(),
			yIn: coordinate('Start y').optional()
		}),
		z.object({
			kind: z.literal('points'),
			points: list(point, 'corners', LIMITS.outlineCorners).min(3).describe('Corners in order')
		})
	])
	.describe('A room or cut-out outline, in inches (at most 500 ft a side, 200 corners)');

export const cutoutSchema = z.object({
	name: z.string().min(1).max(80).describe('What is there: island, cabinets, hearth'),
	shape: shapeSchema
});
export const cutoutsSchema = list(cutoutSchema, 'cut-outs', LIMITS.cutouts);

export const voidSchema = z.object({
	lengthIn: positiveIn('Length'),
	widthIn: positiveIn('Width (widest point)'),
	depthIn: positiveIn('Depth', LIMITS.depthIn)
});

// ---------------------------------------------------------------- settings and price book

const rows = <T extends z.ZodType>(item: T) => list(item, 'rows', LIMITS.settingsRows);
const rule = z.object({
	gapIn: positiveIn('Gap allowed', LIMITS.depthIn),
	overIn: positiveIn('Under a straightedge of'),
	source: text()
});
const testRule = z.object({
	first: bounded('Tests for the first area', 1, 100).int(),
	firstSqFt: positive('First area', LIMITS.areaSqFt, 'ft²'),
	perSqFt: bounded('One more test per', 100, LIMITS.areaSqFt, 'ft²')
});
const fastening = z.object({
	name: text(),
	edgeSpacingIn: positiveIn('Edge spacing', 24),
	fieldSpacingIn: positiveIn('Field spacing', 24),
	edgeDistanceIn: inches('Distance from the panel edge', 6),
	source: text()
});
const bySize = (what: string, max: number) =>
	z.object({
		'2x6': positive(what, max),
		'2x8': positive(what, max),
		'2x10': positive(what, max),
		'2x12': positive(what, max)
	});
const byFloor = <T extends z.ZodType>(t: T) =>
	z.object(
		Object.fromEntries(FLOOR_KINDS.map((k) => [k, t])) as Record<(typeof FLOOR_KINDS)[number], T>
	);
const lumber = z.object({
	label: text(),
	ePsi: positive('E', 100_000_000, 'psi'),
	fbPsi: bySize('Fb', 100_000),
	sizeFactor: z.boolean(),
	source: text()
});
const taxGroup = z.enum(['material', 'labour', 'prep', 'removal']);
/** A store's own rows keyed by name (fastening schedules, span ratings, hours by prep). */
const keyed = <T extends z.ZodType>(value: T) =>
	z
		.record(z.string().max(64), value)
		.refine(
			(r) => Object.keys(r).length <= LIMITS.settingsRows,
			`At most ${LIMITS.settingsRows} rows`
		);
const ratio = (what: string) => bounded(what, 1, 10_000);

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
		geometry: z.object({ closureToleranceIn: smallIn('Closure tolerance') }),
		roll: z.object({
			trimPerEndIn: smallIn('Trim per cut end'),
			orderIncrementIn: bounded('Order increment', 1, 1_200, 'in')
		}),
		underlayment: z.object({
			panelWidthIn: bounded('Panel width', 12, 120, 'in'),
			panelLengthIn: bounded('Panel length', 12, 240, 'in'),
			wastePct: pct('Waste'),
			schedule: text(64),
			schedules: keyed(fastening),
			requiredFor: rows(floorKindT),
			skimFor: rows(floorKindT).optional()
		}),
		repairs: z.object({
			ignoreHoleUnderIn: smallIn('Ignore holes smaller than'),
			roughCutAllowanceIn: smallIn('Rough-cut allowance'),
			joistThicknessIn: positiveIn('Joist thickness', LIMITS.depthIn),
			defaultJoistSpacingIn: spacingIn('Joist spacing when not measured'),
			defaultSubfloorIn: positiveIn('Subfloor thickness when not measured', LIMITS.depthIn),
			backingLapIn: smallIn('Backing lap'),
			holeMethod: byFloor(z.enum(['blocking', 'backing', 'blocking_underlayment'])),
			patchWastePct: pct('Waste'),
			levellerWastePct: pct('Waste'),
			lowSpotDepthFactor: bounded('Depth factor', 0, 1),
			lowSpotAreaSqFt: bounded('Area per low spot', 0, LIMITS.areaSqFt, 'ft²')
		}),
		joists: z.object({
			livePsf: positive('Live load', 1_000, 'psf'),
			deadPsf: bounded('Dead load', 0, 1_000, 'psf'),
			cd: positive('CD', 5),
			cr: positive('Cr', 5),
			cf: bySize('CF', 5),
			depthIn: bySize('Depth', 48),
			widthIn: positive('Width', LIMITS.depthIn, 'in'),
			lumber: z.object({
				douglas_fir_larch: lumber,
				hem_fir: lumber,
				spruce_pine_fir: lumber,
				southern_pine: lumber
			}),
			ratio: z.partialRecord(floorKindT, ratio('L/Δ')),
			iJoistRatio: z.partialRecord(floorKindT, ratio('L/Δ')).optional(),
			defaultRatio: ratio('L/Δ'),
			spanRounding: z.enum(['down', 'nearest'])
		}),
		sheathing: z.object({
			boardMinIn: rows(
				z.object({
					maxSpacingIn: spacingIn('Joist spacing up to'),
					minIn: positiveIn('Thickness', LIMITS.depthIn)
				})
			),
			spanRatingFloorIn: keyed(spacingIn('Joist spacing up to')),
			floorMinIn: z.partialRecord(
				floorKindT,
				rows(
					z.object({
						maxSpacingIn: spacingIn('Joist spacing up to'),
						plywoodIn: positiveIn('Plywood', LIMITS.depthIn),
						osbIn: positiveIn('OSB', LIMITS.depthIn)
					})
				)
			)
		}),
		flatness: z.object({
			rules: z.object({
				tile: rows(rule),
				large_tile: rows(rule),
				resilient_concrete: rows(rule),
				resilient_wood: rows(rule),
				wood: rows(rule)
			}),
			largeTileEdgeIn: positiveIn('Large-format edge', LIMITS.rollWidthMaxIn)
		}),
		moisture: z.object({
			rhLimitPct: pct('RH limit'),
			mverLimit: positive('MVER limit', 100, 'lb/1000 ft²/24 h'),
			rhTests: testRule,
			mverTests: testRule,
			woodSubfloorMaxPct: pct('Subfloor MC limit'),
			woodDiffStripPct: pct('Strip MC difference'),
			woodDiffWidePct: pct('Wide plank MC difference'),
			wideFromIn: positiveIn('Wide plank from', 24),
			probeDepthPct: z.object({ top: pct('Probe depth'), both: pct('Probe depth') }).optional()
		}),
		tile: z
			.object({
				singleLayerMinIn: positiveIn('Single layer under tile', LIMITS.depthIn),
				stoneLayers: bounded('Layers under stone', 1, 4).int()
			})
			.optional(),
		installSupplies: z
			.object({
				wastePct: pct('Waste on setting materials'),
				trimEndAllowanceIn: inches('Trim allowance per piece', LIMITS.depthIn)
			})
			.optional(),
		doorways: z
			.object({
				flushMaxIn: smallIn('Step with no bevel'),
				bevelMaxIn: smallIn('Step a reducer takes')
			})
			.optional(),
		schedule: z.object({
			workdayHours: bounded('Working day', 1, 24, 'h'),
			dayStartHour: bounded('Start of the day', 0, 23, 'h'),
			crewSqFtPerDay: byFloor(bounded('Crew output', 1, 100_000, 'ft² a day')),
			removalSqFtPerHour: bounded('Tear-out', 1, 100_000, 'ft² an hour'),
			prepHoursPerUnit: keyed(bounded('Hours per unit', 0, 1_000, 'h')),
			cureHours: keyed(bounded('Cure', 0, LIMITS.cureHours, 'h')),
			testWaitHours: z
				.object({
					rh: bounded('RH probe wait', 0, LIMITS.cureHours, 'h'),
					calciumChloride: bounded('Calcium chloride exposure', 0, LIMITS.cureHours, 'h')
				})
				.optional(),
			acclimationHours: z
				.partialRecord(floorKindT, bounded('Acclimation', 0, LIMITS.cureHours, 'h'))
				.optional()
		}),
		taxes: rows(
			z.object({
				name: text(60),
				rateBps: bounded('Rate', 0, 10_000, 'bps')
					.int()
					.describe('Rate in basis points (825 = 8.25 %)'),
				groups: list(taxGroup, 'groups', 4).describe('Line groups this tax applies to')
			})
		),
		taxRounding: z.enum(['half_up', 'half_even', 'up', 'down']),
		deposit: z.object({
			percentBps: bounded('Deposit', 0, 10_000, 'bps').int(),
			minimumCents: bounded('Minimum deposit', 0, LIMITS.lineCents, 'cents')
				.int()
				.describe('Minimum deposit, integer cents')
		}),
		asbestosBuiltBefore: bounded('Year', 1600, 2200).int()
	})
	.describe("The store's settings: every trade default the engine uses");

export const containerSchema = z.union([
	z.object({
		volumeCuIn: positive('Container volume', 1_000_000, 'in³').describe('Container volume, in³')
	}),
	z.object({
		coverageSqFt: positive('Coverage', 100_000, 'ft²'),
		atDepthIn: positiveIn('Coverage depth', LIMITS.depthIn)
	})
]);
/** Bag yield of self-levelling underlayment, ft³ (data sheet). */
export const bagYieldCuFt = positive('Bag yield', 100, 'ft³').describe(
	'Bag yield, ft³ (data sheet)'
);
/** Tile edges, in. */
export const tileEdgesIn = list(
	positiveIn('Tile edge', LIMITS.rollWidthMaxIn),
	'edges',
	4
).describe('Tile edges, in');

export const floorProductSchema = z.object({
	id: z.string().min(1).max(64),
	name: z.string().min(1).max(120).describe('Store name, e.g. "Oak plank 7 in"'),
	kind: floorKindT,
	fastening: z.enum(['nailed', 'glued', 'floating']).optional(),
	cartonSqFt: bounded('Carton coverage', 0.1, 1_000, 'ft²')
		.optional()
		.describe('ft² per carton (carton goods)'),
	rollWidthIn: bounded('Roll width', LIMITS.rollWidthMinIn, LIMITS.rollWidthMaxIn, 'in')
		.optional()
		.describe('Roll width (roll goods), in: 1–20 ft'),
	tileEdgesIn: tileEdgesIn.optional(),
	boardWidthIn: positiveIn('Board width', 24).optional(),
	thicknessIn: positiveIn('Floor thickness', 4)
		.optional()
		.describe('Thickness as laid, in (floor height at doorways)'),
	groutJointIn: bounded('Grout joint', 1 / 32, 1, 'in')
		.optional()
		.describe('Tile: grout joint width, in (maker instructions)'),
	groutDepthIn: bounded('Grout depth', 1 / 16, 2, 'in')
		.optional()
		.describe("Tile: joint depth, in (the tile's thickness)"),
	material: z.object({
		basis: z.enum(['carton', 'sqft', 'roll_sqyd', 'roll_linft']),
		priceCents: cents('Price per unit'),
		costCents: cents('Store cost per unit').optional()
	}),
	labourCentsPerSqFt: cents('Install price per ft²'),
	payCentsPerSqFt: cents('Installer pay per ft²'),
	needs: z
		.object({
			deflectionRatio: ratio('L/Δ').optional(),
			rhLimitPct: pct('RH limit').optional(),
			mverLimit: positive('MVER limit', 100, 'lb/1000 ft²/24 h').optional(),
			flatness: rows(rule).optional(),
			underlayment: z.boolean().optional(),
			underlay: z.boolean().optional()
		})
		.optional()
		.describe("What this floor needs, overriding the store's defaults (maker's instructions)")
});

const lines = <T extends z.ZodType>(item: T) => list(item, 'lines', LIMITS.priceBookLines);

export const priceBookSchema = z
	.object({
		currency: z.string().length(3),
		floors: lines(floorProductSchema),
		prep: lines(
			z.object({
				kind: prepKind,
				name: text(120).optional(),
				basis,
				priceCents: cents('Customer price per unit'),
				payCents: cents('Installer pay per unit'),
				costCents: cents('Store cost per unit').optional()
			})
		),
		removal: lines(
			z.object({
				existing: existingKind,
				basis: z.enum(['sqft', 'room']),
				priceCents: cents('Customer price per unit'),
				payCents: cents('Installer pay per unit')
			})
		),
		supplies: lines(
			z.object({
				kind: supplyKind,
				name: text(120),
				basis,
				priceCents: cents('Price per unit'),
				costCents: cents('Store cost per unit').optional(),
				perBox: bounded('Per box', 1, 1_000_000).int().optional(),
				container: containerSchema.optional(),
				bagYieldCuFt: bagYieldCuFt.optional(),
				minDepthIn: smallIn('Least pour (data sheet)').optional(),
				maxDepthIn: positiveIn('Deepest pour (data sheet)', LIMITS.depthIn).optional(),
				coverageSqFt: positive('Coverage of one unit', 10_000, 'ft²')
					.optional()
					.describe('ft² one bag, sheet or roll covers (data sheet)'),
				stockLengthIn: bounded('Stock length', 12, 480, 'in')
					.optional()
					.describe('Length of one stock piece of trim, in: 1–40 ft')
			})
		)
	})
	.describe("The store's price book; every price is integer cents per unit of its basis");

// ---------------------------------------------------------------- the measure

export const flatnessReadingSchema = z.object({
	spanIn: positiveIn('Straightedge length'),
	gapIn: smallIn('Largest gap under it'),
	kind: z.enum(['low', 'high']).optional(),
	areaSqFt: areaSqFt('Area to level').optional()
});
export const calciumChlorideSchema = z.object({
	gainGrams: bounded('Dish weight gain', 0, 1_000, 'g').describe('Dish weight gain, g'),
	areaSqFt: positive('Area under the dome', 100, 'ft²').describe('Area under the dome, ft²'),
	hours: positive('Exposure', 1_000, 'h').describe('Exposure, h')
});
const repairs = <T extends z.ZodType>(item: T, what: string) => list(item, what, LIMITS.listItems);
export const slabSchema = z.object({
	id: text(40).optional().describe('Rooms with the same slab id share one slab'),
	thicknessIn: positiveIn('Slab thickness', LIMITS.depthIn).optional(),
	drying: z.enum(['top', 'both']).optional()
});
export const doorwaySchema = z.object({
	widthIn: positiveIn('Doorway width', 240),
	door: z.boolean().optional(),
	nextFloorIn: smallIn("Next room's floor height").optional()
});

export const roomSchema = z.object({
	id: z.string().min(1).max(64),
	name: z.string().min(1).max(80),
	shape: shapeSchema,
	cutouts: cutoutsSchema.optional(),
	floor: z
		.object({
			productId: z.string().min(1).max(64),
			layout,
			rollDirection: z.enum(['x', 'y']).optional(),
			light: z.enum(['x', 'y']).optional()
		})
		.optional()
		.describe('The new floor (required to price the room)'),
	remove: list(existingKind, 'floors to tear out', EXISTING_FLOOR_KINDS.length)
		.optional()
		.describe('Existing floors to tear out, top first'),
	subfloor: z.object({
		kind: subfloorKind,
		thicknessIn: positiveIn('Subfloor thickness', LIMITS.depthIn).optional(),
		spanRating: text(12).optional().describe('Panel span rating, e.g. 32/16'),
		layers: bounded('Panel layers', 1, 4).int().optional(),
		slab: slabSchema.optional()
	}),
	underlayment: z.boolean().optional(),
	trim: z.boolean().optional(),
	transitions: bounded('Transitions', 0, 100).int().optional(),
	doorways: list(doorwaySchema, 'doorways', 20).optional(),
	base: z
		.object({
			baseboard: z.enum(['reset', 'new']).optional(),
			shoe: z.enum(['reset', 'new']).optional()
		})
		.optional()
		.describe('Baseboard and shoe: removed and put back, or new'),
	furniture: z.boolean().optional(),
	appliances: bounded('Appliances', 0, 20).int().optional(),
	toilets: bounded('Toilets', 0, 20).int().optional(),
	stairs: bounded('Steps', 0, 100).int().optional(),
	repairs: z
		.object({
			holes: repairs(
				z.object({
					widthIn: positiveIn('Across the joists'),
					lengthIn: positiveIn('Along the joists')
				}),
				'holes'
			).optional(),
			seams: repairs(voidSchema, 'seams').optional(),
			dents: repairs(voidSchema, 'dents').optional(),
			fasteners: z
				.union([z.boolean(), z.object({ areaSqFt: areaSqFt('Area with fasteners') })])
				.optional()
		})
		.optional(),
	joists: z
		.object({
			size: joistSize,
			species,
			spacingIn: spacingIn('On-centre spacing'),
			spanIn: positiveIn('Span'),
			runs: z.enum(['x', 'y']).optional(),
			iJoist: z
				.object({
					eiLbIn2: positive('EI', 1e11, 'lb·in²').optional().describe("EI from the maker's data"),
					label: text(80).optional()
				})
				.optional()
		})
		.optional(),
	readings: z
		.object({
			flatness: readings(flatnessReadingSchema).optional(),
			rhPct: readings(pct('In-situ RH')).optional(),
			calciumChloride: readings(calciumChlorideSchema).optional(),
			woodMc: z
				.object({ subfloorPct: readings(pct('MC')), flooringPct: readings(pct('MC')) })
				.optional()
		})
		.optional()
});

export const jobSchema = z.object({
	builtYear: bounded('Year built', 1600, 2200)
		.int()
		.optional()
		.describe('Year the house was built'),
	rooms: list(roomSchema, 'rooms', LIMITS.rooms).min(1)
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
