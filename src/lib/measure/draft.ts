/**
 * The site measure as people type it: every length is the text typed ("12' 6 1/2\"", "3810 mm"),
 * kept as typed so nothing is lost, and read by `$lib/input` (the engine's `parseLength` for
 * lengths) when a quote is built or a drawing is shown. Shared by the browser (live drawings and totals) and the server (stored
 * quotes), so both read the same text the same way.
 */
// zod/mini: the same zod 4 core as `zod`, with functions instead of methods, so the browser
// ships only the checks these schemas use (the measure page runs them on what it kept offline).
// Messages come from the locale that `zod` (imported by every server schema) configures.
import * as z from 'zod/mini';
import type {
	Cutout,
	JobMeasure,
	LengthUnit,
	RoomMeasure,
	Shape,
	StoreSettings
} from '$lib/estimating';
// The engine's modules by name, not its index: the calculators' forms read this module's
// helpers without the engine (importing the index would put all of it in their chunk).
import { LIMITS } from '$lib/estimating/limits';
import {
	EXISTING_FLOOR_KINDS,
	JOIST_SIZES,
	LAYOUTS,
	SPECIES,
	SUBFLOOR_KINDS
} from '$lib/estimating/settings';
import { readLength, readNumber } from '$lib/input';

const text = (max = 40) => z._default(z.string().check(z.maxLength(max)), '');
/** A list of at most `max`. */
const list = <T extends z.ZodMiniType>(item: T, max: number) =>
	z.array(item).check(z.maxLength(max));
/** A list of at most `max`, empty when missing. */
const listOr = <T extends z.ZodMiniType>(item: T, max: number) => z._default(list(item, max), []);
const choice = <const T extends string>(values: readonly T[], initial: NoInfer<T>) =>
	z._default(z.enum(values), initial);
const flag = () => z._default(z.boolean(), false);

const rectDraft = z.object({ x: text(), y: text(), width: text(), length: text() });
export type RectDraft = z.infer<typeof rectDraft>;

const shapeDraft = z.discriminatedUnion('kind', [
	z.object({ kind: z.literal('rect'), width: text(), length: text() }),
	z.object({ kind: z.literal('rects'), rects: list(rectDraft, 20) }),
	z.object({
		kind: z.literal('sides'),
		sides: list(
			z.object({ length: text(), turn: z.union([z.enum(['left', 'right']), text(8)]) }),
			60
		)
	})
]);
export type ShapeDraft = z.infer<typeof shapeDraft>;

const voidDraft = z.object({ length: text(), width: text(), depth: text() });

const INSTALL_DEFAULT = {
	rollDirection: 'auto' as const,
	light: 'unknown' as const,
	layers: '1' as const,
	slabId: '',
	slabThickness: '',
	slabDrying: 'top' as const,
	doorways: [],
	baseboard: 'none' as const,
	shoe: 'none' as const,
	furniture: false,
	appliances: '',
	toilets: '',
	stairs: ''
};
/** The rest of a real install (issue 12): seams, slab, doorways, trim, fixtures, stairs. */
const installDraft = z._default(
	z.object({
		rollDirection: choice(['auto', 'x', 'y'], 'auto'),
		light: choice(['unknown', 'x', 'y'], 'unknown'),
		layers: choice(['1', '2'], '1'),
		slabId: text(40),
		slabThickness: text(),
		slabDrying: choice(['top', 'both'], 'top'),
		doorways: listOr(z.object({ width: text(), door: flag(), nextFloor: text() }), 20),
		baseboard: choice(['none', 'reset', 'new'], 'none'),
		shoe: choice(['none', 'reset', 'new'], 'none'),
		furniture: flag(),
		appliances: text(4),
		toilets: text(4),
		stairs: text(4)
	}),
	() => structuredClone(INSTALL_DEFAULT)
);

