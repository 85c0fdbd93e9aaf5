import { describe, expect, it } from 'vitest';
import {
	addDays,
	bookingWarnings,
	dayRange,
	daysBetween,
	isDay,
	monthLength,
	today,
	weekStart,
	weekday
} from './days';

describe('calendar days', () => {
	it('walks across months, years and leap days', () => {
		expect(addDays('2026-12-30', 3)).toBe('2027-01-02');
		expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
		expect(addDays('2027-03-01', -1)).toBe('2027-02-28');
		expect(daysBetween('2026-12-30', '2027-01-02')).toBe(3);
		expect(dayRange('2026-12-31', 2)).toEqual(['2026-12-31', '2027-01-01']);
	});

	it('numbers weekdays Monday 1 to Sunday 7 and finds the week’s Monday', () => {
		// 2026-12-02 is a Wednesday.
		expect(weekday('2026-12-02')).toBe(3);
		expect(weekday('2026-12-06')).toBe(7);
		expect(weekStart('2026-12-06')).toBe('2026-11-30');
		expect(monthLength('2028-02-10')).toBe(29);
	});

	it('refuses days that do not exist', () => {
		expect(isDay('2026-02-30')).toBe(false);
		expect(isDay('2026-2-3')).toBe(false);
		expect(isDay('2026-02-28')).toBe(true);
	});

	it('gives today in the store’s zone, not the server’s', () => {
		const at = new Date('2026-12-02T03:00:00Z');
		expect(today('America/Chicago', at)).toBe('2026-12-01');
		expect(today('Europe/Berlin', at)).toBe('2026-12-02');
	});
});

describe('bookingWarnings', () => {
	const facts = {
		others: [{ startsOn: '2026-12-14', days: 2, jobLabel: 'J-1004' }],
		daysOff: [7],
		timeOff: [{ startsOn: '2026-12-18', endsOn: '2026-12-18', note: 'Course' }]
	};

	it('warns of a second booking on a day, a weekday off and time away', () => {
		// Tue 15th (J-1004's second day) to Sun 20th.
		const w = bookingWarnings({ startsOn: '2026-12-15', days: 6 }, facts);
		expect(w).toEqual([
			{ kind: 'double', day: '2026-12-15', jobLabel: 'J-1004' },
			{ kind: 'away', day: '2026-12-18', note: 'Course' },
			{ kind: 'day_off', day: '2026-12-20' }
		]);
	});

	it('says nothing for free days', () => {
		expect(bookingWarnings({ startsOn: '2026-12-16', days: 2 }, facts)).toEqual([]);
	});
});
