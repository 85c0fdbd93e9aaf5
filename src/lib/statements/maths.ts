/**
 * Installer statement maths: pure, integer cents, shared by the server (which writes the lines)
 * and the pages (which show how a line was worked out). The database keeps the statement's
 * `total_cents` as the sum of its lines; `statementTotal` is the same sum, checked here.
 */
import { extend, refKey, type ItemRef } from '$lib/estimating/pricing';

/** The price-book pay a quote's line carried, and what replaces it for one installer. */
export interface PayRateOverride {
	ref: ItemRef;
	payCents: number;
}

/** What a quote's stored result holds that the install pay needs (lines and their pay). */
export interface PaySource {
	lines: { id: string; ref: ItemRef; description: string; basis: string; qty: number }[];
	pay: { lineId: string; qty: number; unitCents: number; amountCents: number }[];
}

export interface InstallPayLine {
	lineId: string;
	description: string;
	basis: string;
	qty: number;
	unitCents: number;
	amountCents: number;
	/** The installer's own rate replaced the price book's. */
	ownRate: boolean;
}

/** Largest amount one line may carry (the database's own bound). */
export const LINE_LIMIT_CENTS = 100_000_000;

/**
 * An installer's pay for one job from its accepted quote's stored result: each pay line as
 * the quote priced it, except where the installer's profile has a rate for the line's item,
 * which replaces the book's rate (qty × rate, rounded half up on the 1/10,000 quantity, as
 * the engine extends every line). A line the book paid nothing on is paid at the installer's
 * rate when they have one.
 */
export function installPay(
	source: PaySource,
	rates: readonly PayRateOverride[]
): { lines: InstallPayLine[]; totalCents: number } {
	const byKey = new Map(rates.map((r) => [refKey(r.ref), r.payCents]));
	const payByLine = new Map(source.pay.map((p) => [p.lineId, p]));
	const lines: InstallPayLine[] = [];
	for (const line of source.lines) {
		const own = byKey.get(refKey(line.ref));
		const book = payByLine.get(line.id);
		if (own !== undefined) {
			lines.push({
				lineId: line.id,
				description: line.description,
				basis: line.basis,
				qty: line.qty,
				unitCents: own,
				amountCents: extend(line.qty, own),
				ownRate: true
			});
		} else if (book) {
			lines.push({
				lineId: line.id,
				description: line.description,
				basis: line.basis,
				qty: book.qty,
				unitCents: book.unitCents,
				amountCents: book.amountCents,
				ownRate: false
			});
		}
	}
	return { lines, totalCents: statementTotal(lines) };
}

/** The sum of lines in cents; refuses anything that is not a whole number of cents. */
export function statementTotal(lines: readonly { amountCents: number }[]): number {
	let total = 0;
	for (const l of lines) {
		if (!Number.isSafeInteger(l.amountCents)) throw new Error('A line must be whole cents');
		total += l.amountCents;
	}
	if (!Number.isSafeInteger(total)) throw new Error('The total is out of range');
	return total;
}

export type ManualLineKind = 'chargeback' | 'adjustment';

/**
 * A manager's line as it is stored: a chargeback is always taken off (whatever sign was typed,
 * it is stored negative); an adjustment keeps its sign. Zero is refused: a line of nothing is
 * a mistake.
 */
export function manualLineAmount(
	kind: ManualLineKind,
	typedCents: number
): { ok: true; amountCents: number } | { ok: false; message: string } {
	if (!Number.isSafeInteger(typedCents)) return { ok: false, message: 'Enter an amount in cents' };
	if (typedCents === 0) return { ok: false, message: 'Enter an amount other than zero' };
	if (Math.abs(typedCents) > LINE_LIMIT_CENTS)
		return { ok: false, message: 'That is more than one line may carry' };
	return { ok: true, amountCents: kind === 'chargeback' ? -Math.abs(typedCents) : typedCents };
}

/** Totals of a statement by kind of line, for its summary. */
export function totalsByKind(
	lines: readonly { kind: string; amountCents: number }[]
): Record<'install' | 'extra' | 'chargeback' | 'adjustment' | 'total', number> {
	const out = { install: 0, extra: 0, chargeback: 0, adjustment: 0, total: 0 };
	for (const l of lines) {
		if (
			l.kind === 'install' ||
			l.kind === 'extra' ||
			l.kind === 'chargeback' ||
			l.kind === 'adjustment'
		)
			out[l.kind] += l.amountCents;
	}
	out.total = statementTotal(lines);
	return out;
}
