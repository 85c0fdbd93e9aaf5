/**
 * Prices in integer cents from the store's price book.
 *
 * The one rounding rule: a line's quantity is kept to 1/10,000 of its unit; its extended amount
 * is round-half-up(quantity × unit cents), halves away from zero so a credit mirrors a charge.
 * Each tax is computed once on the subtotal of its taxable groups, rounded by the store's tax
 * rounding (half-up by default). The deposit is round-half-up(total × percent), at least the
 * minimum, never above the total. Installer pay per line uses the same rule as prices.
 */
import { countWithin, figure, LIMITS, LimitError } from './limits';
import { ceilUnits } from './math';
import type { Basis, PrepKind } from './prep';
import type {
	ExistingFloorKind,
	Fastening,
	FlatnessRule,
	FloorKind,
	StoreSettings
} from './settings';
import type { PatchContainer } from './takeoff';

export type LineGroup = 'material' | 'labour' | 'prep' | 'removal';
export const LINE_GROUPS: readonly LineGroup[] = ['material', 'labour', 'prep', 'removal'];

/** Supplies the prep uses, sold by their own units. */
export type SupplyKind =
	| 'underlayment_panel'
	| 'fastener'
	| 'patch'
	| 'leveller'
	| 'thinset'
	| 'grout'
	| 'backer'
	| 'baseboard'
	| 'shoe';
export const SUPPLY_KINDS: readonly SupplyKind[] = [
	'underlayment_panel',
	'fastener',
	'patch',
	'leveller',
	'thinset',
	'grout',
	'backer',
	'baseboard',
	'shoe'
];

/** What a line prices: a floor's material or install, a tear-out, a prep service, a supply. */
export type ItemRef =
	| { type: 'floor'; productId: string }
	| { type: 'install'; productId: string }
	| { type: 'removal'; existing: ExistingFloorKind }
	| { type: 'prep'; kind: PrepKind }
	| { type: 'supply'; kind: SupplyKind };

/** A stable text key for an item: `floor:oak-7`, `prep:level`... */
export function refKey(ref: ItemRef): string {
	switch (ref.type) {
		case 'floor':
		case 'install':
			return `${ref.type}:${ref.productId}`;
		case 'removal':
			return `removal:${ref.existing}`;
		default:
			return `${ref.type}:${ref.kind}`;
	}
}

/** The ref's own id within its type: what `refKey` puts after the colon. */
function refId(ref: ItemRef): string {
	switch (ref.type) {
		case 'floor':
		case 'install':
			return ref.productId;
		case 'removal':
			return ref.existing;
		default:
			return ref.kind;
	}
}

/** A floor product in the price book. */
export interface FloorProduct {
	id: string;
	/** Invented or store name, e.g. "Oak plank 7 in". */
	name: string;
	kind: FloorKind;
	/** How it is held down (wood floors): decides hole repairs. */
	fastening?: Fastening;
	/** ft² per carton, for carton goods. */
	cartonSqFt?: number;
	/** Roll width, in, for roll goods. */
	rollWidthIn?: number;
	/** Tile edges, in (large-format rule). */
	tileEdgesIn?: number[];
	/** Board width, in (wood moisture rule). */
	boardWidthIn?: number;
	/** Thickness of the floor as laid, in (floor height at doorways). */
	thicknessIn?: number;
	/** Tile: the grout joint the maker calls for, and its depth (the tile's own thickness), in. */
	groutJointIn?: number;
	groutDepthIn?: number;
	/** Material price per sellable unit; `sqft` prices whole cartons by their coverage. */
	material: {
		basis: 'carton' | 'sqft' | 'roll_sqyd' | 'roll_linft';
		priceCents: number;
		costCents?: number;
	};
	/** Install price and installer pay, cents per ft² of floor. */
	labourCentsPerSqFt: number;
	payCentsPerSqFt: number;
	/** What this floor needs, overriding the store's defaults. */
	needs?: {
		deflectionRatio?: number;
		rhLimitPct?: number;
		mverLimit?: number;
		flatness?: FlatnessRule[];
		underlayment?: boolean;
		/** A separate underlay under this floating floor (false when a pad is attached). */
		underlay?: boolean;
	};
}

/** A prep service keyed by the prep kind the engine emits. */
export interface PrepPrice {
	kind: PrepKind;
	name?: string;
	basis: Basis;
	priceCents: number;
	payCents: number;
	costCents?: number;
}

/** Tear-out of an existing floor. */
export interface RemovalPrice {
	existing: ExistingFloorKind;
	basis: 'sqft' | 'room';
	priceCents: number;
	payCents: number;
}

