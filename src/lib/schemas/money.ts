/**
 * Money as people type it and as we show it. Stored and computed as integer cents everywhere;
 * dollars appear only in form fields and on screen. Browser-safe.
 */

export type ParseMoneyResult = { ok: true; cents: number } | { ok: false; message: string };

/** The most a single price-book unit may cost: $1,000,000.00. */
const MAX_CENTS = 100_000_000;

/**
 * Reads an amount typed in dollars: `12.50`, `$12.50`, `1,250`, `.5`. Never negative, at most two
 * decimals (a cent), at most $1,000,000. An empty field is `Enter a price`.
 */
export function parseMoney(text: string): ParseMoneyResult {
	const s = text
		.trim()
		.replace(/^\$\s*/, '')
		.replace(/,(?=\d{3}(\D|$))/g, '');
	if (s === '') return { ok: false, message: 'Enter a price' };
	if (s.startsWith('-')) return { ok: false, message: 'A price cannot be negative' };
	const m = /^(\d*)(?:\.(\d*))?$/.exec(s);
	if (!m || (m[1] === '' && !m[2])) {
		return {
			ok: false,
			message: `Cannot read "${text.trim()}": type dollars and cents, e.g. 12.50`
		};
	}
	const decimals = m[2] ?? '';
	if (decimals.length > 2) {
		return { ok: false, message: 'Use at most two decimals (whole cents), e.g. 12.50' };
	}
	const cents = Number(m[1] || '0') * 100 + Number(decimals.padEnd(2, '0'));
	if (!Number.isSafeInteger(cents) || cents > MAX_CENTS) {
		return { ok: false, message: 'Keep a price under $1,000,000' };
	}
	return { ok: true, cents };
}

/** Cents as a form field shows them: `1250` → `12.50`. */
export function centsToInput(cents: number | null | undefined): string {
	if (cents === null || cents === undefined) return '';
	const sign = cents < 0 ? '-' : '';
	const a = Math.abs(cents);
	return `${sign}${Math.floor(a / 100)}.${String(a % 100).padStart(2, '0')}`;
}

/** Cents for display: `$12.50` (the one formatter, which knows each currency's minor unit). */
export { formatMoney as formatCents } from '../format';

/** Basis points as a percentage field shows them: `650` → `6.5`. */
export function bpsToInput(bps: number): string {
	return String(bps / 100);
}

/**
 * Reads a percentage typed as `6.5` or `6.5 %` into basis points (650). At most two decimals
 * (one basis point), between 0 and 100.
 */
export function parsePercentBps(
	text: string
): { ok: true; bps: number } | { ok: false; message: string } {
	const s = text.trim().replace(/\s*%$/, '');
	if (s === '') return { ok: false, message: 'Enter a percentage, e.g. 6.5' };
	const m = /^(\d*)(?:\.(\d*))?$/.exec(s);
	if (!m || (m[1] === '' && !m[2])) {
		return { ok: false, message: `Cannot read "${text.trim()}": type a percentage, e.g. 6.5` };
	}
	const decimals = m[2] ?? '';
	if (decimals.length > 2) return { ok: false, message: 'Use at most two decimals, e.g. 8.25' };
	const bps = Number(m[1] || '0') * 100 + Number(decimals.padEnd(2, '0'));
	if (bps > 10_000) return { ok: false, message: 'A percentage is at most 100' };
	return { ok: true, bps };
}