export const roomDraftSchema = z.object({
	id: z.string().check(z.minLength(1), z.maxLength(64)),
	name: text(80),
	shape: shapeDraft,
	cutouts: listOr(z.extend(rectDraft, { name: text(60) }), 20),
	floor: z._default(
		z.object({
			productId: text(64),
			layout: choice(LAYOUTS, 'straight')
		}),
		{ productId: '', layout: 'straight' }
	),
	remove: listOr(z.enum(EXISTING_FLOOR_KINDS), 4),
	subfloor: z._default(
		z.object({
			kind: choice(SUBFLOOR_KINDS, 'plywood'),
			thickness: text(),
			spanRating: text(12)
		}),
		{ kind: 'plywood', thickness: '', spanRating: '' }
	),
	underlayment: choice(['auto', 'yes', 'no'], 'auto'),
	trim: flag(),
	transitions: text(4),
	repairs: z._default(
		z.object({
			holes: listOr(z.object({ width: text(), length: text() }), 50),
			seams: listOr(voidDraft, 50),
			dents: listOr(voidDraft, 50),
			fasteners: choice(['none', 'room', 'area'], 'none'),
			fastenerArea: text(12)
		}),
		{ holes: [], seams: [], dents: [], fasteners: 'none', fastenerArea: '' }
	),
	readings: z._default(
		z.object({
			flatness: listOr(z.object({ span: text(), gap: text() }), 50),
			rh: listOr(text(8), 50),
			calciumChloride: listOr(z.object({ gain: text(10), area: text(10), hours: text(10) }), 20),
			woodSubfloor: listOr(text(8), 50),
			woodFlooring: listOr(text(8), 50)
		}),
		{ flatness: [], rh: [], calciumChloride: [], woodSubfloor: [], woodFlooring: [] }
	),
	install: installDraft,
	joists: z._default(
		z.nullable(
			z.object({
				size: z.enum(JOIST_SIZES),
				species: z.enum(SPECIES),
				spacing: text(),
				span: text(),
				/** I-joists: size and species are then not used; EI comes from the maker's data. */
				iJoist: z.optional(z.boolean()),
				/** EI, millions of lb·in² (the maker's tables). */
				ei: z.optional(z.string().check(z.maxLength(12)))
			})
		),
		null
	),
	notes: text(2000)
});
export type RoomDraft = z.infer<typeof roomDraftSchema>;

export const measureDraftSchema = z.object({
	builtYear: text(4),
	rooms: list(roomDraftSchema, 200)
});
export type MeasureDraft = z.infer<typeof measureDraftSchema>;

/** A new room: a rectangle with nothing measured yet. */
export function emptyRoom(id: string, name = ''): RoomDraft {
	// zod copies a default object shallowly: without the clone every new room would share the
	// lists inside `repairs` and `readings`, and a hole added to one would appear in all.
	return structuredClone(
		roomDraftSchema.parse({ id, name, shape: { kind: 'rect', width: '', length: '' } })
	);
}

export function emptyMeasure(): MeasureDraft {
	return { builtYear: '', rooms: [] };
}

/** A problem with one typed field, by its path in the draft (`rooms.0.shape.width`). */
export interface DraftError {
	path: string;
	roomId?: string;
	message: string;
}

/** Default units for what people type: rooms in feet (metres), small things in inches (millimetres). */
export function draftUnits(settings: Pick<StoreSettings, 'units'>): {
	room: LengthUnit;
	small: LengthUnit;
} {
	return settings.units.system === 'metric'
		? { room: 'm', small: 'mm' }
		: { room: 'ft', small: 'in' };
}

class Reader {
	errors: DraftError[] = [];
	constructor(
		readonly units: { room: LengthUnit; small: LengthUnit },
		private roomId?: string
	) {}

	for(roomId: string) {
		const r = new Reader(this.units, roomId);
		r.errors = this.errors;
		return r;
	}

	/** A required length; blank or unreadable adds an error and gives undefined. */
	length(value: string, path: string, label: string, unit: 'room' | 'small', optional = false) {
		if (!value.trim()) {
			if (!optional) this.fail(path, `Enter the ${label}`);
			return undefined;
		}
		const r = readLength(value, this.units[unit]);
		if (!r.ok) return this.fail(path, r.message);
		if (r.value < 0) return this.fail(path, `The ${label} cannot be negative`);
		if (r.value > LIMITS.lengthIn)
			return this.fail(path, `The ${label} can be at most 500 ft (${LIMITS.lengthIn} in)`);
		return r.value;
	}

	/** A positive length: zero is refused too. */
	positive(value: string, path: string, label: string, unit: 'room' | 'small', optional = false) {
		const inches = this.length(value, path, label, unit, optional);
		if (inches === 0) return this.fail(path, `The ${label} must be more than zero`);
		return inches;
	}

	/** A plain number (%, g, h, ft²) in a range, by the one number rule of `$lib/input`. */
	number(
		value: string,
		path: string,
		label: string,
		min: number,
		max: number,
		optional = false,
		integer = false
	) {
		if (!value.trim()) {
			if (!optional) this.fail(path, `Enter the ${label}`);
			return undefined;
		}
		const r = readNumber(value, { label: `the ${label}`, units: ['%'], min, max, integer });
		return r.ok ? r.value : this.fail(path, r.message);
	}

