/** How the measure's numbers read on screen, in the store's unit system. */
import { formatArea, formatLength, type AreaUnit, type StoreSettings } from '$lib/estimating';
import { readLength } from '$lib/input';
import { draftUnits } from './draft';

type Units = Pick<StoreSettings, 'units'>;

export function areaUnit(settings: Units): AreaUnit {
	return settings.units.system === 'metric' ? 'sqm' : 'sqft';
}

/** An area held in ft², as the store reads areas: whole ft² (ANSI Z765 reports to the foot), or m² to 2 places. */
export function areaText(sqFt: number, settings: Units): string {
	const unit = areaUnit(settings);
	return formatArea(sqFt, unit, unit === 'sqft' ? 0 : 2);
}

/** A length in words, e.g. `12 ft 6 1/2 in`, `4 1/2 in`, `3.81 m`, `12 mm`. */
export function lengthText(inches: number, settings: Units, size: 'room' | 'small'): string {
	if (settings.units.system === 'metric')
		return size === 'room' ? formatLength(inches, 'm') : formatLength(inches, 'mm', { digits: 1 });
	const typed = formatLength(inches, size === 'room' ? 'ft-in' : 'in', { denominator: 16 });
	return typed
		.replace(/'/g, ' ft')
		.replace(/"/g, ' in')
		.replace(/ ft 0 in$/, ' ft');
}

/**
 * What a typed length reads as, for the line under its field: the reading when the engine can
 * read it, undefined while it is empty or cannot be read (the field then shows the message).
 */
export function readingOf(value: string, settings: Units, size: 'room' | 'small') {
	if (!value.trim()) return undefined;
	const r = readLength(value, draftUnits(settings)[size]);
	return r.ok ? lengthText(r.value, settings, size) : undefined;
}

/** Money for display: the one formatter, which knows each currency's minor unit. */
export { formatMoney as money } from '$lib/format';

/** A save time in the store's zone: `10:42 AM` today, else `Mar 3, 10:42 AM`. */
export { formatSaved as savedTime } from '$lib/format';

/** A time as ISO text (what JSON carries), or null. */
export function isoTime(when: Date | string | null | undefined): string | null {
	return when ? new Date(when).toISOString() : null;
}
