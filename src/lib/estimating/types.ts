/**
 * The engine's input and result types: a job's measure with the store's settings and price
 * book in, and the priced estimate out. Every step imports its types from here, so no module
 * of the engine imports the index or another step for a type.
 */
import type { CautionKind } from './cautions';
import type { Cutout, Outline, Shape } from './geometry';
import type { Margin, PayLine, PriceBook, PriceLine, Totals } from './pricing';
import type { PrepKind } from './prep';
import type { Schedule } from './schedule';
import type {
	ExistingFloorKind,
	FloorKind,
	JoistSize,
	Layout,
	Species,
	StoreSettings,
	SubfloorKind
} from './settings';
import type { CalciumChlorideTest, Check, FlatnessReading } from './substrate';
import type {
	CartonTakeoff,
	HoleRepair,
	LevellerTakeoff,
	PatchTakeoff,
	RollDirection,
	RollTakeoff,
	UnderlaymentTakeoff,
	Void
} from './takeoff';

/** A whole job to estimate: the measure, the store's settings and its price book. */
export interface EstimateInput {
	job: JobMeasure;
	settings: StoreSettings;
	priceBook: PriceBook;
}

/** The site measure. */
export interface JobMeasure {
	/** Year the house was built, if known: tear-out of older floors carries the asbestos caution. */
	builtYear?: number;
	rooms: RoomMeasure[];
}

/** One room as measured. */
export interface RoomMeasure {
	/** Stable id, unique in the job (lines and findings refer to it). */
	id: string;
	name: string;
	/** The room's outline, in inches. */
	shape: Shape;
	/** Islands, cabinets, hearths: no floor there. */
	cutouts?: Cutout[];
	/** The new floor; required. */
	floor?: RoomFloor;
	/** Existing floors to tear out, top layer first. */
	remove?: ExistingFloorKind[];
	subfloor: SubfloorMeasure;
	/** New underlayment panels over a wood subfloor; default from the floor and store settings. */
	underlayment?: boolean;
	/** Trim along the walls and cut-outs (priced per linear foot of perimeter). */
	trim?: boolean;
	/** Transition strips at doorways (a count; `doorways` says more). */
	transitions?: number;
	/** Doorways out of the room: trim stops at them, each gets a transition, reducer or threshold. */
	doorways?: DoorwayMeasure[];
	/** Baseboard and shoe (or quarter-round): removed and put back, or new. */
	base?: { baseboard?: 'reset' | 'new'; shoe?: 'reset' | 'new' };
	/** Furniture to move out and back. */
	furniture?: boolean;
	/** Appliances to disconnect and reset (dishwasher, range, fridge water line). */
	appliances?: number;
	/** Toilets to pull and reset. */
	toilets?: number;
	/** Steps of a stair covered in this room's floor (tread, riser, nosing each). */
	stairs?: number;
	repairs?: RepairsMeasure;
	/** Joists under the room; needed for tile and stone. */
	joists?: JoistMeasure;
	readings?: ReadingsMeasure;
}

export interface RoomFloor {
	/** A `PriceBook.floors[].id`. */
	productId: string;
	layout: Layout;
	/** Force the direction roll drops run (x or y of the outline); default: least material. */
	rollDirection?: RollDirection;
	/** The axis the main light falls along: seams run along it when that costs no extra seam. */
	light?: RollDirection;
}

/** A doorway: its width, whether a door swings in it, and the next room's floor height. */
export interface DoorwayMeasure {
	widthIn: number;
	door?: boolean;
	/** Height of the next room's finished floor above this room's subfloor, in. */
	nextFloorIn?: number;
}

/** The slab a concrete room is on: tests are counted for the slab, not the room. */
export interface SlabMeasure {
	/** Rooms with the same id share one slab; default: the room is its own slab. */
	id?: string;
	thicknessIn?: number;
	/** How the slab dries: from the top only (on grade, on a vapour retarder) or both ways. */
	drying?: 'top' | 'both';
}

