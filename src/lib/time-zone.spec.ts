import { describe, expect, it } from 'vitest';
import { createStoreSchema, storeProfileSchema } from './schemas/store';
import { isTimeZone, TIME_ZONES, timeZoneOr, timeZoneSchema } from './time-zone';

describe('the store\u2019s time zone', () => {
	it('is one of the IANA zones the runtime knows, or UTC', () => {
		expect(TIME_ZONES[0]).toBe('UTC');
		expect(TIME_ZONES).toContain('America/Chicago');
		expect(TIME_ZONES.length).toBe(new Set(TIME_ZONES).size);
		for (const zone of Intl.supportedValuesOf('timeZone')) expect(isTimeZone(zone)).toBe(true);
		for (const bad of [
			'',
			'Mars/Olympus',
			'america/chicago ',
			'__proto__',
			'constructor',
			5,
			null
		]) {
			expect(isTimeZone(bad), String(bad)).toBe(false);
		}
	});

	it('falls back to UTC where nothing usable is stored', () => {
		expect(timeZoneOr('Europe/Dublin')).toBe('Europe/Dublin');
		expect(timeZoneOr(null)).toBe('UTC');
		expect(timeZoneOr('Nowhere/Special')).toBe('UTC');
	});

	it('is refused with a message when typed wrong in settings', () => {
		const result = timeZoneSchema.safeParse('Mars/Olympus');
		expect(result.success).toBe(false);
		expect(result.error?.issues[0].message).toMatch(/Choose a time zone from the list/);
		const profile = storeProfileSchema.safeParse({ name: 'Tallow Creek Floors', timeZone: '' });
		expect(profile.error?.issues[0].path).toEqual(['timeZone']);
	});

	it('starts, for a new store, as the browser\u2019s zone or UTC', () => {
		expect(createStoreSchema.parse({ name: 'A', timeZone: 'Pacific/Auckland' }).timeZone).toBe(
			'Pacific/Auckland'
		);
		expect(createStoreSchema.parse({ name: 'A' }).timeZone).toBe('UTC');
		expect(createStoreSchema.parse({ name: 'A', timeZone: 'Not/AZone' }).timeZone).toBe('UTC');
	});
});
