import { roomOutline, type Outline } from '$lib/estimating';
import { roomOutlineOf } from '$lib/measure/check';
import { areaText, lengthText } from '$lib/measure/format';
import { summarize } from '$lib/measure/summary';
import * as measures from '../db/queries/measures';
import * as tradeSettings from '../db/queries/settings';
import type { StoreTx } from '../db/tenant';

/** One measured room as the job page draws it: to scale, every outer wall labelled. */
export interface RoomSketch {
	id: string;
	name: string;
	/** "140 ft²", or null while its sizes cannot be read. */
	area: string | null;
	/** "12 ft by 10 ft" overall, for the drawing's title. */
	size: string | null;
	outline?: Outline;
}

/** The most rooms drawn on the job page; a measure may hold more (the measure page has them all). */
const DRAWN_ROOMS = 24;

/**
 * The job's measure in a line (rooms, floor area, last save) with each room's outline to draw,
 * or null when nothing was measured. With the store's settings not valid it says so
 * (`settingsInvalid`) instead of a summary.
 */
export async function measureSummary(tx: StoreTx, jobId: string) {
	const stored = await measures.read(tx, jobId);
	if (!stored) return null;
	const checked = await tradeSettings.readChecked(tx);
	if (!checked.ok) return { settingsInvalid: true as const };
	const settings = checked.trade.settings;
	const summary = summarize(stored.draft, settings);
	const sketches: RoomSketch[] = stored.draft.rooms.slice(0, DRAWN_ROOMS).map((room, i) => {
		const name = room.name.trim() || `Room ${i + 1}`;
		const { shape } = roomOutlineOf(room, settings);
		if (!shape) return { id: room.id, name, area: null, size: null };
		const outline = roomOutline(shape);
		return {
			id: room.id,
			name,
			area: areaText(shape.areaSqFt, settings),
			size: `${lengthText(outline.bbox.widthIn, settings, 'room')} by ${lengthText(outline.bbox.lengthIn, settings, 'room')}`,
			outline
		};
	});
	return {
		...summary,
		area: areaText(summary.areaSqFt, settings),
		metric: settings.units.system === 'metric',
		sketches,
		moreRooms: Math.max(0, stored.draft.rooms.length - DRAWN_ROOMS),
		updatedAt: stored.updatedAt,
		updatedByName: stored.updatedByName
	};
}
