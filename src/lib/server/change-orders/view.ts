import type { ChangeOrder } from '$lib/estimating';
import { CHANGE_ORDER_STATUS_LABELS, changeOrderLabel } from '$lib/jobs/change-order-status';
import { customerWords } from '$lib/papers/customer-quote';
import type * as changeOrders from '../db/queries/change-orders';

/** A room's name by its measure id, from the accepted quote's stored input. */
export type RoomNames = Map<string, string>;

export function roomNamesOf(quote: { input: { job: { rooms: { id: string; name: string }[] } } }) {
	return new Map(quote.input.job.rooms.map((r) => [r.id, r.name])) as RoomNames;
}

const roomOf = (rooms: RoomNames, roomId: string | undefined | null) =>
	roomId ? (rooms.get(roomId) ?? 'A room') : 'Whole job';

/**
 * A change order as the customer sees it: sold and found per room and item, the priced
 * difference, tax and total. Never the installer's pay, a cost or a margin.
 */
export function customerChangeOrder(row: changeOrders.ChangeOrderRow, rooms: RoomNames) {
	return {
		id: row.id,
		number: row.number,
		label: changeOrderLabel(row.number),
		status: row.status,
		statusLabel: CHANGE_ORDER_STATUS_LABELS[row.status],
		currency: row.currency,
		lines: row.result.lines.map((l: ChangeOrder['lines'][number]) => ({
			key: `${l.roomId ?? 'job'}|${l.key}`,
			room: roomOf(rooms, l.roomId),
			// The customer's words for the item, as on the quote (`$lib/papers`).
			description: customerWords(
				l.ref,
				l.roomId ? (rooms.get(l.roomId) ?? undefined) : undefined,
				l.description
			),
			basis: l.basis,
			soldQty: l.soldQty,
			foundQty: l.foundQty,
			deltaQty: l.deltaQty,
			unitCents: l.unitCents,
			deltaCents: l.deltaCents
		})),
		adjustments: row.adjustments.map((a) => ({
			description: a.description,
			amountCents: a.amountCents
		})),
		subtotalCents: row.subtotalCents,
		taxCents: row.taxCents,
		totalCents: row.totalCents,
		sentAt: row.sentAt,
		decidedAt: row.decidedAt,
		decidedName: row.decidedName,
		declineReason: row.status === 'declined' ? row.declineReason : ''
	};
}

/** The desk's view: the customer's, with the installer's pay per line and in all. */
export function deskChangeOrder(
	row: changeOrders.ChangeOrderRow,
	rooms: RoomNames,
	seesPay: boolean
) {
	const base = customerChangeOrder(row, rooms);
	return {
		...base,
		lines: base.lines.map((l, i) => ({
			...l,
			// The store reads the engine's own words for the item.
			description: row.result.lines[i].description,
			payDeltaCents: seesPay ? row.result.lines[i].payDeltaCents : null
		})),
		adjustments: row.adjustments.map((a) => ({
			description: a.description,
			amountCents: a.amountCents,
			payCents: seesPay ? a.payCents : null
		})),
		payDeltaCents: seesPay ? row.payDeltaCents : null,
		reviewedAt: row.reviewedAt,
		sentTo: row.sentTo,
		declineReason: row.declineReason,
		declinedByStore: Boolean(row.declinedBy)
	};
}

/**
 * Which line each photo shows: a report photo names its item by the item's client id, and the
 * item its room and price-book item, which is the line's key.
 */
export function photoLines(
	photos: changeOrders.FieldPhotoRow[],
	items: { clientId: string; roomId: string | null; refKey: string | null }[]
) {
	const byClient = new Map(items.map((i) => [i.clientId, `${i.roomId ?? 'job'}|${i.refKey}`]));
	return photos.map((p) => ({
		id: p.id,
		caption: p.caption,
		roomId: p.roomId,
		lineKey: p.itemClientId ? (byClient.get(p.itemClientId) ?? null) : null,
		width: p.width,
		height: p.height
	}));
}
