/**
 * Changes to a measure draft that both the editor (in the browser, on its live state) and the
 * form fallback (on the server, without JavaScript) make: the same button sends the same
 * operation either way. Operations are short strings so they travel as a button's value.
 */
import { JOIST_SIZES, SPECIES } from '$lib/estimating';
import { fieldPath, isIndex, own } from '$lib/input';
import { emptyRoom, type MeasureDraft, type RoomDraft, type ShapeDraft } from './draft';

/** The most of each list the draft schema accepts (keep in step with `measureDraftSchema`). */
export const LIST_LIMITS: Record<string, number> = {
	rooms: 200,
	rects: 20,
	sides: 60,
	cutouts: 20,
	remove: 4,
	holes: 50,
	seams: 50,
	dents: 50,
	flatness: 50,
	rh: 50,
	calciumChloride: 20,
	woodSubfloor: 50,
	woodFlooring: 50,
	doorways: 20
};

/** What a new entry of each list starts as. */
const NEW_ENTRY: Record<string, () => unknown> = {
	rects: () => ({ x: '', y: '', width: '', length: '' }),
	sides: () => ({ length: '', turn: 'left' }),
	cutouts: () => ({ name: '', x: '', y: '', width: '', length: '' }),
	remove: () => 'carpet',
	holes: () => ({ width: '', length: '' }),
	seams: () => ({ length: '', width: '', depth: '' }),
	dents: () => ({ length: '', width: '', depth: '' }),
	flatness: () => ({ span: '', gap: '' }),
	rh: () => '',
	calciumChloride: () => ({ gain: '', area: '', hours: '' }),
	woodSubfloor: () => '',
	woodFlooring: () => '',
	doorways: () => ({ width: '', door: false, nextFloor: '' })
};

/** The first field of a new entry, to put the cursor in. */
const FIRST_FIELD: Record<string, string | undefined> = {
	rects: 'width',
	sides: 'length',
	cutouts: 'name',
	holes: 'width',
	seams: 'length',
	dents: 'length',
	flatness: 'span',
	calciumChloride: 'gain',
	doorways: 'width'
};

export interface OpResult {
	/** The room to show after the change. */
	selected?: string;
	/** Path of the field to put the cursor in (`rooms.0.repairs.holes.1.width`). */
	focus?: string;
	/** Why nothing changed, for the user. */
	message?: string;
	/** The room taken out and where it was, so it can be put back. */
	removed?: { room: RoomDraft; index: number };
}

/** A short random id for a new room; works where `crypto.randomUUID` does not (plain http). */
export function newRoomId(): string {
	const c = globalThis.crypto;
	if (c && typeof c.randomUUID === 'function') return c.randomUUID();
	return `r${Date.now().toString(36)}${Math.random().toString(36).slice(2, 10)}`;
}

/** A name no other room of the draft has: `base`, else `base 2`, `base 3`... */
export function freeName(draft: MeasureDraft, base: string): string {
	const taken = new Set(draft.rooms.map((r) => r.name.trim().toLowerCase()));
	if (!taken.has(base.toLowerCase())) return base;
	for (let n = 2; ; n++) {
		const name = `${base} ${n}`;
		if (!taken.has(name.toLowerCase())) return name;
	}
}

/** The value at a dotted path, following only the draft's own keys. */
export function valueAt(root: unknown, path: string): unknown {
	let at: unknown = root;
	for (const key of path.split('.')) {
		if (at === null || typeof at !== 'object') return undefined;
		if (Array.isArray(at)) {
			if (!isIndex(key) || Number(key) >= at.length) return undefined;
			at = at[Number(key)];
		} else {
			if (!Object.hasOwn(at, key)) return undefined;
			at = (at as Record<string, unknown>)[key];
		}
	}
	return at;
}

/** The dimensions a shape has, to carry over when its kind changes. */
function sizesOf(shape: ShapeDraft): { width: string; length: string } {
	if (shape.kind === 'rect') return { width: shape.width, length: shape.length };
	if (shape.kind === 'rects')
		return { width: shape.rects[0]?.width ?? '', length: shape.rects[0]?.length ?? '' };
	return { width: shape.sides[0]?.length ?? '', length: shape.sides[1]?.length ?? '' };
}

