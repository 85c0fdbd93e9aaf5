/**
 * The customer's quote: what the homeowner reads on the link's page and in the quote PDF. Built
 * from the stored quote (its input and the engine's result) by the audience rules in
 * `./audience`: rooms to scale with their floor, the prep in plain sentences, prices and totals,
 * the deposit, the homeowner's cautions and the store's own papers. Readings, limits, fastening
 * schedules, supply sizes, installer pay and margins never enter it.
 */
import type {
	Basis,
	EstimateInput,
	EstimateResult,
	ItemRef,
	LineGroup,
	Outline,
	PrepKind,
	Totals
} from '$lib/estimating';
import { EXISTING_FLOOR_LABELS, LAYOUT_LABELS } from '$lib/measure/labels';
import {
	CAUTION_AUDIENCE,
	CLEAR_ROOMS_CREW_MOVES_FURNITURE,
	HOMEOWNER_CAUTION_KINDS,
	HOMEOWNER_CAUTION_TITLES,
	HOMEOWNER_CAUTIONS,
	HOMEOWNER_FOR,
	lineQuantityAudience,
	SUPPLY_WORDS,
	type HomeownerCautionKind
} from './audience';
import { plainPrep } from './plain-prep';
import type { StorePapers } from './store-papers';

export interface CustomerRoom {
	id: string;
	name: string;
	areaSqFt: number;
	outline?: Outline;
	/** "Grey vinyl plank, laid straight"; null when the room gets no new floor. */
	floor: string | null;
	/** The old floors taken up, in plain words. */
	takingUp: string[];
}

/** A priced line as the customer reads it (no engine ids: they name items in the trade's words). */
export interface CustomerLine {
	text: string;
	/** The room's name when the text does not already say it. */
	room: string | null;
	/** Quantity and unit price, for floors, installation and tear-out only. */
	priced?: { qty: number; basis: Basis; unitCents: number };
	amountCents: number;
}

export interface CustomerCaution {
	kind: HomeownerCautionKind;
	title: string;
	text: string;
}

export interface CustomerQuote {
	currency: string;
	metric?: boolean;
	rooms: CustomerRoom[];
	groups: { key: LineGroup; title: string; lines: CustomerLine[] }[];
	totals: Totals;
	/** Working days the install takes, prep and waits included. */
	days: number;
	cautions: CustomerCaution[];
	papers: StorePapers;
}

/** The price groups in the order the customer reads them, with their headings. */
export const CUSTOMER_GROUPS: { key: LineGroup; title: string }[] = [
	{ key: 'material', title: 'Materials' },
	{ key: 'labour', title: 'Installation' },
	{ key: 'prep', title: 'Getting the floor ready' },
	{ key: 'removal', title: 'Taking up the old floor' }
];

const STRUCTURAL_PREP: ReadonlySet<string> = new Set<PrepKind>([
	'joist_sister',
	'structural_consult',
	'subfloor_overlay'
]);

/** The homeowner's cautions for a result, in a stable order. */
export function homeownerCautions(result: EstimateResult): CustomerCaution[] {
	const kinds = new Set<HomeownerCautionKind>();
	const prepKinds = new Set(
		result.lines.flatMap((l) => (l.ref.type === 'prep' ? [l.ref.kind as string] : []))
	);
	for (const c of result.cautions) {
		if (CAUTION_AUDIENCE[c.kind] === 'installer') continue;
		const kind = HOMEOWNER_FOR[c.kind];
		if (!kind) continue;
		// Joists checked and found fine concern only the installer; structural work priced concerns
		// the homeowner (a licensed professional, maybe a permit).
		if (kind === 'structure' && ![...prepKinds].some((k) => STRUCTURAL_PREP.has(k))) continue;
		kinds.add(kind);
	}
	if (result.lines.some((l) => l.ref.type === 'removal')) kinds.add('dust');
	if (result.rooms.length) kinds.add('clear_rooms');
	if (prepKinds.has('appliance_reset') || prepKinds.has('toilet_reset')) kinds.add('fixtures');
	if (result.schedule.days > 0) kinds.add('rooms_out_of_use');
	return HOMEOWNER_CAUTION_KINDS.filter((k) => kinds.has(k)).map((kind) => ({
		kind,
		title: HOMEOWNER_CAUTION_TITLES[kind],
		text:
			kind === 'clear_rooms' && prepKinds.has('furniture')
				? CLEAR_ROOMS_CREW_MOVES_FURNITURE
				: HOMEOWNER_CAUTIONS[kind]
	}));
}

/**
 * A priced item in the customer's words: prep as one plain sentence, a supply as what it is for,
 * floors, installation and tear-out as priced (`fallback`, the engine's description).
 */
export function customerWords(ref: ItemRef, room: string | undefined, fallback: string): string {
	if (ref.type === 'prep') return plainPrep(ref.kind, room, fallback);
	if (ref.type === 'supply') return SUPPLY_WORDS[ref.kind] ?? 'Supplies for the prep';
	return fallback;
}

/** The customer's quote from a stored quote's input and result. */
export function customerQuote(
	quote: { input: EstimateInput; result: EstimateResult },
	options: { currency: string; metric?: boolean; papers: StorePapers }
): CustomerQuote {
	const { input, result } = quote;
	const products = new Map(input.priceBook.floors.map((f) => [f.id, f]));
	const measured = new Map(input.job.rooms.map((r) => [r.id, r]));
	const roomName = new Map(result.rooms.map((r) => [r.id, r.name]));
	const rooms: CustomerRoom[] = result.rooms.map((r) => {
		const m = measured.get(r.id);
		const product = m?.floor ? products.get(m.floor.productId) : undefined;
		return {
			id: r.id,
			name: r.name,
			areaSqFt: r.areaSqFt,
			outline: r.outline,
			floor:
				m?.floor && product
					? `${product.name}, laid ${LAYOUT_LABELS[m.floor.layout].toLowerCase()}`
					: null,
			takingUp: (m?.remove ?? []).map((k) => EXISTING_FLOOR_LABELS[k])
		};
	});
	const lineOf = (l: EstimateResult['lines'][number]): CustomerLine => {
		const room = l.roomId ? roomName.get(l.roomId) : undefined;
		const withQty = lineQuantityAudience(l.ref) !== 'installer';
		const text = customerWords(l.ref, room, l.description);
		return {
			text,
			room: room && !text.includes(room) ? room : null,
			...(withQty ? { priced: { qty: l.qty, basis: l.basis, unitCents: l.unitCents } } : {}),
			amountCents: l.amountCents
		};
	};
	return {
		currency: options.currency,
		metric: options.metric,
		rooms,
		groups: CUSTOMER_GROUPS.map((g) => ({
			...g,
			lines: result.lines.filter((l) => l.group === g.key).map(lineOf)
		})).filter((g) => g.lines.length > 0),
		totals: result.totals,
		days: result.schedule.days,
		cautions: homeownerCautions(result),
		papers: options.papers
	};
}
