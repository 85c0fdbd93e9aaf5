/**
 * Store settings: every trade default the engine uses, so a store can override it.
 * Only physics and unit conversions are fixed (see `units.ts`). Each default names its source
 * in TRADE.md's words: published / secondary / common practice / memory.
 */

/** Floors the engine knows how to take off and check. */
export type FloorKind =
	| 'laminate'
	| 'vinyl_plank'
	| 'engineered_wood'
	| 'hardwood'
	| 'ceramic_tile'
	| 'stone_tile'
	| 'sheet_vinyl'
	| 'carpet';

export const FLOOR_KINDS: readonly FloorKind[] = [
	'laminate',
	'vinyl_plank',
	'engineered_wood',
	'hardwood',
	'ceramic_tile',
	'stone_tile',
	'sheet_vinyl',
	'carpet'
];

/** Floors sold by the roll (drops and seams); every other kind is sold by the carton. */
export const ROLL_KINDS: readonly FloorKind[] = ['sheet_vinyl', 'carpet'];

/** How the new floor is laid; drives the waste allowance. */
export type Layout = 'straight' | 'diagonal' | 'herringbone';
export const LAYOUTS: readonly Layout[] = ['straight', 'diagonal', 'herringbone'];

/**
 * The layouts a floor kind can be laid in. Roll goods (sheet vinyl, carpet) are laid in drops
 * along the room, seamed side by side: there is no diagonal or herringbone pattern to cut
 * (common practice). Planks and tiles can be laid in any of the three.
 */
export function layoutsFor(kind: FloorKind): readonly Layout[] {
	return ROLL_KINDS.includes(kind) ? ['straight'] : LAYOUTS;
}

/** How the floor is held down; decides how a subfloor hole is closed. */
export type Fastening = 'nailed' | 'glued' | 'floating';

/** Existing floors that may be torn out. */
export type ExistingFloorKind =
	| 'carpet'
	| 'sheet_vinyl'
	| 'vinyl_tile'
	| 'vinyl_plank'
	| 'laminate'
	| 'ceramic_tile'
	| 'hardwood_nailed'
	| 'hardwood_glued';
export const EXISTING_FLOOR_KINDS: readonly ExistingFloorKind[] = [
	'carpet',
	'sheet_vinyl',
	'vinyl_tile',
	'vinyl_plank',
	'laminate',
	'ceramic_tile',
	'hardwood_nailed',
	'hardwood_glued'
];

export type SubfloorKind = 'plywood' | 'osb' | 'board' | 'concrete';
export const SUBFLOOR_KINDS: readonly SubfloorKind[] = ['plywood', 'osb', 'board', 'concrete'];

/** Lumber species groups in the NDS Supplement (No.2 grade unless a store adds others). */
export type Species = 'douglas_fir_larch' | 'hem_fir' | 'spruce_pine_fir' | 'southern_pine';
export const SPECIES: readonly Species[] = [
	'douglas_fir_larch',
	'hem_fir',
	'spruce_pine_fir',
	'southern_pine'
];
export type JoistSize = '2x6' | '2x8' | '2x10' | '2x12';
export const JOIST_SIZES: readonly JoistSize[] = ['2x6', '2x8', '2x10', '2x12'];

/** A flatness rule: the gap allowed under a straightedge of the given length. */
export interface FlatnessRule {
	gapIn: number;
	overIn: number;
	source: string;
}

/** Fasteners for underlayment panels: edge rows at `edgeDistanceIn`, a field grid inside. */
export interface FasteningSchedule {
	name: string;
	edgeSpacingIn: number;
	fieldSpacingIn: number;
	edgeDistanceIn: number;
	source: string;
}

/** Reference design values for one species and grade. */
export interface LumberValues {
	label: string;
	/** Modulus of elasticity, psi. */
	ePsi: number;
	/** Reference bending design value by size, psi (before CF, Cr, CD). */
	fbPsi: Record<JoistSize, number>;
	/** Whether the size factor CF applies (NDS Table 4A species; not Southern Pine's Table 4B). */
	sizeFactor: boolean;
	source: string;
}