/** A supply with the product data the takeoff needs. */
export interface SupplyPrice {
	kind: SupplyKind;
	name: string;
	basis: Basis;
	priceCents: number;
	costCents?: number;
	/** Fasteners per box (basis `box`). */
	perBox?: number;
	/** Patch container (basis `container`). */
	container?: PatchContainer;
	/** Leveller bag yield, ft³ (basis `bag`). */
	bagYieldCuFt?: number;
	/** Leveller pour depth the data sheet allows, in: thinner pours are poured at the minimum. */
	minDepthIn?: number;
	maxDepthIn?: number;
	/** ft² one unit covers (data sheet): a thinset bag at the store's trowel, a backer sheet or membrane roll. */
	coverageSqFt?: number;
	/** Length of one stock piece, in (baseboard, shoe): runs are cut from whole pieces. */
	stockLengthIn?: number;
}

/** The store's price book. Every price is integer cents per unit of its basis. */
export interface PriceBook {
	currency: string;
	floors: FloorProduct[];
	prep: PrepPrice[];
	removal: RemovalPrice[];
	supplies: SupplyPrice[];
}

/** A priced line as the customer sees it. */
export interface PriceLine {
	id: string;
	roomId?: string;
	ref: ItemRef;
	key: string;
	group: LineGroup;
	description: string;
	basis: Basis;
	qty: number;
	unitCents: number;
	amountCents: number;
	taxable: boolean;
	/** Findings that called for this line. */
	findingIds: string[];
}

/** Installer pay for a line; kept apart from prices. */
export interface PayLine {
	lineId: string;
	roomId?: string;
	description: string;
	basis: Basis;
	qty: number;
	unitCents: number;
	amountCents: number;
}

export type Rounding = StoreSettings['taxRounding'];

/** Integer division n ÷ d (d > 0) rounded on the magnitude, so credits mirror charges. */
export function divRound(n: number, d: number, mode: Rounding = 'half_up'): number {
	const sign = n < 0 ? -1 : 1;
	const a = Math.abs(n);
	const r = a % d;
	const q = (a - r) / d;
	let out = q;
	if (mode === 'half_up') out = 2 * r >= d ? q + 1 : q;
	else if (mode === 'half_even') out = 2 * r > d || (2 * r === d && q % 2 === 1) ? q + 1 : q;
	else if (mode === 'up') out = r > 0 ? q + 1 : q;
	return sign * out || 0;
}

/**
 * round(a × b ÷ d) by `mode`, exact for whole numbers however large the product: past 2^53 a
 * float product loses cents, so it is worked out in BigInt.
 */
export function mulDivRound(a: number, b: number, d: number, mode: Rounding = 'half_up'): number {
	const n = a * b;
	if (Number.isSafeInteger(n) || !Number.isInteger(a) || !Number.isInteger(b))
		return divRound(n, d, mode);
	const big = BigInt(a) * BigInt(b);
	const sign = big < 0n ? -1n : 1n;
	const abs = big * sign;
	const D = BigInt(d);
	const q = abs / D;
	const r = abs % D;
	let out = q;
	if (mode === 'half_up') out = 2n * r >= D ? q + 1n : q;
	else if (mode === 'half_even') out = 2n * r > D || (2n * r === D && q % 2n === 1n) ? q + 1n : q;
	else if (mode === 'up') out = r > 0n ? q + 1n : q;
	return Number(sign * out);
}

const QTY_SCALE = 10_000;

/** A quantity kept to 1/10,000 of its unit, as an integer count of ten-thousandths. */
export function qtyUnits(qty: number): number {
	return Math.round(qty * QTY_SCALE);
}

/** round-half-up(qty × unitCents), with qty kept to 1/10,000 of its unit. */
export function extend(qty: number, unitCents: number): number {
	return mulDivRound(qtyUnits(qty), unitCents, QTY_SCALE);
}

export interface Resolved {
	group: LineGroup;
	name: string;
	basis: Basis;
	unitCents: number;
	payCents: number;
	costCents?: number;
}

/** Price-book lookups built once per estimate. */
export class PriceIndex {
	readonly floors = new Map<string, FloorProduct>();
	readonly prep = new Map<PrepKind, PrepPrice>();
	readonly removal = new Map<ExistingFloorKind, RemovalPrice>();
	readonly supplies = new Map<SupplyKind, SupplyPrice>();

