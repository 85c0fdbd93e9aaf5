import { createEvent, type DateArray } from 'ics';
import { addDays } from '$lib/schedule/days';

export interface CalendarBooking {
	/** The booking's id: the event's UID, the same for every update and the cancellation. */
	id: string;
	/** The booking's version: the event's SEQUENCE, so a later file replaces an earlier one. */
	version: number;
	startsOn: string;
	days: number;
	title: string;
	description: string;
	location: string;
	storeName: string;
	cancelled?: boolean;
}

const dayArray = (day: string): DateArray => [
	+day.slice(0, 4),
	+day.slice(5, 7),
	+day.slice(8, 10)
];

/**
 * The calendar file (RFC 5545, made with `ics`) for a booking: one all-day event over its days
 * (DTEND is the day after the last, as the standard has it for dates), `METHOD:REQUEST` for a
 * booking or a move, `METHOD:CANCEL` with `STATUS:CANCELLED` once it is cancelled.
 */
export function bookingCalendar(b: CalendarBooking): string {
	const { error, value } = createEvent({
		uid: b.id,
		sequence: b.version,
		method: b.cancelled ? 'CANCEL' : 'REQUEST',
		status: b.cancelled ? 'CANCELLED' : 'CONFIRMED',
		start: dayArray(b.startsOn),
		end: dayArray(addDays(b.startsOn, b.days)),
		title: b.title,
		description: b.description,
		location: b.location || undefined,
		productId: 'flushline/schedule',
		calName: b.storeName,
		busyStatus: b.cancelled ? 'FREE' : 'BUSY'
	});
	if (error || !value) throw error ?? new Error('No calendar file made');
	return value;
}
