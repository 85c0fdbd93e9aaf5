/**
 * The price book's forms: fields as people type them (prices in the store's currency, "12.50" or
 * "1250" yen; lengths as text "12 ft", "7 in"), read by `$lib/input` into the estimating engine's
 * shapes (integers in the currency's smallest unit, inches), then checked with the engine's own
 * schemas, so what is saved is exactly what the engine prices by. The forms depend on the
 * currency, so each is a function of it (`sectionForm`). Browser-safe: shared by the pages, their
 * actions and the JSON API.
 */
import { z } from 'zod';
import {
	BASES,
	CUIN_PER_US_GAL,
	EXISTING_FLOOR_KINDS,
	FLOOR_KINDS,
	formatLength,
	PREP,
	PREP_KINDS,
	ROLL_KINDS,
	SUPPLY_KINDS,
	type Basis,
	type ExistingFloorKind,
	type FloorKind,
	type FloorProduct,
	type PrepKind,
	type PrepPrice,
	type RemovalPrice,
	type SupplyKind,
	type SupplyPrice
} from '$lib/estimating';
import { EXISTING_FLOOR_LABELS, PREP_LABELS, SUPPLY_LABELS } from '$lib/measure/labels';
import { moneyToInput, readLength, readNumber, tooLong, type Read } from '$lib/input';
import {
	moneyField,
	optionalLengthField,
	optionalMoneyField,
	optionalField,
	optionalNumberField,
	optionalVolumeField,
	textField as fieldText
} from '$lib/input/zod';
import { floorProductSchema, priceBookSchema } from './estimate';

export const PRICE_SECTIONS = ['floor', 'prep', 'removal', 'supply'] as const;
export type PriceSectionName = (typeof PRICE_SECTIONS)[number];

export const SECTION_LABELS: Record<PriceSectionName, string> = {
	floor: 'Floors',
	prep: 'Prep services',
	removal: 'Removal of existing floors',
	supply: 'Supplies'
};

import { BASIS_LABELS } from '$lib/format';
export { BASIS_LABELS };

export const MATERIAL_BASES = ['carton', 'sqft', 'roll_sqyd', 'roll_linft'] as const;
export type MaterialBasis = (typeof MATERIAL_BASES)[number];

export const FASTENINGS = ['nailed', 'glued', 'floating'] as const;
export const FASTENING_LABELS: Record<(typeof FASTENINGS)[number], string> = {
	nailed: 'Nailed or stapled',
	glued: 'Glued down',
	floating: 'Floating'
};

/** Floors sold by the roll; every other kind by the carton (the engine's `ROLL_KINDS`). */
export const isRollKind = (kind: string) => (ROLL_KINDS as readonly string[]).includes(kind);
export const isTileKind = (kind: string) => kind === 'ceramic_tile' || kind === 'stone_tile';
export const isWoodKind = (kind: string) => kind === 'hardwood' || kind === 'engineered_wood';

/** The material bases that fit a kind of floor: cartons for carton goods, roll units for roll goods. */
export function materialBasesFor(kind: string): MaterialBasis[] {
	return isRollKind(kind) ? ['roll_sqyd', 'roll_linft'] : ['carton', 'sqft'];
}

/**
 * The supplies each prep service consumes, as the engine takes them off (estimate.ts): panels and
 * their fasteners for underlayment (and for holes under resilient floors, which get new panels),
 * patch for seams and dents, self-levelling underlayment for low spots.
 */
export const PREP_SUPPLIES: Partial<Record<PrepKind, SupplyKind[]>> = {
	underlayment: ['underlayment_panel', 'fastener'],
	hole_repair: ['underlayment_panel', 'fastener'],
	seam_patch: ['patch'],
	dent_patch: ['patch'],
	level: ['leveller'],
	tile_setting: ['thinset', 'grout'],
	tile_backer: ['backer'],
	base_new: ['baseboard'],
	shoe_new: ['shoe']
};

/** The prep services that draw on a supply. */
export function prepUsing(kind: SupplyKind): PrepKind[] {
	return PREP_KINDS.filter((p) => PREP_SUPPLIES[p]?.includes(kind));
}

