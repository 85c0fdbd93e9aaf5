import { describe, expect, it } from 'vitest';
import {
	CHANGE_ORDER_STATUSES,
	canMoveChangeOrder,
	changeOrderLabel,
	isChangeOrderDecided,
	isChangeOrderFrozen,
	nextChangeOrderStatuses
} from './change-order-status';

// A change order's states as PRODUCT.md ("States") defines them; the database trigger
// change_order_guard is checked against this table in tests/integration/installer-half-rules.spec.ts.
describe('change order status', () => {
	it('goes submitted → reviewed → approved or declined, and a manager may decline at once', () => {
		expect(nextChangeOrderStatuses('submitted')).toEqual(['reviewed', 'declined']);
		expect(nextChangeOrderStatuses('reviewed')).toEqual(['approved', 'declined']);
		expect(canMoveChangeOrder('submitted', 'approved')).toBe(false);
	});

	it('ends once decided, so nothing is approved twice', () => {
		for (const to of CHANGE_ORDER_STATUSES) {
			expect(canMoveChangeOrder('approved', to)).toBe(false);
			expect(canMoveChangeOrder('declined', to)).toBe(false);
		}
		expect(CHANGE_ORDER_STATUSES.filter(isChangeOrderDecided)).toEqual(['approved', 'declined']);
	});

	it('fixes its figures from the moment the customer can see them', () => {
		expect(CHANGE_ORDER_STATUSES.filter(isChangeOrderFrozen)).toEqual([
			'reviewed',
			'approved',
			'declined'
		]);
	});

	it('names change orders CO- and their number', () => {
		expect(changeOrderLabel(2)).toBe('CO-2');
	});
});
