/**
 * Rooms ready for a step, for the steps' specs: the sample price book and the default settings
 * unless a spec passes its own.
 */
import { roomShape } from '../geometry';
import type { PriceBook } from '../pricing';
import { samplePriceBook } from '../sample';
import { defaultSettings, type StoreSettings } from '../settings';
import type { RoomMeasure } from '../types';
import { roomContext, type RoomContext } from './room';

/** A 12 × 10 ft plank room over 5/8 in plywood, to vary per spec. */
export const plankRoom: RoomMeasure = {
	id: 'bed',
	name: 'Bedroom',
	shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
	floor: { productId: 'lvp-grey', layout: 'straight' },
	subfloor: { kind: 'plywood', thicknessIn: 0.625 }
};

/** The context a step gets for `room` (throws on a shape or floor the spec got wrong). */
export function contextFor(
	room: RoomMeasure,
	options: { settings?: StoreSettings; priceBook?: PriceBook; builtYear?: number } = {}
): RoomContext {
	const settings = options.settings ?? defaultSettings;
	const book = options.priceBook ?? samplePriceBook;
	const shape = roomShape(room.shape, room.cutouts);
	if (!shape.ok) throw new Error(shape.message);
	const k = book.floors.findIndex((f) => f.id === room.floor?.productId);
	if (k < 0) throw new Error(`No floor ${room.floor?.productId}`);
	return roomContext(room, 0, shape, book.floors[k], k, settings, options.builtYear);
}
