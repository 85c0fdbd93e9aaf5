/**
 * A change order's life (../shared/PRODUCT.md, "States"): the installer's report makes it
 * `submitted`; a manager adjusts it and sends it to the customer (`reviewed`), or declines it with
 * a reason; the customer approves or declines what was sent. The database refuses every other
 * move (trigger `change_order_guard`), and its spec checks that it agrees with this table.
 */
export const CHANGE_ORDER_STATUSES = ['submitted', 'reviewed', 'approved', 'declined'] as const;

export type ChangeOrderStatus = (typeof CHANGE_ORDER_STATUSES)[number];

export const CHANGE_ORDER_STATUS_LABELS: Record<ChangeOrderStatus, string> = {
	submitted: 'Waiting for review',
	reviewed: 'With the customer',
	approved: 'Approved',
	declined: 'Declined'
};

const moves: Record<ChangeOrderStatus, readonly ChangeOrderStatus[]> = {
	submitted: ['reviewed', 'declined'],
	reviewed: ['approved', 'declined'],
	approved: [],
	declined: []
};

/** The states a change order may move to from `from`. */
export function nextChangeOrderStatuses(from: ChangeOrderStatus): ChangeOrderStatus[] {
	return [...moves[from]];
}

export function canMoveChangeOrder(from: ChangeOrderStatus, to: ChangeOrderStatus): boolean {
	return moves[from].includes(to);
}

/**
 * Whether its figures (engine input and result, adjustments, totals) are fixed: from the moment
 * it is sent to the customer, it says what the customer saw.
 */
export function isChangeOrderFrozen(status: ChangeOrderStatus): boolean {
	return status !== 'submitted';
}

/** Approved or declined: nothing about the decision changes again. */
export function isChangeOrderDecided(status: ChangeOrderStatus): boolean {
	return status === 'approved' || status === 'declined';
}

/** `CO-2`: how people say a job's second change order. */
export function changeOrderLabel(number: number): string {
	return `CO-${number}`;
}
