/**
 * Two people saved the same measure: compare their input room by room, so the later one sees
 * what differs, and merge by choosing a side for each room. Nothing is merged silently.
 */
import type { FloorKind } from '$lib/estimating';
import type { MeasureDraft, RoomDraft } from './draft';
import {
	EXISTING_FLOOR_LABELS,
	FLOOR_KIND_LABELS,
	LAYOUT_LABELS,
	SPECIES_LABELS,
	SUBFLOOR_LABELS
} from './labels';
import { sameDraft } from './local';

export type Side = 'theirs' | 'mine';

/** A floor of the price book, as the editor knows it. */
export interface FloorChoice {
	id: string;
	name: string;
	kind: FloorKind;
}

export interface Row {
	key: string;
	label: string;
	value: string;
}

const list = (xs: string[]) => (xs.length ? xs.join('; ') : 'none');
const size = (w: string, l: string) => `${w || '?'} × ${l || '?'}`;

/** A room's input as labelled lines of text, as it was typed. */
export function roomRows(room: RoomDraft, floors: readonly FloorChoice[] = []): Row[] {
	const s = room.shape;
	const shape =
		s.kind === 'rect'
			? `rectangle ${size(s.width, s.length)}`
			: s.kind === 'rects'
				? `rectangles: ${list(s.rects.map((r) => `${size(r.width, r.length)} at ${r.x || '0'} across, ${r.y || '0'} up`))}`
				: `sides: ${list(s.sides.map((x) => `${x.length || '?'} then ${x.turn || '?'}`))}`;
	const floor = floors.find((f) => f.id === room.floor.productId);
	const r = room.repairs;
	const g = room.readings;
	const fasteners =
		r.fasteners === 'none'
			? 'none'
			: r.fasteners === 'room'
				? 'the whole room'
				: `${r.fastenerArea || '?'} ft²`;
	const rows: Row[] = [
		{ key: 'name', label: 'Name', value: room.name || '(no name)' },
		{ key: 'shape', label: 'Shape', value: shape },
		{
			key: 'cutouts',
			label: 'Cut-outs',
			value: list(
				room.cutouts.map(
					(c) => `${c.name || 'cut-out'} ${size(c.width, c.length)} at ${c.x || '0'}, ${c.y || '0'}`
				)
			)
		},
		{
			key: 'floor',
			label: 'New floor',
			value: room.floor.productId
				? `${floor ? `${floor.name} (${FLOOR_KIND_LABELS[floor.kind]})` : 'a floor no longer in the price book'}, ${LAYOUT_LABELS[room.floor.layout].toLowerCase()}`
				: 'not chosen'
		},
		{
			key: 'remove',
			label: 'Floors to remove',
			value: list(room.remove.map((k) => EXISTING_FLOOR_LABELS[k]))
		},
		{
			key: 'subfloor',
			label: 'Subfloor',
			value: [
				SUBFLOOR_LABELS[room.subfloor.kind],
				room.subfloor.thickness,
				room.subfloor.spanRating && `rated ${room.subfloor.spanRating}`
			]
				.filter(Boolean)
				.join(', ')
		},
		{ key: 'underlayment', label: 'New underlayment', value: room.underlayment },
		{
			key: 'finish',
			label: 'Trim and transitions',
			value: `${room.trim ? 'trim' : 'no trim'}, ${room.transitions || '0'} transitions`
		},
		{ key: 'holes', label: 'Holes', value: list(r.holes.map((h) => size(h.width, h.length))) },
		{
			key: 'seams',
			label: 'Open seams',
			value: list(
				r.seams.map(
					(v) => `${v.length || '?'} long, ${v.width || '?'} wide, ${v.depth || '?'} deep`
				)
			)
		},
		{
			key: 'dents',
			label: 'Dents and voids',
			value: list(r.dents.map((v) => `${size(v.length, v.width)}, ${v.depth || '?'} deep`))
		},
		{ key: 'fasteners', label: 'Leftover fasteners', value: fasteners },
		{
			key: 'flatness',
			label: 'Straightedge readings',
			value: list(g.flatness.map((f) => `${f.gap || '?'} under ${f.span || '?'}`))
		},
		{ key: 'rh', label: 'Concrete RH', value: list(g.rh.map((v) => `${v}%`)) },
		{
			key: 'calciumChloride',
			label: 'Calcium chloride tests',
			value: list(g.calciumChloride.map((t) => `${t.gain} g on ${t.area} ft² in ${t.hours} h`))
		},
		{
			key: 'wood',
			label: 'Wood moisture',
			value: `subfloor ${list(g.woodSubfloor.map((v) => `${v}%`))}; flooring ${list(g.woodFlooring.map((v) => `${v}%`))}`
		},
		{
			key: 'joists',
			label: 'Joists',
			value: room.joists
				? `${room.joists.size} ${SPECIES_LABELS[room.joists.species]}, ${room.joists.spacing || '?'} apart, ${room.joists.span || '?'} span`
				: 'not measured'
		},
		{ key: 'notes', label: 'Notes', value: room.notes || 'none' }
	];
	return rows;
}

export interface Difference {
	label: string;
	theirs: string;
	mine: string;
}

