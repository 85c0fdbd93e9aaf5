import type { Basis } from '$lib/estimating';

const moneyFormats = new Map<string, Intl.NumberFormat>();

/**
 * Integer cents (the currency's smallest unit) as money for display. Intl knows each currency's
 * minor digits, so zero-decimal currencies (JPY) show whole units: 1500 JPY is ¥1,500.
 */
export function formatMoney(minor: number, currency = 'USD'): string {
	return moneyFormat(currency).format(minor / 10 ** minorDigits(currency));
}

/** How many decimals a currency's amounts have (USD 2, JPY 0), as Intl knows them. */
export function minorDigits(currency: string): number {
	return moneyFormat(currency).resolvedOptions().maximumFractionDigits ?? 2;
}

function moneyFormat(currency: string): Intl.NumberFormat {
	let format = moneyFormats.get(currency);
	if (!format) {
		format = new Intl.NumberFormat('en-US', { style: 'currency', currency });
		moneyFormats.set(currency, format);
	}
	return format;
}

/** An amount in the smallest unit as plain decimal text for files: 123456 USD → `1234.56`, 1500 JPY → `1500`. */
export function majorText(minor: number, currency: string): string {
	const digits = minorDigits(currency);
	return (minor / 10 ** digits).toFixed(digits);
}

const UNITS: Record<Basis, [string, string]> = {
	each: ['each', 'each'],
	sqft: ['ft²', 'ft²'],
	linft: ['lin ft', 'lin ft'],
	sqft_per_eighth_in: ['ft² per ⅛ in', 'ft² per ⅛ in'],
	hour: ['hour', 'hours'],
	room: ['room', 'rooms'],
	carton: ['carton', 'cartons'],
	roll_sqyd: ['yd²', 'yd²'],
	roll_linft: ['lin ft', 'lin ft'],
	panel: ['panel', 'panels'],
	box: ['box', 'boxes'],
	bag: ['bag', 'bags'],
	container: ['pail', 'pails']
};

/** A quantity with its unit: "14 cartons", "126.5 ft²". */
export function formatQty(qty: number, basis: Basis): string {
	const [one, many] = UNITS[basis];
	const n = Number.isInteger(qty)
		? String(qty)
		: qty.toLocaleString('en-US', { maximumFractionDigits: 2 });
	return `${n} ${qty === 1 ? one : many}`;
}

/** The unit a price is per: "per carton", "per ft²". */
export function perUnit(basis: Basis): string {
	return `per ${UNITS[basis][0]}`;
}

const dateFormats = new Map<string, Intl.DateTimeFormat>();

function dateFormat(timeZone: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
	const key = `${timeZone}|${JSON.stringify(options)}`;
	let format = dateFormats.get(key);
	if (!format) {
		format = new Intl.DateTimeFormat('en-US', { ...options, timeZone });
		dateFormats.set(key, format);
	}
	return format;
}

/**
 * The one date formatter: a day in the store's time zone (`formatDate(at, store.timeZone)`), the
 * same on the server, in the browser, in e-mails and in PDFs.
 */
export function formatDate(
	value: Date | string,
	timeZone: string,
	style: 'medium' | 'long' = 'medium'
): string {
	return dateFormat(timeZone, { dateStyle: style }).format(new Date(value));
}

/** A day and time in the store's time zone: "Mar 4, 2027, 2:30 PM". */
export function formatDateTime(
	value: Date | string,
	timeZone: string,
	style: 'medium' | 'long' = 'medium'
): string {
	return dateFormat(timeZone, { dateStyle: style, timeStyle: 'short' }).format(new Date(value));
}

/** The zone's short name at that moment ("CST", "GMT+1"), to print beside a time in e-mails. */
export function zoneName(value: Date | string, timeZone: string): string {
	return (
		dateFormat(timeZone, { timeZoneName: 'short' })
			.formatToParts(new Date(value))
			.find((p) => p.type === 'timeZoneName')?.value ?? timeZone
	);
}

/** A time of day in the store's zone, with the day when it is not today there: `10:42 AM`, `Mar 3, 10:42 AM`. */
export function formatSaved(when: Date | string, timeZone: string, now = new Date()): string {
	const d = new Date(when);
	const day = dateFormat(timeZone, { dateStyle: 'medium' });
	const time = dateFormat(timeZone, { hour: 'numeric', minute: '2-digit' }).format(d);
	if (day.format(d) === day.format(now)) return time;
	return `${dateFormat(timeZone, { month: 'short', day: 'numeric' }).format(d)}, ${time}`;
}

/** Parts of a place or a name joined with commas, leaving out the empty ones (no stray commas). */
export function joinParts(...parts: (string | null | undefined)[]): string {
	return parts
		.map((p) => p?.trim() ?? '')
		.filter(Boolean)
		.join(', ');
}

/** How each basis reads after a price: "$1.25 per ft²". */
export const BASIS_LABELS: Record<Basis, string> = {
	each: 'each',
	sqft: 'per ft²',
	linft: 'per linear ft',
	sqft_per_eighth_in: 'per ft² for each 1/8 in of depth',
	hour: 'per hour',
	room: 'per room',
	carton: 'per carton',
	roll_sqyd: 'per yd² of roll',
	roll_linft: 'per linear ft of roll',
	panel: 'per panel',
	box: 'per box',
	bag: 'per bag',
	container: 'per container'
};