/** The units the engine counts each supply in (estimate.ts): its own unit, or each. */
export const SUPPLY_BASES: Record<SupplyKind, Basis[]> = {
	underlayment_panel: ['panel', 'each'],
	fastener: ['box', 'each'],
	patch: ['container', 'each'],
	leveller: ['bag', 'each'],
	thinset: ['bag', 'each'],
	grout: ['bag', 'container', 'each'],
	backer: ['panel', 'each'],
	baseboard: ['each', 'linft'],
	shoe: ['each', 'linft']
};

/** Supplies counted by the ft² one unit covers (thinset bag, backer sheet or membrane roll). */
export const COVERAGE_SUPPLIES: readonly SupplyKind[] = ['thinset', 'backer'];
/** Supplies bought in stock lengths (trim). */
export const STOCK_SUPPLIES: readonly SupplyKind[] = ['baseboard', 'shoe'];

// ---------------------------------------------------------------- typed fields

/** A required price in `currency`, to its smallest unit; empty is a field error. */
export const priceField = (what: string, currency: string) => moneyField(currency, { label: what });

/** A price that may be left empty (undefined). */
export const optionalPriceField = (what: string, currency: string) =>
	optionalMoneyField(currency, { label: what });

/** A positive number (ft², ft³, %), or undefined when empty. */
const optionalNumber = (what: string, max = 1_000_000) =>
	optionalNumberField({ label: what, above: 0, max });

/** A length typed as text (`12 ft`, `7 in`, `3.66 m`, `144`: plain numbers are inches), to inches. */
const optionalLength = (what: string) => optionalLengthField('in', { label: what, positive: true });

/**
 * Tile edges typed as `12 x 24`, `12" × 24"`, `12, 24`, `300 x 600 mm` (a trailing unit applies to
 * both). A comma with no space after it is a number's, by the one number rule.
 */
