import type { StoreSettings } from '$lib/estimating';
import { roomOutlineOf } from './check';
import type { MeasureDraft } from './draft';

export interface MeasureSummary {
	rooms: number;
	/** Floor area of the rooms that can be read, ft². */
	areaSqFt: number;
	/** Rooms whose outline cannot be read yet (left out of the area). */
	unreadable: number;
}

/** Rooms and total floor area of a measure, for the job page. */
export function summarize(
	draft: MeasureDraft,
	settings: Pick<StoreSettings, 'units' | 'geometry'>
): MeasureSummary {
	let areaSqFt = 0;
	let unreadable = 0;
	for (const room of draft.rooms) {
		const { shape } = roomOutlineOf(room, settings);
		if (shape) areaSqFt += shape.areaSqFt;
		else unreadable++;
	}
	return { rooms: draft.rooms.length, areaSqFt, unreadable };
}