export interface SubfloorMeasure {
	kind: SubfloorKind;
	/** Panel layers of a wood subfloor (default 1). */
	layers?: number;
	/** A concrete subfloor's slab. */
	slab?: SlabMeasure;
	/** Thickness, in (wood subfloors). */
	thicknessIn?: number;
	/** Panel span rating stamped on the panel, e.g. `32/16`. */
	spanRating?: string;
}

/** Repairs measured on site; the installer reports found repairs in the same shape. */
export interface RepairsMeasure {
	/** Holes, each `widthIn` across the joists by `lengthIn` along them. */
	holes?: { widthIn: number; lengthIn: number }[];
	/** Open seams and gaps: length, widest point, depth. */
	seams?: Void[];
	/** Dents and voids: length, width, average depth. */
	dents?: Void[];
	/** Fasteners and staples left from the old floor: the whole room (`true`) or an area. */
	fasteners?: boolean | { areaSqFt: number };
}

export interface JoistMeasure {
	size: JoistSize;
	species: Species;
	spacingIn: number;
	spanIn: number;
	/** Axis the joists run along (x or y of the outline); default: the shorter side. */
	runs?: 'x' | 'y';
	/** I-joists instead of sawn lumber (`size` and `species` are then not used). */
	iJoist?: { eiLbIn2?: number; label?: string };
}

export interface FlatnessMeasure extends FlatnessReading {
	/** Area to level for this reading, ft²; default from settings. */
	areaSqFt?: number;
}

export interface ReadingsMeasure {
	flatness?: FlatnessMeasure[];
	/** In-situ concrete RH probes, %. */
	rhPct?: number[];
	calciumChloride?: CalciumChlorideTest[];
	/** Wood moisture content readings, %. */
	woodMc?: { subfloorPct: number[]; flooringPct: number[] };
}

/** A field the user can fix, named so the UI can show the message beside it. */
export interface EstimateError {
	/** Dotted path into `EstimateInput`, e.g. `job.rooms.2.floor.productId`. */
	path: string;
	roomId?: string;
	message: string;
	/**
	 * Set when the engine refused work beyond one of its `LIMITS` (the bound that was passed):
	 * the request itself is at fault, not the measure, so an API answers 400.
	 */
	limit?: number;
}

/** A check's result tied to its room and the lines it caused. */
export interface Finding extends Check {
	id: string;
	roomId: string;
	lineIds: string[];
	/** Caution texts for `cautions`. */
	cautionTexts: string[];
}

/** A caution shown on the quote, with the rooms and lines that raised it. */
export interface CautionNote {
	kind: CautionKind;
	text: string;
	roomIds: string[];
	lineIds: string[];
}

export interface RoomResult {
	id: string;
	name: string;
	ok: boolean;
	areaSqFt: number;
	perimeterIn: number;
	wallPerimeterIn: number;
	outline?: Outline;
	floor?: { productId: string; kind: FloorKind; cartons?: CartonTakeoff; roll?: RollTakeoff };
	underlayment?: UnderlaymentTakeoff;
	patch?: PatchTakeoff;
	leveller?: LevellerTakeoff;
	holes: HoleRepair[];
	/** Prep kinds in this room and their quantities by measure. */
	prep: { kind: PrepKind; qty: Partial<Record<string, number>> }[];
	findingIds: string[];
	warnings: string[];
}

export interface EstimateResult {
	ok: boolean;
	errors: EstimateError[];
	rooms: RoomResult[];
	findings: Finding[];
	/** Customer prices. */
	lines: PriceLine[];
	/** Installer pay, apart from prices. */
	pay: PayLine[];
	totals: Totals;
	installerPayCents: number;
	margin: Margin;
	schedule: Schedule;
	cautions: CautionNote[];
	warnings: { roomId?: string; message: string }[];
}
