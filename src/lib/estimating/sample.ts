/**
 * Invented sample data (no real products or brands): a price book and jobs of any size, for
 * specs, the benchmark and the app's demo previews.
 */
import type { JobMeasure, RoomMeasure } from './types';
import type { FloorProduct, PriceBook } from './pricing';

export const samplePriceBook: PriceBook = {
	currency: 'USD',
	floors: [
		{
			id: 'oak-7',
			name: 'Oak plank 7 in',
			kind: 'engineered_wood',
			fastening: 'nailed',
			cartonSqFt: 20.5,
			boardWidthIn: 7,
			thicknessIn: 0.75,
			material: { basis: 'carton', priceCents: 10_250, costCents: 6_150 },
			labourCentsPerSqFt: 350,
			payCentsPerSqFt: 225
		},
		{
			id: 'lvp-grey',
			name: 'Grey vinyl plank',
			kind: 'vinyl_plank',
			cartonSqFt: 23.64,
			thicknessIn: 0.25,
			material: { basis: 'sqft', priceCents: 329, costCents: 190 },
			labourCentsPerSqFt: 200,
			payCentsPerSqFt: 130
		},
		{
			id: 'tile-12',
			name: 'Porcelain tile 12 × 24 in',
			kind: 'ceramic_tile',
			cartonSqFt: 15.5,
			tileEdgesIn: [12, 24],
			thicknessIn: 0.625,
			groutJointIn: 0.125,
			groutDepthIn: 0.375,
			material: { basis: 'carton', priceCents: 4_650, costCents: 2_800 },
			labourCentsPerSqFt: 650,
			payCentsPerSqFt: 420
		},
		{
			id: 'carpet-12',
			name: 'Plush carpet 12 ft',
			kind: 'carpet',
			rollWidthIn: 144,
			material: { basis: 'roll_sqyd', priceCents: 2_899, costCents: 1_600 },
			labourCentsPerSqFt: 90,
			payCentsPerSqFt: 60
		},
		{
			id: 'sheet-6',
			name: 'Sheet vinyl 6 ft',
			kind: 'sheet_vinyl',
			rollWidthIn: 72,
			material: { basis: 'roll_linft', priceCents: 1_800, costCents: 1_000 },
			labourCentsPerSqFt: 150,
			payCentsPerSqFt: 95
		}
	],
	prep: [
		{ kind: 'fastener_removal', basis: 'sqft', priceCents: 45, payCents: 30 },
		{ kind: 'hole_repair', basis: 'each', priceCents: 8_500, payCents: 5_000 },
		{ kind: 'seam_patch', basis: 'linft', priceCents: 150, payCents: 90 },
		{ kind: 'dent_patch', basis: 'each', priceCents: 1_200, payCents: 700 },
		{ kind: 'underlayment', basis: 'sqft', priceCents: 125, payCents: 80 },
		{ kind: 'level', basis: 'sqft_per_eighth_in', priceCents: 95, payCents: 55 },
		{ kind: 'grind', basis: 'each', priceCents: 4_500, payCents: 3_000 },
		{ kind: 'joist_sister', basis: 'each', priceCents: 18_000, payCents: 11_000 },
		{ kind: 'structural_consult', basis: 'room', priceCents: 0, payCents: 0 },
		{ kind: 'subfloor_overlay', basis: 'sqft', priceCents: 275, payCents: 150 },
		{ kind: 'moisture_barrier', basis: 'sqft', priceCents: 180, payCents: 90 },
		{ kind: 'moisture_retest', basis: 'each', priceCents: 7_500, payCents: 4_000 },
		{ kind: 'moisture_test', basis: 'each', priceCents: 3_500, payCents: 2_000 },
		{ kind: 'trim', basis: 'linft', priceCents: 275, payCents: 150 },
		{ kind: 'transition', basis: 'each', priceCents: 2_500, payCents: 1_500 },
		{ kind: 'underlayment_skim', basis: 'sqft', priceCents: 40, payCents: 25 },
		{ kind: 'primer', basis: 'sqft', priceCents: 35, payCents: 15, costCents: 10 },
		// Setting work per ft²; the thinset, grout and backer themselves are supplies below.
		{ kind: 'tile_backer', basis: 'sqft', priceCents: 150, payCents: 110 },
		{ kind: 'tile_setting', basis: 'sqft', priceCents: 75, payCents: 45 },
		{ kind: 'underlay', basis: 'sqft', priceCents: 45, payCents: 15, costCents: 20 },
		{ kind: 'vapour_retarder', basis: 'sqft', priceCents: 25, payCents: 10, costCents: 8 },
		{ kind: 'felt_paper', basis: 'sqft', priceCents: 20, payCents: 8, costCents: 7 },
		{ kind: 'carpet_pad', basis: 'sqft', priceCents: 65, payCents: 10, costCents: 30 },
		{ kind: 'tack_strip', basis: 'linft', priceCents: 60, payCents: 30, costCents: 15 },
		{ kind: 'carpet_seam', basis: 'linft', priceCents: 300, payCents: 180 },
		{ kind: 'base_reset', basis: 'linft', priceCents: 225, payCents: 140 },
		// Fitting per linear ft; the stock lengths themselves are supplies below.
		{ kind: 'base_new', basis: 'linft', priceCents: 300, payCents: 200 },
		{ kind: 'shoe_new', basis: 'linft', priceCents: 175, payCents: 110 },
		{ kind: 'reducer', basis: 'each', priceCents: 3_500, payCents: 1_800 },
		{ kind: 'threshold', basis: 'each', priceCents: 6_500, payCents: 3_000 },
		{ kind: 'door_undercut', basis: 'each', priceCents: 4_500, payCents: 2_500 },
		{ kind: 'furniture', basis: 'room', priceCents: 7_500, payCents: 4_500 },
		{ kind: 'appliance_reset', basis: 'each', priceCents: 6_000, payCents: 3_500 },
		{ kind: 'toilet_reset', basis: 'each', priceCents: 12_500, payCents: 7_500 },
		{ kind: 'stairs', basis: 'each', priceCents: 9_500, payCents: 5_500 },
		{ kind: 'haul_away', basis: 'sqft', priceCents: 30, payCents: 10 },
		{ kind: 'trip_charge', basis: 'each', priceCents: 7_500, payCents: 2_500 },
		{ kind: 'minimum_job', basis: 'each', priceCents: 50_000, payCents: 0 }
	],
	removal: [
		{ existing: 'carpet', basis: 'sqft', priceCents: 60, payCents: 40 },
		{ existing: 'sheet_vinyl', basis: 'sqft', priceCents: 120, payCents: 80 },
		{ existing: 'vinyl_tile', basis: 'sqft', priceCents: 150, payCents: 100 },
		{ existing: 'vinyl_plank', basis: 'sqft', priceCents: 90, payCents: 60 },
		{ existing: 'laminate', basis: 'sqft', priceCents: 75, payCents: 50 },
		{ existing: 'ceramic_tile', basis: 'sqft', priceCents: 300, payCents: 200 },
		{ existing: 'hardwood_nailed', basis: 'sqft', priceCents: 250, payCents: 160 },
		{ existing: 'hardwood_glued', basis: 'sqft', priceCents: 350, payCents: 230 }
	],
	supplies: [
		{
			kind: 'underlayment_panel',
			name: 'Plywood underlayment 1/4 in, 4 × 8 ft',
			basis: 'panel',
			priceCents: 3_200,
			costCents: 2_100
		},
		{
			kind: 'fastener',
			name: 'Ring-shank nails, box of 1000',
			basis: 'box',
			perBox: 1000,
			priceCents: 2_400,
			costCents: 1_300
		},
		{
			kind: 'patch',
			name: 'Floor patch, 1 gal pail',
			basis: 'container',
			container: { volumeCuIn: 231 },
			priceCents: 3_600,
			costCents: 2_000
		},
		{
			kind: 'leveller',
			name: 'Self-levelling underlayment, 50 lb bag',
			basis: 'bag',
			bagYieldCuFt: 0.45,
			// the invented product's data sheet: 1/8 in to 1 1/2 in a pour
			minDepthIn: 0.125,
			maxDepthIn: 1.5,
			priceCents: 4_200,
			costCents: 2_600
		},
		{
			kind: 'thinset',
			name: 'Modified thinset mortar, 50 lb bag',
			basis: 'bag',
			// the invented product's data sheet: about 60 ft² a bag with a 1/2 in square notch
			coverageSqFt: 60,
			priceCents: 3_800,
			costCents: 2_200
		},
		{
			kind: 'grout',
			name: 'Sanded grout, 25 lb bag',
			basis: 'bag',
			// the invented product's data sheet: one bag yields 0.2 ft³ of joint
			bagYieldCuFt: 0.2,
			priceCents: 2_600,
			costCents: 1_400
		},
		{
			kind: 'backer',
			name: 'Cement backer board 1/4 in, 3 × 5 ft',
			basis: 'panel',
			coverageSqFt: 15,
			priceCents: 1_600,
			costCents: 1_000
		},
		{
			kind: 'baseboard',
			name: 'Primed baseboard 3 1/4 in, 16 ft',
			basis: 'each',
			stockLengthIn: 192,
			priceCents: 2_400,
			costCents: 1_300
		},
		{
			kind: 'shoe',
			name: 'Primed shoe moulding, 16 ft',
			basis: 'each',
			stockLengthIn: 192,
			priceCents: 1_100,
			costCents: 550
		}
	]
};