export interface RoomComparison {
	id: string;
	/** The room's name on the side that has it (mine first). */
	name: string;
	theirs?: RoomDraft;
	mine?: RoomDraft;
	status: 'same' | 'changed' | 'only-theirs' | 'only-mine';
	/** The lines that differ; for a room on one side only, all of its lines. */
	differences: Difference[];
	/** The side to keep unless the user says otherwise: the one that changed since the base. */
	suggested: Side;
}

export interface MeasureComparison {
	builtYear: { theirs: string; mine: string; suggested: Side } | null;
	rooms: RoomComparison[];
	/** Rooms that differ. */
	changed: number;
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/**
 * Theirs (saved on the server) against mine (on this device), room by room by id. `base` is
 * what both started from, when known: a side that left a room as it was gives way to the side
 * that changed it (or removed or added it).
 */
export function compareMeasures(
	theirs: MeasureDraft,
	mine: MeasureDraft,
	base?: MeasureDraft,
	floors: readonly FloorChoice[] = []
): MeasureComparison {
	const byId = (d: MeasureDraft | undefined) => new Map(d?.rooms.map((r) => [r.id, r]) ?? []);
	const t = byId(theirs);
	const m = byId(mine);
	const b = byId(base);
	const ids = [...mine.rooms.map((r) => r.id), ...theirs.rooms.map((r) => r.id)].filter(
		(id, i, all) => all.indexOf(id) === i
	);
	const rooms = ids.map((id): RoomComparison => {
		const a = t.get(id);
		const c = m.get(id);
		const was = b.get(id);
		const name = (c ?? a)!.name || 'Unnamed room';
		if (a && c) {
			const rowsA = roomRows(a, floors);
			const rowsC = roomRows(c, floors);
			const differences = rowsA
				.map((row, i) => ({ label: row.label, theirs: row.value, mine: rowsC[i].value }))
				.filter((d) => d.theirs !== d.mine);
			const identical = same(a, c);
			return {
				id,
				name,
				theirs: a,
				mine: c,
				status: identical ? 'same' : 'changed',
				differences: identical ? [] : differences,
				// Both changed it, or it is new on both: mine, as I am the one looking.
				suggested: was && !same(was, a) && same(was, c) ? 'theirs' : 'mine'
			};
		}
		if (a) {
			// Only theirs: I removed it (it was in the base, unchanged by them), or they added it.
			const iRemoved = !!was && same(was, a);
			return {
				id,
				name,
				theirs: a,
				status: 'only-theirs',
				differences: roomRows(a, floors).map((r) => ({
					label: r.label,
					theirs: r.value,
					mine: '—'
				})),
				suggested: iRemoved ? 'mine' : 'theirs'
			};
		}
		const theyRemoved = !!was && same(was, c);
		return {
			id,
			name,
			mine: c,
			status: 'only-mine',
			differences: roomRows(c!, floors).map((r) => ({
				label: r.label,
				theirs: '—',
				mine: r.value
			})),
			suggested: theyRemoved ? 'theirs' : 'mine'
		};
	});
	const builtYear =
		theirs.builtYear === mine.builtYear
			? null
			: {
					theirs: theirs.builtYear,
					mine: mine.builtYear,
					suggested: (base && base.builtYear === mine.builtYear ? 'theirs' : 'mine') as Side
				};
	return { builtYear, rooms, changed: rooms.filter((r) => r.status !== 'same').length };
}

/** The side each room and the year take: what the comparison suggests, or one side for all. */
export function picksFor(
	c: MeasureComparison,
	all?: Side
): { rooms: Record<string, Side>; builtYear: Side } {
	return {
		rooms: Object.fromEntries(c.rooms.map((r) => [r.id, all ?? r.suggested])),
		builtYear: all ?? c.builtYear?.suggested ?? 'theirs'
	};
}

/**
 * The merged measure: each room from the side picked (a room picked from a side that does not
 * have it is left out). Rooms keep their order on the server; my new rooms follow the room they
 * followed on this device.
 */
export function mergeMeasures(
	theirs: MeasureDraft,
	mine: MeasureDraft,
	picks: { rooms: Record<string, Side>; builtYear: Side }
): MeasureDraft {
	const fromMine = new Map(mine.rooms.map((r) => [r.id, r]));
	const inTheirs = new Set(theirs.rooms.map((r) => r.id));
	const pick = (id: string) => picks.rooms[id] ?? 'mine';
	const rooms: RoomDraft[] = [];
	for (const room of theirs.rooms) {
		if (pick(room.id) === 'theirs') rooms.push(room);
		else if (fromMine.has(room.id)) rooms.push(fromMine.get(room.id)!);
	}
	mine.rooms.forEach((room, i) => {
		if (inTheirs.has(room.id) || pick(room.id) !== 'mine') return;
		let at = 0;
		for (let j = i - 1; j >= 0; j--) {
			const k = rooms.findIndex((r) => r.id === mine.rooms[j].id);
			if (k >= 0) {
				at = k + 1;
				break;
			}
		}
		rooms.splice(at, 0, room);
	});
	const merged: MeasureDraft = {
		builtYear: picks.builtYear === 'mine' ? mine.builtYear : theirs.builtYear,
		rooms
	};
	return JSON.parse(JSON.stringify(merged));
}

/** Whether merging changes anything on top of theirs (if not, there is nothing to save). */
export function changesTheirs(theirs: MeasureDraft, merged: MeasureDraft) {
	return !sameDraft(theirs, merged);
}