/** How each floor kind closes a hole in the subfloor (TRADE.md "Subfloor repairs"). */
export type HoleMethod = 'blocking' | 'backing' | 'blocking_underlayment';

export interface StoreSettings {
	units: {
		/** Imperial shows ft-in and ft²; metric shows mm/m and m². */
		system: 'imperial' | 'metric';
		/** Unit of a plain number typed without a unit. */
		defaultLengthUnit: 'in' | 'ft' | 'mm' | 'cm' | 'm';
	};
	/** Waste allowance by layout, percent of area. No published standard (memory). */
	wastePct: Record<Layout, number>;
	geometry: {
		/** A polygon given by sides may miss its start by this much and still close. */
		closureToleranceIn: number;
	};
	roll: {
		/** Extra length cut at each end of a drop. */
		trimPerEndIn: number;
		/** Roll goods are ordered in whole multiples of this length. */
		orderIncrementIn: number;
	};
	underlayment: {
		panelWidthIn: number;
		panelLengthIn: number;
		wastePct: number;
		/** Name of the schedule used (a key of `schedules`). */
		schedule: string;
		schedules: Record<string, FasteningSchedule>;
		/** Floors that get new underlayment panels over a wood subfloor unless a room says otherwise. */
		requiredFor: FloorKind[];
		/** Floors whose new underlayment has its seams and fastener heads skimmed (thin resilient). */
		skimFor?: FloorKind[];
	};
	repairs: {
		/** Holes smaller than this across need no patch under a new underlayment panel. */
		ignoreHoleUnderIn: number;
		/** Added to a measured cut length for play. */
		roughCutAllowanceIn: number;
		/** Joist thickness assumed when cutting blocking between joists. */
		joistThicknessIn: number;
		/** Joist spacing assumed when a room's joists were not measured. */
		defaultJoistSpacingIn: number;
		/** Subfloor thickness assumed for infills when it was not measured. */
		defaultSubfloorIn: number;
		/** Backing laps the hole by this much each side (nailed wood floors). */
		backingLapIn: number;
		holeMethod: Record<FloorKind, HoleMethod>;
		patchWastePct: number;
		levellerWastePct: number;
		/** Average depth of a low spot as a fraction of its gap under the straightedge. */
		lowSpotDepthFactor: number;
		/** Area levelled per low-spot reading when the area was not measured, ft². */
		lowSpotAreaSqFt: number;
	};
	joists: {
		livePsf: number;
		deadPsf: number;
		/** Load duration factor CD for floor live load. */
		cd: number;
		/** Repetitive member factor. */
		cr: number;
		/** Size factor CF by size for No.2 dimension lumber. */
		cf: Record<JoistSize, number>;
		/** Dressed depth by size, in (b = 1.5 in). */
		depthIn: Record<JoistSize, number>;
		widthIn: number;
		lumber: Record<Species, LumberValues>;
		/** L/Δ required under each floor; others use `defaultRatio`. */
		ratio: Partial<Record<FloorKind, number>>;
		/** L/Δ required of I-joists under each floor; others use `ratio`, then `defaultRatio`. */
		iJoistRatio?: Partial<Record<FloorKind, number>>;
		defaultRatio: number;
		/** How the longest passing span is rounded to the inch. */
		spanRounding: 'down' | 'nearest';
	};
	sheathing: {
		/** Minimum lumber board sheathing thickness by joist spacing, perpendicular to joists. */
		boardMinIn: { maxSpacingIn: number; minIn: number }[];
		/** Allowable floor span of a panel span rating, in. */
		spanRatingFloorIn: Record<string, number>;
		/** Minimum panel thickness under floors that need more (e.g. nailed hardwood). */
		floorMinIn: Partial<
			Record<FloorKind, { maxSpacingIn: number; plywoodIn: number; osbIn: number }[]>
		>;
	};
	flatness: {
		rules: Record<
			'tile' | 'large_tile' | 'resilient_concrete' | 'resilient_wood' | 'wood',
			FlatnessRule[]
		>;
		/** A tile with any edge at least this long is large-format. */
		largeTileEdgeIn: number;
	};
	moisture: {
		/** In-situ RH limit, % (the floor product may allow more). */
		rhLimitPct: number;
		/** Calcium chloride MVER limit, lb/1000 ft²/24 h. */
		mverLimit: number;
		/** Tests for the first block of area, and one more per further block (ft²). */
		rhTests: { first: number; firstSqFt: number; perSqFt: number };
		mverTests: { first: number; firstSqFt: number; perSqFt: number };
		woodSubfloorMaxPct: number;
		/** Max MC difference subfloor vs flooring, % points: strip (narrower than `wideFromIn`) and wide plank. */
		woodDiffStripPct: number;
		woodDiffWidePct: number;
		wideFromIn: number;
		/** F2170 probe depth, % of the slab's thickness: drying from the top only, and both ways. */
		probeDepthPct?: { top: number; both: number };
	};
	/** Tile and stone over a wood subfloor. */
	tile?: {
		/** A single panel layer at least this thick takes ceramic tile over a backer or membrane. */
		singleLayerMinIn: number;
		/** Panel layers natural stone needs. */
		stoneLayers: number;
	};
	/** Floor height at doorways: a step up to `flushMaxIn` needs no bevel; to `bevelMaxIn` a reducer. */
	doorways?: { flushMaxIn: number; bevelMaxIn: number };
	/** Waste on setting materials and backer, and the allowance each trim run is cut with (`INSTALL_SUPPLY_DEFAULTS`). */
	installSupplies?: { wastePct: number; trimEndAllowanceIn: number };
	schedule: {
		workdayHours: number;
		dayStartHour: number;
		/** Install output of one crew, ft² per day. No published source (store setting). */
		crewSqFtPerDay: Record<FloorKind, number>;
		/** Tear-out, ft² per hour. */
		removalSqFtPerHour: number;
		/** Hours per unit of each prep kind (unit = the prep's natural measure). */
		prepHoursPerUnit: Record<string, number>;
		/** Cure before the next step, hours; the product label governs. */
		cureHours: Record<string, number>;
		/** Waits before a reading, hours: RH probes equilibrate, calcium chloride dishes stay out. */
		testWaitHours?: { rh: number; calciumChloride: number };
		/** Flooring acclimates on site before it is laid, hours, by floor (the maker's time governs). */
		acclimationHours?: Partial<Record<FloorKind, number>>;
	};
	/** Taxes, each computed once on the subtotal of its taxable groups. */
	taxes: {
		name: string;
		rateBps: number;
		groups: ('material' | 'labour' | 'prep' | 'removal')[];
	}[];
	taxRounding: 'half_up' | 'half_even' | 'up' | 'down';
	deposit: { percentBps: number; minimumCents: number };
	/** Show the asbestos caution for tear-out in homes built before this year, or of unknown age. */
	asbestosBuiltBefore: number;
}

