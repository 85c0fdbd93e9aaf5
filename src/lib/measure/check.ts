/**
 * Every message about the measure, by the path of the draft field it belongs to, so each field
 * can show its own: what `toEngine` could not read, what the room's outline cannot be, and
 * what the engine refused (no floor chosen, a price missing).
 */
import {
	LimitError,
	roomShape,
	type EstimateError,
	type JobMeasure,
	type StoreSettings
} from '$lib/estimating';
import { readRoomShape, type DraftError, type MeasureDraft, type RoomDraft } from './draft';

export interface MeasureMessages {
	/** The first message for each draft path (`rooms.0.shape.width`). */
	fields: Record<string, string>;
	/** Paths whose message only says the field is empty ("Enter the width"). */
	empty: Set<string>;
	/** Messages of a room that belong to no field of it (a price missing), by room id. */
	rooms: Record<string, string[]>;
	/** Messages about the whole measure or the price book. */
	general: string[];
}

/**
 * The engine's errors (paths into `job.rooms`, which holds only the readable rooms) as paths
 * into the draft, found by room id.
 */
export function draftPathsOf(
	draft: MeasureDraft,
	job: JobMeasure,
	errors: readonly EstimateError[]
): DraftError[] {
	return errors.map((e) => {
		const m = /^job\.rooms\.(\d+)(?:\.(.*))?$/.exec(e.path);
		const index = e.roomId ? draft.rooms.findIndex((r) => r.id === e.roomId) : -1;
		if (!m || index < 0) return { path: e.path, roomId: e.roomId, message: e.message };
		const name = job.rooms[Number(m[1])]?.name;
		const rest = m[2] ?? '';
		const message =
			name && e.message.startsWith(`${name}: `) ? e.message.slice(name.length + 2) : e.message;
		if (rest === 'floor')
			return {
				path: `rooms.${index}.floor.productId`,
				roomId: e.roomId,
				message: 'Choose the new floor'
			};
		if (rest === 'floor.productId')
			return {
				path: `rooms.${index}.floor.productId`,
				roomId: e.roomId,
				message: 'This floor is no longer in the price book: choose another'
			};
		return { path: `rooms.${index}${rest ? `.${rest}` : ''}`, roomId: e.roomId, message };
	});
}

/** The room's outline as typed: undefined with the reason while it cannot be drawn. */
export function roomOutlineOf(
	room: Pick<RoomDraft, 'shape' | 'cutouts'>,
	settings: Pick<StoreSettings, 'units' | 'geometry'>
) {
	const read = readRoomShape(room, settings);
	if (!read.shape) return { errors: read.errors };
	let shape;
	try {
		shape = roomShape(read.shape, read.cutouts, {
			closureToleranceIn: settings.geometry.closureToleranceIn
		});
	} catch (e) {
		// Beyond the engine's limits (a room over 500 ft across): said by the field at fault.
		if (!(e instanceof LimitError)) throw e;
		return { errors: [...read.errors, { path: draftFieldOf(e.path), message: e.message }] };
	}
	if (!shape.ok) return { errors: [...read.errors, { path: shape.field, message: shape.message }] };
	return { shape, errors: read.errors };
}

/** A field of the engine's room shape (`cutouts.0.shape.widthIn`) as the draft's (`cutouts.0.width`). */
function draftFieldOf(path: string): string {
	return path
		.replace(/^cutouts\.(\d+)\.shape\./, 'cutouts.$1.')
		.replace(/(width|length|x|y)In$/, '$1');
}

/**
 * Gathers messages by field: the draft's own (`toEngine`), each room's outline, then the
 * engine's (already as draft paths). The first message of a path wins.
 */
export function collectMessages(
	draft: MeasureDraft,
	sources: {
		draft: readonly DraftError[];
		outlines?: readonly DraftError[];
		engine?: readonly DraftError[];
	}
): MeasureMessages {
	const out: MeasureMessages = { fields: {}, empty: new Set(), rooms: {}, general: [] };
	const fieldPath = (path: string) => path === 'builtYear' || /^rooms\.\d+\./.test(path);
	for (const e of [...sources.draft, ...(sources.outlines ?? []), ...(sources.engine ?? [])]) {
		if (fieldPath(e.path)) {
			if (out.fields[e.path]) continue;
			out.fields[e.path] = e.message;
			if (/^Enter the /.test(e.message)) out.empty.add(e.path);
		} else if (e.roomId) {
			const list = (out.rooms[e.roomId] ??= []);
			if (!list.includes(e.message)) list.push(e.message);
		} else if (!out.general.includes(e.message)) out.general.push(e.message);
	}
	return out;
}

/** How many messages a room has (fields and others), for the list of rooms. */
export function countForRoom(messages: MeasureMessages, index: number, roomId: string): number {
	const prefix = `rooms.${index}.`;
	return (
		Object.keys(messages.fields).filter((p) => p.startsWith(prefix) && !messages.empty.has(p))
			.length + (messages.rooms[roomId]?.length ?? 0)
	);
}