/** Floors beyond the sample book, so every kind of floor can be sold in the demo. */
export const demoFloors: FloorProduct[] = [
	{
		id: 'laminate-8',
		name: 'Walnut-look laminate 8 mm',
		kind: 'laminate',
		cartonSqFt: 19.8,
		material: { basis: 'carton', priceCents: 5_350, costCents: 3_100 },
		labourCentsPerSqFt: 175,
		payCentsPerSqFt: 115
	},
	{
		id: 'slate-16',
		name: 'Honed slate 16 × 16 in',
		kind: 'stone_tile',
		cartonSqFt: 10.7,
		tileEdgesIn: [16, 16],
		material: { basis: 'carton', priceCents: 8_900, costCents: 5_400 },
		labourCentsPerSqFt: 800,
		payCentsPerSqFt: 520
	},
	{
		id: 'berber-15',
		name: 'Berber carpet 15 ft',
		kind: 'carpet',
		rollWidthIn: 180,
		material: { basis: 'roll_sqyd', priceCents: 2_450, costCents: 1_350 },
		labourCentsPerSqFt: 90,
		payCentsPerSqFt: 60
	}
];

/** Room `i` of a mixed sample job: shapes, floors and repairs cycle so every path runs. */
export function sampleRoom(i: number): RoomMeasure {
	const id = `r${i + 1}`;
	const w = 120 + ((i * 37) % 120);
	const l = 132 + ((i * 53) % 96);
	switch (i % 6) {
		case 0:
			return {
				id,
				name: `Bedroom ${i + 1}`,
				shape: { kind: 'rect', widthIn: w, lengthIn: l },
				floor: { productId: 'carpet-12', layout: 'straight' },
				remove: ['carpet'],
				subfloor: { kind: 'osb', thicknessIn: 23 / 32, spanRating: '24/16' },
				repairs: { fasteners: true },
				trim: true
			};
		case 1:
			return {
				id,
				name: `Kitchen ${i + 1}`,
				shape: {
					kind: 'rects',
					rects: [
						{ xIn: 0, yIn: 0, widthIn: w, lengthIn: l },
						{ xIn: w, yIn: 0, widthIn: 60, lengthIn: 72 }
					]
				},
				cutouts: [
					{ name: 'Island', shape: { kind: 'rect', xIn: 36, yIn: 40, widthIn: 48, lengthIn: 30 } }
				],
				floor: { productId: 'lvp-grey', layout: 'straight' },
				remove: ['sheet_vinyl'],
				subfloor: { kind: 'plywood', thicknessIn: 0.625 },
				repairs: {
					holes: [
						{ widthIn: 0.5, lengthIn: 0.5 },
						{ widthIn: 6, lengthIn: 4 }
					],
					seams: [{ lengthIn: 96, widthIn: 0.25, depthIn: 0.125 }],
					dents: [{ lengthIn: 3, widthIn: 2, depthIn: 0.0625 }]
				},
				readings: { flatness: [{ spanIn: 72, gapIn: 0.25, areaSqFt: 12 }] },
				doorways: [
					{ widthIn: 32, door: true, nextFloorIn: 0.75 },
					{ widthIn: 36, nextFloorIn: 0.5 }
				],
				base: { baseboard: 'reset', shoe: 'new' },
				appliances: 1
			};
		case 2:
			return {
				id,
				name: `Bath ${i + 1}`,
				shape: {
					kind: 'sides',
					sides: [
						{ lengthIn: 96, turn: 'left' },
						{ lengthIn: 60, turn: 'left' },
						{ lengthIn: 36, turn: 'right' },
						{ lengthIn: 30, turn: 'left' },
						{ lengthIn: 60, turn: 'left' },
						{ lengthIn: 90, turn: 'left' }
					]
				},
				floor: { productId: 'tile-12', layout: 'diagonal' },
				remove: ['vinyl_tile'],
				subfloor: { kind: 'plywood', thicknessIn: 0.75 },
				joists: { size: '2x10', species: 'spruce_pine_fir', spacingIn: 16, spanIn: 168 },
				toilets: 1,
				readings: {
					flatness: [
						{ spanIn: 120, gapIn: 0.125 },
						{ spanIn: 24, gapIn: 0.09 }
					]
				}
			};
		case 3:
			return {
				id,
				name: `Living ${i + 1}`,
				shape: {
					kind: 'points',
					points: [
						[0, 0],
						[w + 60, 0],
						[w + 60, l],
						[w + 30, l + 30],
						[30, l + 30],
						[0, l]
					]
				},
				floor: { productId: 'oak-7', layout: 'herringbone' },
				remove: ['carpet'],
				subfloor: { kind: 'plywood', thicknessIn: 0.625 },
				joists: { size: '2x8', species: 'douglas_fir_larch', spacingIn: 16, spanIn: 150 },
				repairs: { holes: [{ widthIn: 10, lengthIn: 8 }], fasteners: { areaSqFt: 40 } },
				readings: { woodMc: { subfloorPct: [9, 10], flooringPct: [8, 9] } },
				trim: true
			};
		case 4:
			return {
				id,
				name: `Basement ${i + 1}`,
				shape: { kind: 'rect', widthIn: w + 48, lengthIn: l + 60 },
				cutouts: [
					{ name: 'Post', shape: { kind: 'rect', xIn: 60, yIn: 60, widthIn: 8, lengthIn: 8 } }
				],
				floor: { productId: 'lvp-grey', layout: 'straight' },
				subfloor: { kind: 'concrete', slab: { id: 'main', thicknessIn: 4, drying: 'top' } },
				readings: {
					rhPct: [78, 72, 74],
					calciumChloride: [{ gainGrams: 13, areaSqFt: 0.25, hours: 72 }],
					flatness: [{ spanIn: 120, gapIn: 0.3125, areaSqFt: 20 }]
				}
			};
		default:
			return {
				id,
				name: `Laundry ${i + 1}`,
				shape: {
					kind: 'rects',
					rects: [
						{ xIn: 0, yIn: 0, widthIn: 72, lengthIn: l },
						{ xIn: 72, yIn: l - 60, widthIn: 60, lengthIn: 60 }
					]
				},
				floor: { productId: 'sheet-6', layout: 'straight' },
				remove: ['vinyl_plank'],
				subfloor: { kind: 'board', thicknessIn: 0.75 },
				repairs: { dents: [{ lengthIn: 4, widthIn: 4, depthIn: 0.125 }] }
			};
	}
}

/** A sample job of `rooms` rooms. */
export function sampleJob(rooms = 12, builtYear = 1975): JobMeasure {
	return { builtYear, rooms: Array.from({ length: rooms }, (_, i) => sampleRoom(i)) };
}