/**
 * Changes a room's shape kind, keeping what carries over: a rectangle's sizes become the first
 * of several rectangles, or the four sides of a walk (turning left, so the walk goes round
 * counter-clockwise from the bottom-left corner, as the drawing's +y is up).
 */
export function convertShape(room: RoomDraft, kind: ShapeDraft['kind']): boolean {
	if (room.shape.kind === kind) return false;
	const { width, length } = sizesOf(room.shape);
	if (kind === 'rect') room.shape = { kind, width, length };
	else if (kind === 'rects') room.shape = { kind, rects: [{ x: '', y: '', width, length }] };
	else
		room.shape = {
			kind,
			sides: [
				{ length: width, turn: 'left' },
				{ length: length, turn: 'left' },
				{ length: width, turn: 'left' },
				{ length: length, turn: 'left' }
			]
		};
	return true;
}

function roomIndex(draft: MeasureDraft, id: string) {
	return draft.rooms.findIndex((r) => r.id === id);
}

/**
 * Applies one operation to the draft, in place. Operations:
 * `add-room`, `duplicate-room:<id>`, `remove-room:<id>`, `move-room:<id>:up|down`,
 * `add:<list path>`, `remove:<list path>.<index>`, `shape:<room index>:<kind>`,
 * `joists-on:<room index>`, `joists-off:<room index>`, `select:<id>`.
 * Anything else (or a path that is not a list of the draft) changes nothing.
 */
export function applyOp(draft: MeasureDraft, op: string, newId = newRoomId): OpResult {
	const [verb, ...rest] = op.split(':');
	const arg = rest.join(':');

	if (verb === 'add-room') {
		if (draft.rooms.length >= LIST_LIMITS.rooms)
			return { message: `A measure holds at most ${LIST_LIMITS.rooms} rooms` };
		const room = emptyRoom(newId(), freeName(draft, `Room ${draft.rooms.length + 1}`));
		draft.rooms.push(room);
		return { selected: room.id, focus: `rooms.${draft.rooms.length - 1}.name` };
	}
	if (verb === 'select') {
		return roomIndex(draft, arg) >= 0 ? { selected: arg } : {};
	}
	if (verb === 'duplicate-room') {
		const i = roomIndex(draft, arg);
		if (i < 0) return {};
		if (draft.rooms.length >= LIST_LIMITS.rooms)
			return { message: `A measure holds at most ${LIST_LIMITS.rooms} rooms` };
		const copy: RoomDraft = plain(draft.rooms[i]);
		copy.id = newId();
		copy.name = freeName(draft, `${draft.rooms[i].name.trim() || `Room ${i + 1}`} copy`);
		draft.rooms.splice(i + 1, 0, copy);
		return { selected: copy.id, focus: `rooms.${i + 1}.name` };
	}
	if (verb === 'remove-room' || verb === 'remove-room-now') {
		const i = roomIndex(draft, arg);
		if (i < 0) return {};
		const [room] = draft.rooms.splice(i, 1);
		const next = draft.rooms[Math.min(i, draft.rooms.length - 1)];
		return { selected: next?.id, removed: { room: plain(room), index: i } };
	}
	if (verb === 'move-room') {
		const [id, way] = arg.split(':');
		const i = roomIndex(draft, id);
		const j = way === 'up' ? i - 1 : i + 1;
		if (i < 0 || j < 0 || j >= draft.rooms.length) return {};
		const [room] = draft.rooms.splice(i, 1);
		draft.rooms.splice(j, 0, room);
		return { selected: id };
	}
	if (verb === 'add') {
		const list = valueAt(draft, arg);
		const kind = arg.split('.').pop()!;
		const make = own(NEW_ENTRY, kind);
		const limit = own(LIST_LIMITS, kind) ?? 0;
		if (!Array.isArray(list) || !arg.startsWith('rooms.') || !make) return {};
		if (list.length >= limit) return { message: `At most ${limit} here` };
		list.push(make());
		const at = `${arg}.${list.length - 1}`;
		const first = own(FIRST_FIELD, kind);
		return { focus: first ? `${at}.${first}` : at };
	}
	if (verb === 'remove') {
		const cut = arg.lastIndexOf('.');
		const list = valueAt(draft, arg.slice(0, cut));
		const index = arg.slice(cut + 1);
		if (!Array.isArray(list) || !arg.startsWith('rooms.') || !isIndex(index)) return {};
		if (Number(index) >= list.length) return {};
		list.splice(Number(index), 1);
		return {};
	}
	if (verb === 'shape') {
		const [i, kind] = arg.split(':');
		const room = draft.rooms[Number(i)];
		if (!room || !isIndex(i) || !['rect', 'rects', 'sides'].includes(kind)) return {};
		convertShape(room, kind as ShapeDraft['kind']);
		return {};
	}
	if (verb === 'joists-on' || verb === 'joists-off') {
		const room = isIndex(arg) ? draft.rooms[Number(arg)] : undefined;
		if (!room) return {};
		if (verb === 'joists-off') room.joists = null;
		else if (!room.joists) {
			room.joists = {
				size: JOIST_SIZES[2],
				species: SPECIES[0],
				spacing: '',
				span: '',
				iJoist: false,
				ei: ''
			};
			return { focus: `rooms.${arg}.joists.spacing` };
		}
		return {};
	}
	return {};
}