	fail(path: string, message: string): undefined {
		this.errors.push({ path, roomId: this.roomId, message });
		return undefined;
	}
}

function readShape(shape: ShapeDraft, r: Reader, at: string): Shape | undefined {
	if (shape.kind === 'rect') {
		const widthIn = r.positive(shape.width, `${at}.width`, 'width', 'room');
		const lengthIn = r.positive(shape.length, `${at}.length`, 'length', 'room');
		return widthIn && lengthIn ? { kind: 'rect', widthIn, lengthIn } : undefined;
	}
	if (shape.kind === 'rects') {
		if (!shape.rects.length) return r.fail(`${at}.rects`, 'Add at least one rectangle');
		const rects = shape.rects.map((rect, i) => readRect(rect, r, `${at}.rects.${i}`));
		if (rects.some((x) => !x)) return undefined;
		return { kind: 'rects', rects: rects as NonNullable<(typeof rects)[number]>[] };
	}
	if (shape.sides.length < 3) return r.fail(`${at}.sides`, 'A room needs at least three sides');
	const sides = shape.sides.map((side, i) => {
		const lengthIn = r.positive(side.length, `${at}.sides.${i}.length`, 'side', 'room');
		const turn =
			side.turn === 'left' || side.turn === 'right'
				? side.turn
				: r.number(side.turn, `${at}.sides.${i}.turn`, 'turn', -179, 179);
		return lengthIn && turn !== undefined ? { lengthIn, turn } : undefined;
	});
	if (sides.some((s) => !s)) return undefined;
	return { kind: 'sides', sides: sides as { lengthIn: number; turn: 'left' | 'right' | number }[] };
}

function readRect(rect: RectDraft, r: Reader, at: string) {
	const xIn = rect.x.trim()
		? r.length(rect.x, `${at}.x`, 'distance across from the left', 'room')
		: 0;
	const yIn = rect.y.trim()
		? r.length(rect.y, `${at}.y`, 'distance up from the bottom', 'room')
		: 0;
	const widthIn = r.positive(rect.width, `${at}.width`, 'width', 'room');
	const lengthIn = r.positive(rect.length, `${at}.length`, 'length', 'room');
	if (xIn === undefined || yIn === undefined || !widthIn || !lengthIn) return undefined;
	return { xIn, yIn, widthIn, lengthIn };
}

/** The room's outline alone (for drawings as people type); undefined while a length is unreadable. */
export function readRoomShape(
	room: Pick<RoomDraft, 'shape' | 'cutouts'>,
	settings: Pick<StoreSettings, 'units'>
): { shape?: Shape; cutouts: Cutout[]; errors: DraftError[] } {
	const r = new Reader(draftUnits(settings));
	const shape = readShape(room.shape, r, 'shape');
	const cutouts: Cutout[] = [];
	room.cutouts.forEach((c, i) => {
		const rect = readRect(c, r, `cutouts.${i}`);
		if (rect)
			cutouts.push({ name: c.name || `Cut-out ${i + 1}`, shape: { kind: 'rect', ...rect } });
	});
	return { shape, cutouts, errors: r.errors };
}

/**
 * Reads the whole draft into the engine's measure. Every unreadable field is an error with its
 * path; rooms with errors are left out of `job` so the rest can still be drawn and priced.
 */