/** The defaults, from TRADE.md. A store copies and changes them. */
export const defaultSettings: StoreSettings = {
	units: { system: 'imperial', defaultLengthUnit: 'in' },
	// memory: straight 5–10 %, diagonal ~15 %, herringbone 15–25 %; no published standard
	wastePct: { straight: 10, diagonal: 15, herringbone: 20 },
	geometry: { closureToleranceIn: 0.25 },
	// common practice: 3 in trim per cut end; whole feet ordered
	roll: { trimPerEndIn: 3, orderIncrementIn: 12 },
	underlayment: {
		// APA product literature (published): 4 × 8 ft nominal
		panelWidthIn: 48,
		panelLengthIn: 96,
		wastePct: 10,
		schedule: 'apa_quarter_in',
		schedules: {
			// APA E30V Table 14 (published): 1/4 in over a smooth subfloor, 3 in edges, 6 in field
			apa_quarter_in: {
				name: '1/4 in plywood underlayment, nails',
				edgeSpacingIn: 3,
				fieldSpacingIn: 6,
				edgeDistanceIn: 0.375,
				source: 'APA E30V Table 14 (published)'
			},
			// APA E30V Table 14 (published): 11/32 in over lumber or uneven subfloor
			apa_11_32_in: {
				name: '11/32 in plywood underlayment, nails',
				edgeSpacingIn: 6,
				fieldSpacingIn: 8,
				edgeDistanceIn: 0.375,
				source: 'APA E30V Table 14 (published)'
			},
			// APA E30V Table 14 notes (published): over 1/2 Performance Category or 5-ply
			apa_over_half_in: {
				name: 'panels over 1/2 Performance Category or 5-ply',
				edgeSpacingIn: 6,
				fieldSpacingIn: 12,
				edgeDistanceIn: 0.375,
				source: 'APA E30V Table 14 notes (published)'
			},
			// common practice: 1-1/4 in crown staples, 2 in edges, about 6 in grid
			staples: {
				name: 'crown staples (tighter schedule)',
				edgeSpacingIn: 2,
				fieldSpacingIn: 6,
				edgeDistanceIn: 0.375,
				source: 'common practice'
			}
		},
		requiredFor: ['vinyl_plank', 'sheet_vinyl'],
		// TRADE.md "Subfloor repairs" (common practice): resilient floors telegraph seams and heads
		skimFor: ['sheet_vinyl']
	},
	repairs: {
		// common practice: holes under about 1 in need no patch under new underlayment
		ignoreHoleUnderIn: 1,
		// common practice: add 1/2 in to a rough cut
		roughCutAllowanceIn: 0.5,
		// NDS Supplement Table 1B (published): dressed 2x thickness 1.5 in
		joistThicknessIn: 1.5,
		// common practice: a typical subfloor is 5/8 in plywood over joists at 16 in o.c.
		defaultJoistSpacingIn: 16,
		defaultSubfloorIn: 0.625,
		backingLapIn: 2,
		// common practice (TRADE.md "Subfloor repairs")
		holeMethod: {
			ceramic_tile: 'blocking',
			stone_tile: 'blocking',
			hardwood: 'backing',
			engineered_wood: 'backing',
			vinyl_plank: 'blocking_underlayment',
			sheet_vinyl: 'blocking_underlayment',
			laminate: 'blocking',
			carpet: 'blocking'
		},
		patchWastePct: 10,
		levellerWastePct: 10,
		lowSpotDepthFactor: 0.5,
		lowSpotAreaSqFt: 16
	},
	joists: {
		// IRC Table R502.3.1(2) (published): 40 psf live, 10 psf dead
		livePsf: 40,
		deadPsf: 10,
		cd: 1.0,
		// NDS 4.3.9 (memory)
		cr: 1.15,
		// NDS Supplement Table 4A (secondary); 2x6 1.3, 2x8 1.2, 2x10 1.1, 2x12 1.0
		cf: { '2x6': 1.3, '2x8': 1.2, '2x10': 1.1, '2x12': 1.0 },
		// NDS Supplement Table 1B (published)
		depthIn: { '2x6': 5.5, '2x8': 7.25, '2x10': 9.25, '2x12': 11.25 },
		widthIn: 1.5,
		lumber: {
			douglas_fir_larch: {
				label: 'Douglas Fir-Larch No.2',
				ePsi: 1_600_000,
				fbPsi: { '2x6': 900, '2x8': 900, '2x10': 900, '2x12': 900 },
				sizeFactor: true,
				source: 'NDS Supplement Table 4A (secondary)'
			},
			hem_fir: {
				label: 'Hem-Fir No.2',
				ePsi: 1_300_000,
				fbPsi: { '2x6': 850, '2x8': 850, '2x10': 850, '2x12': 850 },
				sizeFactor: true,
				source: 'NDS Supplement Table 4A (secondary)'
			},
			spruce_pine_fir: {
				label: 'Spruce-Pine-Fir No.1/No.2',
				ePsi: 1_400_000,
				fbPsi: { '2x6': 875, '2x8': 875, '2x10': 875, '2x12': 875 },
				sizeFactor: true,
				source: 'NDS Supplement Table 4A (secondary)'
			},
			southern_pine: {
				label: 'Southern Pine No.2',
				ePsi: 1_400_000,
				// 2x6 is not in TRADE.md's row; 1000 psi is from memory
				fbPsi: { '2x6': 1000, '2x8': 925, '2x10': 800, '2x12': 750 },
				sizeFactor: false,
				source: 'NDS Supplement Table 4B (secondary)'
			}
		},
		// NTCA Reference Manual (published): L/360 ceramic tile; Natural Stone Institute via NTCA: L/720
		ratio: { ceramic_tile: 360, stone_tile: 720 },
		// NTCA Reference Manual (published): I-joists under ceramic tile L/480; stone keeps L/720
		iJoistRatio: { ceramic_tile: 480, stone_tile: 720 },
		// IRC Table R301.7 (published): floors L/360
		defaultRatio: 360,
		spanRounding: 'down'
	},
	sheathing: {
		// IRC Table R503.1 (published): 16 in → 5/8 in; 24 in → 11/16 in (perpendicular)
		boardMinIn: [
			{ maxSpacingIn: 16, minIn: 0.625 },
			{ maxSpacingIn: 24, minIn: 11 / 16 }
		],
		// IRC Table R503.2.1.1(1) (memory; partly secondary); Sturd-I-Floor ratings via APA E30V (secondary)
		spanRatingFloorIn: {
			'24/16': 16,
			'32/16': 16,
			'40/20': 20,
			'48/24': 24,
			'16 oc': 16,
			'20 oc': 20,
			'24 oc': 24
		},
		// NWFA guidance in Wood Floor Business (published)
		floorMinIn: {
			hardwood: [
				{ maxSpacingIn: 16, plywoodIn: 0.625, osbIn: 23 / 32 },
				{ maxSpacingIn: 24, plywoodIn: 0.875, osbIn: 0.875 }
			]
		}
	},
	flatness: {
		rules: {
			tile: [
				{ gapIn: 0.25, overIn: 120, source: 'ANSI A108.02 (secondary, via NTCA)' },
				{ gapIn: 1 / 16, overIn: 12, source: 'ANSI A108.02 (secondary, via NTCA)' }
			],
			large_tile: [
				{ gapIn: 0.125, overIn: 120, source: 'ANSI A108.02 (secondary, via CTEF)' },
				{ gapIn: 1 / 16, overIn: 24, source: 'ANSI A108.02 (secondary, via CTEF)' }
			],
			resilient_concrete: [{ gapIn: 3 / 16, overIn: 120, source: 'ASTM F710 (secondary)' }],
			resilient_wood: [
				{ gapIn: 3 / 16, overIn: 120, source: 'maker instructions (memory)' },
				{ gapIn: 0.125, overIn: 72, source: 'maker instructions (memory)' }
			],
			wood: [
				{ gapIn: 0.25, overIn: 120, source: 'NWFA (memory)' },
				{ gapIn: 3 / 16, overIn: 72, source: 'NWFA (memory)' }
			]
		},
		// ANSI A108.02 (secondary, via CTEF): any edge ≥ 15 in
		largeTileEdgeIn: 15
	},
	moisture: {
		// ASTM F710 / ASTM F2170 (secondary): 75 % RH unless the maker allows more
		rhLimitPct: 75,
		// ASTM F1869 (secondary): 3 lb/1000 ft²/24 h typical
		mverLimit: 3,
		// ASTM F2170 §10.1 (secondary): 3 for the first 1000 ft², 1 more per further 1000 ft²
		rhTests: { first: 3, firstSqFt: 1000, perSqFt: 1000 },
		// ASTM F1869 (memory): the same count as F2170
		mverTests: { first: 3, firstSqFt: 1000, perSqFt: 1000 },
		// NWFA installation guidelines (published, via Hardwood Floors 2017)
		woodSubfloorMaxPct: 12,
		woodDiffStripPct: 4,
		woodDiffWidePct: 2,
		wideFromIn: 3,
		// ASTM F2170 §10.2 (secondary): 40 % drying from the top only, 20 % drying both ways
		probeDepthPct: { top: 40, both: 20 }
	},
	// TCNA Handbook floor methods (memory): ceramic over one layer of at least 5/8 in (19/32 in
	// actual) with a backer or membrane; natural stone over two layers
	tile: { singleLayerMinIn: 19 / 32, stoneLayers: 2 },
	// 2010 ADA Standards §303.2–303.3 (memory): up to 1/4 in vertical; 1/4–1/2 in bevelled 1:2
	doorways: { flushMaxIn: 0.25, bevelMaxIn: 0.5 },
	schedule: {
		workdayHours: 8,
		dayStartHour: 8,
		// store settings, no published source
		crewSqFtPerDay: {
			laminate: 500,
			vinyl_plank: 500,
			engineered_wood: 350,
			hardwood: 250,
			ceramic_tile: 150,
			stone_tile: 100,
			sheet_vinyl: 600,
			carpet: 800
		},
		removalSqFtPerHour: 60,
		prepHoursPerUnit: {
			fastener_removal: 0.01,
			hole_repair: 0.75,
			seam_patch: 0.02,
			dent_patch: 0.1,
			underlayment: 0.015,
			level: 0.01,
			grind: 0.5,
			joist_sister: 1.5,
			structural_consult: 0,
			subfloor_overlay: 0.02,
			moisture_barrier: 0.01,
			moisture_retest: 0.25,
			moisture_test: 0.25,
			trim: 0.05,
			transition: 0.25,
			underlayment_skim: 0.01,
			primer: 0.005,
			tile_backer: 0.03,
			tile_setting: 0,
			underlay: 0.005,
			vapour_retarder: 0.003,
			felt_paper: 0.003,
			carpet_pad: 0.005,
			tack_strip: 0.02,
			carpet_seam: 0.1,
			base_reset: 0.06,
			base_new: 0.05,
			shoe_new: 0.03,
			reducer: 0.25,
			threshold: 0.5,
			door_undercut: 0.5,
			furniture: 1,
			appliance_reset: 0.75,
			toilet_reset: 1,
			stairs: 0.75,
			haul_away: 0.002,
			trip_charge: 0,
			minimum_job: 0
		},
		// common practice: pre-mixed patch about 4 h before traffic; the product label governs.
		// Leveller 16 h and barrier 12 h are from memory: the product label governs.
		cureHours: {
			seam_patch: 4,
			dent_patch: 4,
			level: 16,
			moisture_barrier: 12,
			underlayment_skim: 4,
			// memory: primers dry in a few hours; the product label governs
			primer: 3
		},
		// ASTM F2170 (secondary): probes equilibrate 24 h; ASTM F1869 (secondary): 60–72 h exposure
		testWaitHours: { rh: 24, calciumChloride: 72 },
		// maker instructions (memory for the range: often 24–72 h for wood)
		acclimationHours: { hardwood: 72, engineered_wood: 48, laminate: 48, vinyl_plank: 24 }
	},
	taxes: [{ name: 'Sales tax', rateBps: 0, groups: ['material'] }],
	taxRounding: 'half_up',
	deposit: { percentBps: 5000, minimumCents: 0 },
	asbestosBuiltBefore: 1990
};
