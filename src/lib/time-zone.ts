/**
 * The store's time zone: an IANA zone name as the runtime knows them
 * (`Intl.supportedValuesOf('timeZone')`), or UTC. Browser-safe.
 */
import { z } from 'zod';

export const DEFAULT_TIME_ZONE = 'UTC';

/** Every zone a store may choose, UTC first. */
export const TIME_ZONES: readonly string[] = [
	DEFAULT_TIME_ZONE,
	...Intl.supportedValuesOf('timeZone').filter((zone) => zone !== DEFAULT_TIME_ZONE)
];

const known = new Set(TIME_ZONES);

export function isTimeZone(value: unknown): value is string {
	return typeof value === 'string' && known.has(value);
}

/** A stored or sent zone, or UTC when it is missing or not one the runtime knows. */
export function timeZoneOr(value: unknown): string {
	return isTimeZone(value) ? value : DEFAULT_TIME_ZONE;
}

export const timeZoneSchema = z
	.string({ error: 'Choose a time zone' })
	.trim()
	.refine(isTimeZone, 'Choose a time zone from the list, such as America/Chicago');