export function parseTileEdges(text: string): Read<number[]> {
	const long = tooLong(text);
	if (long) return long;
	const parts = text
		.split(/\s*(?:x|×|by)\s*|,\s+/i)
		.map((p) => p.trim())
		.filter(Boolean);
	if (parts.length < 1 || parts.length > 2) {
		return { ok: false, message: 'Type one or two tile edges, e.g. 12 x 24 in' };
	}
	const unit = /(mm|cm|m|in|")\s*$/i.exec(parts[parts.length - 1])?.[1];
	const edges: number[] = [];
	for (const p of parts) {
		const typed = unit && /^[\d.,\s/]+$/.test(p) ? `${p} ${unit === '"' ? 'in' : unit}` : p;
		const r = readLength(typed, 'in', { label: 'a tile edge', positive: true });
		if (!r.ok) return r;
		edges.push(r.value);
	}
	return { ok: true, value: edges };
}

const optionalTileEdges = optionalField(parseTileEdges);

/** `L/720` or `720`: the span-to-deflection ratio a floor needs. */
const optionalRatio = optionalField((v) => {
	const r = readNumber(v.replace(/^l\s*\/\s*/i, ''), { label: 'the ratio', min: 1, max: 10_000 });
	return r.ok ? r : { ok: false, message: `Cannot read "${v}": type it as L/360 or 360` };
});

const nameField = (message: string) =>
	z.string({ error: message }).trim().min(1, message).max(120, 'Keep it under 120 characters');
const optionalName = fieldText.pipe(z.string().max(120, 'Keep it under 120 characters'));

const enumField = <const T extends readonly [string, ...string[]]>(values: T, message: string) =>
	z.enum(values, { error: message });

/** Adds a field issue and counts them, so a transform can stop once every check has spoken. */
function refuser(ctx: z.RefinementCtx) {
	const add = (field: string, message: string) => {
		add.count += 1;
		ctx.addIssue({ code: 'custom', path: [field], message });
	};
	add.count = 0;
	return add;
}

/** Reports the engine schema's issues on the form field each one came from. */
function engineCheck<S extends z.ZodType>(
	schema: S,
	value: unknown,
	ctx: z.RefinementCtx,
	fieldOf: (path: PropertyKey[]) => string
): z.output<S> | typeof z.NEVER {
	const r = schema.safeParse(value);
	if (r.success) return r.data;
	for (const issue of r.error.issues) {
		ctx.addIssue({ code: 'custom', message: issue.message, path: [fieldOf(issue.path)] });
	}
	return z.NEVER;
}

// ---------------------------------------------------------------- the engine's item shapes

/** What a floor line stores: the engine's `FloorProduct` without its id and name (the row has them). */
export type FloorData = Omit<FloorProduct, 'id' | 'name'>;
export type PrepData = Omit<PrepPrice, 'kind' | 'name'>;
export type RemovalData = Omit<RemovalPrice, 'existing'>;
export type SupplyData = Omit<SupplyPrice, 'kind' | 'name'>;

export const floorDataSchema = floorProductSchema.omit({ id: true, name: true });
const prepItemSchema = priceBookSchema.shape.prep.element;
const removalItemSchema = priceBookSchema.shape.removal.element;
const supplyItemSchema = priceBookSchema.shape.supplies.element;

/**
 * Checks a price-book line with the engine's schema for its section and returns the data to
 * store (the engine's shape without the fields the row keeps: id, name, kind). Used on every write.
 */
export function engineItem(
	section: PriceSectionName,
	code: string,
	name: string,
	data: unknown
): { ok: true; data: Record<string, unknown> } | { ok: false; issues: z.core.$ZodIssue[] } {
	const d = (data ?? {}) as Record<string, unknown>;
	let r;
	switch (section) {
		case 'floor':
			r = floorProductSchema.safeParse({ ...d, id: code || 'new', name });
			break;
		case 'prep':
			r = prepItemSchema.safeParse({ ...d, kind: code, name });
			break;
		case 'removal':
			r = removalItemSchema.safeParse({ ...d, existing: code });
			break;
		case 'supply':
			r = supplyItemSchema.safeParse({ ...d, kind: code, name });
			break;
	}
	if (!r.success) return { ok: false, issues: r.error.issues };
	// The row keeps these itself: the floor's id and name, the kind or existing floor as its code.
	const rest: Record<string, unknown> = { ...r.data };
	for (const key of KEPT_BY_ROW[section]) delete rest[key];
	return { ok: true, data: rest };
}

const KEPT_BY_ROW: Record<PriceSectionName, string[]> = {
	floor: ['id', 'name'],
	prep: ['kind', 'name'],
	removal: ['existing'],
	supply: ['kind', 'name']
};

// ---------------------------------------------------------------- floor products

const FLOOR_FIELDS: Record<string, string> = {
	kind: 'kind',
	fastening: 'fastening',
	cartonSqFt: 'cartonSqFt',
	rollWidthIn: 'rollWidth',
	tileEdgesIn: 'tileEdges',
	boardWidthIn: 'boardWidth',
	thicknessIn: 'thickness',
	groutJointIn: 'groutJoint',
	groutDepthIn: 'groutDepth',
	material: 'materialPrice',
	labourCentsPerSqFt: 'labourPrice',
	payCentsPerSqFt: 'payPrice',
	needs: 'deflectionRatio'
};

export const floorForm = (currency: string) =>
	z
		.object({
			name: nameField('Name the product, e.g. "Oak plank 7 in"'),
			kind: enumField(FLOOR_KINDS as [FloorKind, ...FloorKind[]], 'Choose the kind of floor'),
			fastening: z.enum(['', ...FASTENINGS]).default(''),
			cartonSqFt: optionalNumber('Carton coverage', 1000),
			rollWidth: optionalLength('Roll width'),
			tileEdges: optionalTileEdges,
			boardWidth: optionalLength('Board width'),
			thickness: optionalLength('Thickness'),
			groutJoint: optionalLength('The grout joint'),
			groutDepth: optionalLength('The joint depth'),
			materialBasis: enumField(MATERIAL_BASES, 'Choose how the material is priced'),
			materialPrice: priceField('the material price', currency),
			materialCost: optionalPriceField('the store cost', currency),
			labourPrice: priceField('the install price per ft²', currency),
			payPrice: priceField('the installer pay per ft²', currency),
			deflectionRatio: optionalRatio,
			rhLimit: optionalNumber('The RH limit', 100),
			mverLimit: optionalNumber('The MVER limit', 100),
			underlayment: z.enum(['', 'yes', 'no']).default('')
		})
		.transform((f, ctx) => {
			const issue = refuser(ctx);
			const roll = isRollKind(f.kind);
			if (roll && f.rollWidth === undefined) {
				issue('rollWidth', 'Enter the roll width, e.g. 12 ft');
			}
			if (!roll && f.cartonSqFt === undefined) {
				issue('cartonSqFt', 'Enter the ft² one carton covers (on the carton label)');
			}
			if (!materialBasesFor(f.kind).includes(f.materialBasis)) {
				issue(
					'materialBasis',
					roll
						? 'Roll goods are priced per yd² or per linear ft of roll'
						: 'Carton goods are priced per carton or per ft² (whole cartons)'
				);
			}
			if (issue.count) return z.NEVER;
			const needs = {
				...(f.deflectionRatio !== undefined && { deflectionRatio: f.deflectionRatio }),
				...(f.rhLimit !== undefined && { rhLimitPct: f.rhLimit }),
				...(f.mverLimit !== undefined && { mverLimit: f.mverLimit }),
				...(f.underlayment && { underlayment: f.underlayment === 'yes' })
			};
			const data: FloorData = {
				kind: f.kind,
				...(f.fastening && { fastening: f.fastening }),
				...(roll ? { rollWidthIn: f.rollWidth } : { cartonSqFt: f.cartonSqFt }),
				...(isTileKind(f.kind) && f.tileEdges && { tileEdgesIn: f.tileEdges }),
				...(isWoodKind(f.kind) && f.boardWidth !== undefined && { boardWidthIn: f.boardWidth }),
				...(f.thickness !== undefined && { thicknessIn: f.thickness }),
				...(isTileKind(f.kind) && f.groutJoint !== undefined && { groutJointIn: f.groutJoint }),
				...(isTileKind(f.kind) && f.groutDepth !== undefined && { groutDepthIn: f.groutDepth }),
				material: {
					basis: f.materialBasis,
					priceCents: f.materialPrice,
					...(f.materialCost !== undefined && { costCents: f.materialCost })
				},
				labourCentsPerSqFt: f.labourPrice,
				payCentsPerSqFt: f.payPrice,
				...(Object.keys(needs).length && { needs })
			};
			const checked = engineCheck(
				floorDataSchema,
				data,
				ctx,
				(p) => FLOOR_FIELDS[String(p[0])] ?? 'name'
			);
			if (checked === z.NEVER) return z.NEVER;
			return { section: 'floor' as const, code: '', name: f.name, data: checked as FloorData };
		});

/** A floor line as its form shows it (prices in dollars, lengths as text). */
export function floorToForm(name: string, d: FloorData, currency: string): Record<string, string> {
	return {
		name,
		kind: d.kind,
		fastening: d.fastening ?? '',
		cartonSqFt: d.cartonSqFt !== undefined ? String(d.cartonSqFt) : '',
		rollWidth: d.rollWidthIn !== undefined ? formatLength(d.rollWidthIn) : '',
		tileEdges: d.tileEdgesIn?.map((e) => formatLength(e, 'in')).join(' x ') ?? '',
		boardWidth: d.boardWidthIn !== undefined ? formatLength(d.boardWidthIn, 'in') : '',
		thickness:
			d.thicknessIn !== undefined ? formatLength(d.thicknessIn, 'in', { denominator: 32 }) : '',
		groutJoint:
			d.groutJointIn !== undefined ? formatLength(d.groutJointIn, 'in', { denominator: 32 }) : '',
		groutDepth:
			d.groutDepthIn !== undefined ? formatLength(d.groutDepthIn, 'in', { denominator: 32 }) : '',
		materialBasis: d.material.basis,
		materialPrice: moneyToInput(d.material.priceCents, currency),
		materialCost: moneyToInput(d.material.costCents, currency),
		labourPrice: moneyToInput(d.labourCentsPerSqFt, currency),
		payPrice: moneyToInput(d.payCentsPerSqFt, currency),
		deflectionRatio: d.needs?.deflectionRatio ? `L/${d.needs.deflectionRatio}` : '',
		rhLimit: d.needs?.rhLimitPct !== undefined ? String(d.needs.rhLimitPct) : '',
		mverLimit: d.needs?.mverLimit !== undefined ? String(d.needs.mverLimit) : '',
		underlayment: d.needs?.underlayment === undefined ? '' : d.needs.underlayment ? 'yes' : 'no'
	};
}

// ---------------------------------------------------------------- prep services

export const prepForm = (currency: string) =>
	z
		.object({
			kind: enumField(PREP_KINDS as [PrepKind, ...PrepKind[]], 'Choose the prep service'),
			name: optionalName,
			basis: enumField(BASES as [Basis, ...Basis[]], 'Choose what the price is per'),
			price: priceField('the customer price', currency),
			pay: priceField('the installer pay', currency),
			cost: optionalPriceField('the store cost', currency)
		})
		.transform((f, ctx) => {
			const name = f.name || PREP_LABELS[f.kind];
			const data: PrepData = {
				basis: f.basis,
				priceCents: f.price,
				payCents: f.pay,
				...(f.cost !== undefined && { costCents: f.cost })
			};
			const fields: Record<string, string> = {
				priceCents: 'price',
				payCents: 'pay',
				costCents: 'cost'
			};
			const checked = engineCheck(
				prepItemSchema,
				{ ...data, kind: f.kind, name },
				ctx,
				(p) => fields[String(p[0])] ?? String(p[0])
			);
			if (checked === z.NEVER) return z.NEVER;
			return { section: 'prep' as const, code: f.kind, name, data };
		});

export function prepToForm(
	code: string,
	name: string,
	d: PrepData,
	currency: string
): Record<string, string> {
	return {
		kind: code,
		name: name === PREP_LABELS[code as PrepKind] ? '' : name,
		basis: d.basis,
		price: moneyToInput(d.priceCents, currency),
		pay: moneyToInput(d.payCents, currency),
		cost: moneyToInput(d.costCents, currency)
	};
}

/** The measure the engine counts a prep in (and schedules its hours by). */
export const prepUnit = (kind: PrepKind) => PREP[kind].unit;

// ---------------------------------------------------------------- removal

export const removalForm = (currency: string) =>
	z
		.object({
			existing: enumField(
				EXISTING_FLOOR_KINDS as [ExistingFloorKind, ...ExistingFloorKind[]],
				'Choose the existing floor'
			),
			name: optionalName,
			basis: enumField(['sqft', 'room'] as const, 'Choose per ft² or per room'),
			price: priceField('the customer price', currency),
			pay: priceField('the installer pay', currency)
		})
		.transform((f, ctx) => {
			const name = f.name || removalName(f.existing);
			const data: RemovalData = { basis: f.basis, priceCents: f.price, payCents: f.pay };
			const fields: Record<string, string> = { priceCents: 'price', payCents: 'pay' };
			const checked = engineCheck(
				removalItemSchema,
				{ ...data, existing: f.existing },
				ctx,
				(p) => fields[String(p[0])] ?? String(p[0])
			);
			if (checked === z.NEVER) return z.NEVER;
			return { section: 'removal' as const, code: f.existing, name, data };
		});

export const removalName = (existing: ExistingFloorKind) =>
	`Tear out ${EXISTING_FLOOR_LABELS[existing].toLowerCase()}`;

export function removalToForm(
	code: string,
	name: string,
	d: RemovalData,
	currency: string
): Record<string, string> {
	return {
		existing: code,
		name: name === removalName(code as ExistingFloorKind) ? '' : name,
		basis: d.basis,
		price: moneyToInput(d.priceCents, currency),
		pay: moneyToInput(d.payCents, currency)
	};
}

// ---------------------------------------------------------------- supplies

export const supplyForm = (currency: string) =>
	z
		.object({
			kind: enumField(SUPPLY_KINDS as [SupplyKind, ...SupplyKind[]], 'Choose the supply'),
			name: nameField('Name the product, e.g. "Plywood underlayment 1/4 in, 4 × 8 ft"'),
			basis: enumField(BASES as [Basis, ...Basis[]], 'Choose what the price is per'),
			price: priceField('the price', currency),
			cost: optionalPriceField('the store cost', currency),
			perBox: optionalNumberField({
				label: 'the fasteners in a box',
				min: 1,
				max: 1_000_000,
				integer: true
			}),
			patchBy: z.enum(['volume', 'coverage']).default('volume'),
			patchVolume: optionalVolumeField,
			patchCoverage: optionalNumber('The coverage', 10_000),
			patchDepth: optionalLength('The depth'),
			bagYield: optionalNumber('The bag yield', 100),
			minDepth: optionalLength('The least pour'),
			maxDepth: optionalLength('The deepest pour'),
			coverage: optionalNumber('The coverage', 10_000),
			stockLength: optionalLength('The stock length')
		})
		.transform((f, ctx) => {
			const issue = refuser(ctx);
			if (!SUPPLY_BASES[f.kind].includes(f.basis)) {
				issue(
					'basis',
					`${SUPPLY_LABELS[f.kind]} is counted ${SUPPLY_BASES[f.kind].map((b) => BASIS_LABELS[b]).join(' or ')}`
				);
			}
			if (f.kind === 'fastener' && f.basis === 'box' && f.perBox === undefined) {
				issue('perBox', 'Enter how many fasteners come in a box');
			}
			let container: SupplyData['container'];
			if (f.kind === 'patch') {
				if (f.patchBy === 'volume') {
					if (f.patchVolume === undefined) {
						issue('patchVolume', 'Enter what one container holds, e.g. 1 gal');
					} else container = { volumeCuIn: f.patchVolume };
				} else {
					if (f.patchCoverage === undefined) {
						issue('patchCoverage', 'Enter the ft² one container covers');
					}
					if (f.patchDepth === undefined) {
						issue('patchDepth', 'Enter the depth that coverage is at, e.g. 1/8 in');
					}
					if (f.patchCoverage !== undefined && f.patchDepth !== undefined) {
						container = { coverageSqFt: f.patchCoverage, atDepthIn: f.patchDepth };
					}
				}
			}
			if ((f.kind === 'leveller' || f.kind === 'grout') && f.bagYield === undefined) {
				issue('bagYield', 'Enter the bag yield in ft³ (on the data sheet)');
			}
			if (COVERAGE_SUPPLIES.includes(f.kind) && f.coverage === undefined) {
				issue(
					'coverage',
					f.kind === 'thinset'
						? 'Enter the ft² one bag covers at your trowel notch (on the data sheet)'
						: 'Enter the ft² one sheet or roll covers, e.g. 15 for a 3 × 5 ft sheet'
				);
			}
			if (STOCK_SUPPLIES.includes(f.kind) && f.stockLength === undefined) {
				issue('stockLength', 'Enter the length one piece is sold in, e.g. 16 ft');
			}
			if (
				f.kind === 'leveller' &&
				f.minDepth !== undefined &&
				f.maxDepth !== undefined &&
				f.minDepth > f.maxDepth
			) {
				issue('maxDepth', 'The deepest pour must be at least the least pour');
			}
			if (issue.count) return z.NEVER;
			const data: SupplyData = {
				basis: f.basis,
				priceCents: f.price,
				...(f.cost !== undefined && { costCents: f.cost }),
				...(f.kind === 'fastener' && f.perBox !== undefined && { perBox: f.perBox }),
				...(container && { container }),
				...((f.kind === 'leveller' || f.kind === 'grout') && { bagYieldCuFt: f.bagYield }),
				...(COVERAGE_SUPPLIES.includes(f.kind) && { coverageSqFt: f.coverage }),
				...(STOCK_SUPPLIES.includes(f.kind) && { stockLengthIn: f.stockLength }),
				...(f.kind === 'leveller' && f.minDepth !== undefined && { minDepthIn: f.minDepth }),
				...(f.kind === 'leveller' && f.maxDepth !== undefined && { maxDepthIn: f.maxDepth })
			};
			const fields: Record<string, string> = {
				priceCents: 'price',
				costCents: 'cost',
				perBox: 'perBox',
				container: 'patchVolume',
				bagYieldCuFt: 'bagYield',
				minDepthIn: 'minDepth',
				coverageSqFt: 'coverage',
				stockLengthIn: 'stockLength',
				maxDepthIn: 'maxDepth'
			};
			const checked = engineCheck(
				supplyItemSchema,
				{ ...data, kind: f.kind, name: f.name },
				ctx,
				(p) => fields[String(p[0])] ?? String(p[0])
			);
			if (checked === z.NEVER) return z.NEVER;
			return { section: 'supply' as const, code: f.kind, name: f.name, data };
		});

export function supplyToForm(
	code: string,
	name: string,
	d: SupplyData,
	currency: string
): Record<string, string> {
	const c = d.container;
	return {
		kind: code,
		name,
		basis: d.basis,
		price: moneyToInput(d.priceCents, currency),
		cost: moneyToInput(d.costCents, currency),
		perBox: d.perBox !== undefined ? String(d.perBox) : '',
		patchBy: c && 'coverageSqFt' in c ? 'coverage' : 'volume',
		patchVolume: c && 'volumeCuIn' in c ? volumeText(c.volumeCuIn) : '',
		patchCoverage: c && 'coverageSqFt' in c ? String(c.coverageSqFt) : '',
		patchDepth: c && 'atDepthIn' in c ? formatLength(c.atDepthIn, 'in') : '',
		bagYield: d.bagYieldCuFt !== undefined ? String(d.bagYieldCuFt) : '',
		minDepth: d.minDepthIn !== undefined ? formatLength(d.minDepthIn, 'in') : '',
		maxDepth: d.maxDepthIn !== undefined ? formatLength(d.maxDepthIn, 'in') : '',
		coverage: d.coverageSqFt !== undefined ? String(d.coverageSqFt) : '',
		stockLength: d.stockLengthIn !== undefined ? formatLength(d.stockLengthIn) : ''
	};
}

/** A volume in the unit it reads best in: whole gallons, else cubic inches. */
export function volumeText(cuIn: number): string {
	const gal = cuIn / CUIN_PER_US_GAL;
	if (Math.abs(gal - Math.round(gal * 100) / 100) < 1e-9 && gal >= 0.25)
		return `${Math.round(gal * 100) / 100} gal`;
	return `${Math.round(cuIn * 100) / 100} cu in`;
}

/** The form schema of a section, for prices typed in `currency`. */
export function sectionForm(section: PriceSectionName, currency: string) {
	switch (section) {
		case 'floor':
			return floorForm(currency);
		case 'prep':
			return prepForm(currency);
		case 'removal':
			return removalForm(currency);
		case 'supply':
			return supplyForm(currency);
	}
}

export const isSection = (s: string): s is PriceSectionName =>
	(PRICE_SECTIONS as readonly string[]).includes(s);

// ---------------------------------------------------------------- the JSON API

/** `POST /api/v1/price-items`: a line in the engine's own shape (cents, inches). */
export const priceItemCreateSchema = z.object({
	section: z.enum(PRICE_SECTIONS),
	code: z.string().trim().max(64).default(''),
	name: z.string().trim().min(1, 'Name the line').max(120),
	active: z.boolean().default(true),
	data: z.record(z.string(), z.unknown())
});

/** `PATCH /api/v1/price-items/:id`: the fields sent are changed; `data` is replaced whole. */
export const priceItemPatchSchema = z.object({
	name: z.string().trim().min(1, 'Name the line').max(120).optional(),
	active: z.boolean().optional(),
	data: z.record(z.string(), z.unknown()).optional()
});