export function toEngine(
	draft: MeasureDraft,
	settings: Pick<StoreSettings, 'units'>
): { job: JobMeasure; errors: DraftError[] } {
	const reader = new Reader(draftUnits(settings));
	const rooms: RoomMeasure[] = [];
	const builtYear = reader.number(
		draft.builtYear,
		'builtYear',
		'year built',
		1600,
		2200,
		true,
		true
	);
	const names = new Set<string>();

	draft.rooms.forEach((room, i) => {
		const at = `rooms.${i}`;
		const r = reader.for(room.id);
		const before = r.errors.length;
		const name = room.name.trim() || `Room ${i + 1}`;
		if (names.has(name.toLowerCase())) r.fail(`${at}.name`, `Another room is called "${name}"`);
		names.add(name.toLowerCase());

		const shape = readShape(room.shape, r, `${at}.shape`);
		const cutouts: Cutout[] = [];
		room.cutouts.forEach((c, j) => {
			const rect = readRect(c, r, `${at}.cutouts.${j}`);
			if (rect)
				cutouts.push({ name: c.name || `Cut-out ${j + 1}`, shape: { kind: 'rect', ...rect } });
		});
		const thicknessIn = r.positive(
			room.subfloor.thickness,
			`${at}.subfloor.thickness`,
			'subfloor thickness',
			'small',
			true
		);
		const transitions = r.number(
			room.transitions,
			`${at}.transitions`,
			'number of transitions',
			0,
			50,
			true,
			true
		);

		const holes = room.repairs.holes.map((h, j) => {
			const widthIn = r.positive(h.width, `${at}.repairs.holes.${j}.width`, 'hole width', 'small');
			const lengthIn = r.positive(
				h.length,
				`${at}.repairs.holes.${j}.length`,
				'hole length',
				'small'
			);
			return widthIn && lengthIn ? { widthIn, lengthIn } : undefined;
		});
		const voids = (list: RoomDraft['repairs']['seams'], kind: 'seams' | 'dents', label: string) =>
			list.map((v, j) => {
				const p = `${at}.repairs.${kind}.${j}`;
				const lengthIn = r.positive(
					v.length,
					`${p}.length`,
					`${label} length`,
					kind === 'seams' ? 'room' : 'small'
				);
				const widthIn = r.positive(v.width, `${p}.width`, `${label} width`, 'small');
				const depthIn = r.positive(v.depth, `${p}.depth`, `${label} depth`, 'small');
				return lengthIn && widthIn && depthIn ? { lengthIn, widthIn, depthIn } : undefined;
			});
		const seams = voids(room.repairs.seams, 'seams', 'seam');
		const dents = voids(room.repairs.dents, 'dents', 'dent');
		let fasteners: boolean | { areaSqFt: number } | undefined;
		if (room.repairs.fasteners === 'room') fasteners = true;
		if (room.repairs.fasteners === 'area') {
			const areaSqFt = r.number(
				room.repairs.fastenerArea,
				`${at}.repairs.fastenerArea`,
				'area with fasteners (ft²)',
				0.01,
				100000
			);
			fasteners = areaSqFt ? { areaSqFt } : undefined;
		}

		const flatness = room.readings.flatness.map((f, j) => {
			const spanIn = r.positive(
				f.span,
				`${at}.readings.flatness.${j}.span`,
				'straightedge length',
				'room'
			);
			const gapIn = r.length(f.gap, `${at}.readings.flatness.${j}.gap`, 'gap', 'small');
			return spanIn && gapIn !== undefined ? { spanIn, gapIn } : undefined;
		});
		const rhPct = room.readings.rh.map((v, j) =>
			r.number(v, `${at}.readings.rh.${j}`, 'RH', 0, 100)
		);
		const calciumChloride = room.readings.calciumChloride.map((t, j) => {
			const p = `${at}.readings.calciumChloride.${j}`;
			const gainGrams = r.number(t.gain, `${p}.gain`, 'weight gain (g)', 0, 1000);
			const areaSqFt = r.number(t.area, `${p}.area`, 'area under the dome (ft²)', 0.01, 100);
			const hours = r.number(t.hours, `${p}.hours`, 'hours', 1, 1000);
			return gainGrams !== undefined && areaSqFt && hours
				? { gainGrams, areaSqFt, hours }
				: undefined;
		});
		const woodSub = room.readings.woodSubfloor.map((v, j) =>
			r.number(v, `${at}.readings.woodSubfloor.${j}`, 'moisture content', 0, 100)
		);
		const woodFloor = room.readings.woodFlooring.map((v, j) =>
			r.number(v, `${at}.readings.woodFlooring.${j}`, 'moisture content', 0, 100)
		);

		let joists: RoomMeasure['joists'];
		if (room.joists) {
			const spacingIn = r.positive(
				room.joists.spacing,
				`${at}.joists.spacing`,
				'joist spacing',
				'small'
			);
			const spanIn = r.positive(room.joists.span, `${at}.joists.span`, 'joist span', 'room');
			const ei = room.joists.iJoist
				? r.number(
						room.joists.ei ?? '',
						`${at}.joists.ei`,
						'EI (millions of lb·in²)',
						1,
						100_000,
						true
					)
				: undefined;
			if (spacingIn && spanIn)
				joists = {
					size: room.joists.size,
					species: room.joists.species,
					spacingIn,
					spanIn,
					...(room.joists.iJoist ? { iJoist: ei ? { eiLbIn2: ei * 1e6 } : {} } : {})
				};
		}

		const ins = room.install ?? structuredClone(INSTALL_DEFAULT);
		const count = (
			value: string,
			key: 'appliances' | 'toilets' | 'stairs',
			label: string,
			max: number
		) => r.number(value, `${at}.install.${key}`, label, 0, max, true, true);
		const appliances = count(ins.appliances, 'appliances', 'number of appliances', 20);
		const toilets = count(ins.toilets, 'toilets', 'number of toilets', 20);
		const stairs = count(ins.stairs, 'stairs', 'number of steps', 100);
		const slabThicknessIn = r.positive(
			ins.slabThickness,
			`${at}.install.slabThickness`,
			'slab thickness',
			'small',
			true
		);
		if (slabThicknessIn !== undefined && slabThicknessIn > LIMITS.depthIn)
			r.fail(
				`${at}.install.slabThickness`,
				`The slab thickness can be at most ${LIMITS.depthIn} in`
			);
		const doorways = ins.doorways.map((d, j) => {
			const p = `${at}.install.doorways.${j}`;
			const widthIn = r.positive(d.width, `${p}.width`, 'doorway width', 'small');
			const nextFloorIn = r.length(
				d.nextFloor,
				`${p}.nextFloor`,
				"next room's floor height",
				'small',
				true
			);
			if (nextFloorIn !== undefined && nextFloorIn > LIMITS.depthIn)
				r.fail(
					`${p}.nextFloor`,
					`The next room's floor height can be at most ${LIMITS.depthIn} in`
				);
			return widthIn
				? {
						widthIn,
						...(d.door ? { door: true } : {}),
						...(nextFloorIn !== undefined ? { nextFloorIn } : {})
					}
				: undefined;
		});
		const concrete = room.subfloor.kind === 'concrete';
		const slabId = ins.slabId.trim();

		if (r.errors.length > before || !shape) return;
		const defined = <T>(xs: (T | undefined)[]) => xs as T[];
		const base = {
			...(ins.baseboard !== 'none' ? { baseboard: ins.baseboard } : {}),
			...(ins.shoe !== 'none' ? { shoe: ins.shoe } : {})
		};
		rooms.push({
			id: room.id,
			name,
			shape,
			...(cutouts.length ? { cutouts } : {}),
			...(room.floor.productId
				? {
						floor: {
							productId: room.floor.productId,
							layout: room.floor.layout,
							...(ins.rollDirection !== 'auto' ? { rollDirection: ins.rollDirection } : {}),
							...(ins.light && ins.light !== 'unknown' ? { light: ins.light } : {})
						}
					}
				: {}),
			...(room.remove.length ? { remove: room.remove } : {}),
			subfloor: {
				kind: room.subfloor.kind,
				...(thicknessIn ? { thicknessIn } : {}),
				...(room.subfloor.spanRating.trim() ? { spanRating: room.subfloor.spanRating.trim() } : {}),
				...(!concrete && ins.layers === '2' ? { layers: 2 } : {}),
				...(concrete && (slabId || slabThicknessIn)
					? {
							slab: {
								...(slabId ? { id: slabId } : {}),
								...(slabThicknessIn ? { thicknessIn: slabThicknessIn } : {}),
								drying: ins.slabDrying
							}
						}
					: {})
			},
			...(room.underlayment !== 'auto' ? { underlayment: room.underlayment === 'yes' } : {}),
			...(room.trim ? { trim: true } : {}),
			...(transitions ? { transitions } : {}),
			...(doorways.length ? { doorways: defined(doorways) } : {}),
			...(Object.keys(base).length ? { base } : {}),
			...(ins.furniture ? { furniture: true } : {}),
			...(appliances ? { appliances } : {}),
			...(toilets ? { toilets } : {}),
			...(stairs ? { stairs } : {}),
			repairs: {
				holes: defined(holes),
				seams: defined(seams),
				dents: defined(dents),
				...(fasteners !== undefined ? { fasteners } : {})
			},
			...(joists ? { joists } : {}),
			readings: {
				flatness: defined(flatness),
				rhPct: defined(rhPct),
				calciumChloride: defined(calciumChloride),
				...(woodSub.length || woodFloor.length
					? { woodMc: { subfloorPct: defined(woodSub), flooringPct: defined(woodFloor) } }
					: {})
			}
		});
	});

	return { job: { ...(builtYear ? { builtYear } : {}), rooms }, errors: reader.errors };
}