	constructor(readonly book: PriceBook) {
		for (const section of ['floors', 'prep', 'removal', 'supplies'] as const)
			countWithin(book[section].length, section, 'price-book lines', LIMITS.priceBookLines);
		for (const f of book.floors) this.floors.set(f.id, f);
		for (const p of book.prep) this.prep.set(p.kind, p);
		for (const r of book.removal) this.removal.set(r.existing, r);
		for (const s of book.supplies) this.supplies.set(s.kind, s);
	}

	/**
	 * Prices looked up so far, by the ref's type and then its own id (product id, existing floor
	 * or kind): no key text is built per line, since hashing a freshly joined string on every
	 * lookup showed in the benchmark's profile.
	 */
	private readonly resolved: Record<ItemRef['type'], Map<string, Resolved | string>> = {
		floor: new Map(),
		install: new Map(),
		removal: new Map(),
		prep: new Map(),
		supply: new Map()
	};

	/** The price of an item, or a message saying what is missing (looked up once per item). */
	resolve(ref: ItemRef): Resolved | string {
		const byType = this.resolved[ref.type];
		const id = refId(ref);
		let r = byType.get(id);
		if (r === undefined) {
			r = this.lookup(ref);
			byType.set(id, r);
		}
		return r;
	}

	private lookup(ref: ItemRef): Resolved | string {
		switch (ref.type) {
			case 'floor': {
				const f = this.floors.get(ref.productId);
				if (!f) return `No floor product "${ref.productId}" in the price book`;
				return {
					group: 'material',
					name: f.name,
					basis: f.material.basis,
					unitCents: f.material.priceCents,
					payCents: 0,
					costCents: f.material.costCents
				};
			}
			case 'install': {
				const f = this.floors.get(ref.productId);
				if (!f) return `No floor product "${ref.productId}" in the price book`;
				return {
					group: 'labour',
					name: `Install ${f.name}`,
					basis: 'sqft',
					unitCents: f.labourCentsPerSqFt,
					payCents: f.payCentsPerSqFt
				};
			}
			case 'removal': {
				const r = this.removal.get(ref.existing);
				if (!r) return `No removal price for existing ${ref.existing.replace(/_/g, ' ')}`;
				return {
					group: 'removal',
					name: `Remove ${ref.existing.replace(/_/g, ' ')}`,
					basis: r.basis,
					unitCents: r.priceCents,
					payCents: r.payCents
				};
			}
			case 'prep': {
				const p = this.prep.get(ref.kind);
				if (!p) return `No price for prep "${ref.kind}"`;
				return {
					group: 'prep',
					name: p.name ?? ref.kind,
					basis: p.basis,
					unitCents: p.priceCents,
					payCents: p.payCents,
					costCents: p.costCents
				};
			}
			case 'supply': {
				const s = this.supplies.get(ref.kind);
				if (!s) return `No price for supply "${ref.kind}"`;
				return {
					group: 'material',
					name: s.name,
					basis: s.basis,
					unitCents: s.priceCents,
					payCents: 0,
					costCents: s.costCents
				};
			}
		}
	}
}

export interface Priced {
	line: PriceLine;
	pay?: PayLine;
	costCents?: number;
}

/** Whether any of the store's taxes falls on `group` (a loop: this runs for every line). */
function taxedGroup(settings: StoreSettings, group: LineGroup): boolean {
	for (const t of settings.taxes) if (t.groups.includes(group)) return true;
	return false;
}

/** Prices `qty` (in the price's basis) of an item; taxable by the store's tax groups. */
export function priceQty(
	item: { ref: ItemRef; roomId?: string; qty: number; description?: string; findingIds?: string[] },
	price: Resolved,
	settings: StoreSettings,
	/** The quantity to price, when not the item's own. */
	itemQty = item.qty
): Priced {
	const key = refKey(item.ref);
	const id = `${item.roomId ?? 'job'}:${key}`;
	if (!(Math.abs(itemQty) <= LIMITS.lineQty))
		throw new LimitError(
			'qty',
			LIMITS.lineQty,
			`${item.description ?? price.name} comes to ${figure(itemQty)} ${price.basis}; the engine prices up to ${figure(LIMITS.lineQty)} a line`
		);
	const qty = qtyUnits(itemQty) / QTY_SCALE;
	const description = item.description ?? price.name;
	const line: PriceLine = {
		id,
		roomId: item.roomId,
		ref: item.ref,
		key,
		group: price.group,
		description,
		basis: price.basis,
		qty,
		unitCents: price.unitCents,
		amountCents: extend(qty, price.unitCents),
		taxable: taxedGroup(settings, price.group),
		findingIds: item.findingIds ?? []
	};
	const pay: PayLine | undefined =
		price.payCents > 0
			? {
					lineId: id,
					roomId: item.roomId,
					description,
					basis: price.basis,
					qty,
					unitCents: price.payCents,
					amountCents: extend(qty, price.payCents)
				}
			: undefined;
	const costCents = price.costCents === undefined ? undefined : extend(qty, price.costCents);
	const most = Math.max(
		Math.abs(line.amountCents),
		Math.abs(pay?.amountCents ?? 0),
		Math.abs(costCents ?? 0)
	);
	if (!(most <= LIMITS.lineCents))
		throw new LimitError(
			'qty',
			LIMITS.lineCents,
			`${description} comes to ${figure(most / 100)} (in whole units of the currency); the engine prices up to ${figure(LIMITS.lineCents / 100)} a line`
		);
	return { line, pay, costCents };
}