/**
 * A plain copy of a value that may be a Svelte state proxy (structuredClone refuses proxies).
 * JSON is enough: a draft holds only strings, booleans, null, lists and objects.
 */
function plain<T>(value: T): T {
	return JSON.parse(JSON.stringify(value));
}

/** The last value of a field sent more than once that is not empty (a checkbox after its hidden default). */
function lastFilled(values: string[]): string {
	for (let i = values.length - 1; i >= 0; i--) if (values[i] !== '') return values[i];
	return '';
}

/**
 * Writes posted form fields, named by their path in the draft (`rooms.0.shape.width`), into the
 * draft in place. Only fields the draft already has are written (lists grow through `applyOp`),
 * each as the type it already has; then a shape's kind is changed, carrying the sizes just typed.
 */
export function applyFields(draft: MeasureDraft, entries: Iterable<[string, unknown]>): void {
	const values = new Map<string, string[]>();
	for (const [key, value] of entries) {
		if (typeof value !== 'string') continue;
		if (key !== 'builtYear' && !key.startsWith('rooms.')) continue;
		// A name no draft path can have (`rooms.0.__proto__.x`) is not a field of the measure.
		if (!fieldPath(key).ok) continue;
		values.set(key, [...(values.get(key) ?? []), value]);
	}
	for (const [key, vs] of values) {
		if (key.endsWith('.shape.kind')) continue;
		const cut = key.lastIndexOf('.');
		const parent = cut < 0 ? draft : valueAt(draft, key.slice(0, cut));
		const last = key.slice(cut + 1);
		if (parent === null || typeof parent !== 'object') continue;
		if (
			Array.isArray(parent)
				? !isIndex(last) || Number(last) >= parent.length
				: !Object.hasOwn(parent, last)
		)
			continue;
		const holder = parent as Record<string, unknown>;
		const current = holder[last];
		const value = lastFilled(vs);
		if (typeof current === 'string') holder[last] = value;
		else if (typeof current === 'boolean') holder[last] = value === 'true' || value === 'on';
	}
	for (const [key, vs] of values) {
		const m = /^rooms\.(\d+)\.shape\.kind$/.exec(key);
		const kind = lastFilled(vs);
		if (m && draft.rooms[Number(m[1])] && ['rect', 'rects', 'sides'].includes(kind))
			convertShape(draft.rooms[Number(m[1])], kind as ShapeDraft['kind']);
	}
}

/** The element id of a draft field, from its path (`rooms.0.shape.width` → `m-rooms-0-shape-width`). */
export function fieldId(path: string): string {
	return `m-${path.replace(/\./g, '-')}`;
}