export interface TaxLine {
	name: string;
	rateBps: number;
	taxableCents: number;
	taxCents: number;
}

export interface Totals {
	byGroup: Record<LineGroup, number>;
	subtotalCents: number;
	taxes: TaxLine[];
	taxCents: number;
	totalCents: number;
	depositCents: number;
	balanceCents: number;
}

/** Each tax once on the subtotal of its taxable groups, rounded by the store's rule. */
export function taxes(
	byGroup: Record<LineGroup, number>,
	settings: Pick<StoreSettings, 'taxes' | 'taxRounding'>
): TaxLine[] {
	countWithin(settings.taxes.length, 'taxes', 'taxes', LIMITS.settingsRows);
	return settings.taxes.map((t) => {
		const taxableCents = t.groups.reduce((s, g) => s + byGroup[g], 0);
		return {
			name: t.name,
			rateBps: t.rateBps,
			taxableCents,
			taxCents: mulDivRound(taxableCents, t.rateBps, 10_000, settings.taxRounding)
		};
	});
}

/** Deposit: round-half-up(total × percent), at least the minimum, never above the total. */
export function depositCents(totalCents: number, deposit: StoreSettings['deposit']): number {
	if (totalCents <= 0) return 0;
	const pct = mulDivRound(totalCents, deposit.percentBps, 10_000);
	return Math.min(totalCents, Math.max(deposit.minimumCents, pct));
}

/** Subtotals by group, taxes, total, deposit and balance. */
export function totals(lines: readonly PriceLine[], settings: StoreSettings): Totals {
	// One running sum per group (a switch, not a store keyed by the group: this runs per line).
	let material = 0;
	let labour = 0;
	let prep = 0;
	let removal = 0;
	for (const l of lines)
		switch (l.group) {
			case 'material':
				material += l.amountCents;
				break;
			case 'labour':
				labour += l.amountCents;
				break;
			case 'prep':
				prep += l.amountCents;
				break;
			case 'removal':
				removal += l.amountCents;
				break;
		}
	const byGroup: Record<LineGroup, number> = { material, labour, prep, removal };
	const subtotalCents = byGroup.material + byGroup.labour + byGroup.prep + byGroup.removal;
	const taxLines = taxes(byGroup, settings);
	const taxCents = taxLines.reduce((s, t) => s + t.taxCents, 0);
	const totalCents = subtotalCents + taxCents;
	const dep = depositCents(totalCents, settings.deposit);
	return {
		byGroup,
		subtotalCents,
		taxes: taxLines,
		taxCents,
		totalCents,
		depositCents: dep,
		balanceCents: totalCents - dep
	};
}

export interface Margin {
	/** Pre-tax sales. */
	revenueCents: number;
	installerPayCents: number;
	/** Material and prep cost where the price book gives one. */
	costCents: number;
	marginCents: number;
	/** Margin as basis points of revenue (0 when there is no revenue). */
	marginBps: number;
	/** False when some material line has no cost in the price book. */
	costComplete: boolean;
}

/** The store's margin: revenue less installer pay and known costs. */
export function margin(
	revenueCents: number,
	installerPayCents: number,
	costCents: number,
	costComplete: boolean
): Margin {
	const marginCents = revenueCents - installerPayCents - costCents;
	return {
		revenueCents,
		installerPayCents,
		costCents,
		marginCents,
		marginBps: revenueCents > 0 ? mulDivRound(marginCents, 10_000, revenueCents) : 0,
		costComplete
	};
}

/** Whole units for a supply's basis (boxes of fasteners, etc.). */
export function supplyUnits(count: number, perUnit: number | undefined): number {
	return perUnit && perUnit > 0 ? ceilUnits(count / perUnit) : count;
}
