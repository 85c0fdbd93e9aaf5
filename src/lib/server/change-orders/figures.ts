import { taxes, type ChangeOrder } from '$lib/estimating';
import type { StoreSettings } from '$lib/estimating';
import type { ChangeOrderAdjustment } from '../db/schema';

/** Realistic bounds on a manager's adjustments. */
export const MAX_ADJUSTMENTS = 20;
export const MAX_ADJUSTMENT_CENTS = 10_000_000;

/**
 * A change order's stored figures: the engine's, plus the manager's adjustments. An adjustment is
 * priced work like the prep it corrects, so it is taxed as the `prep` group is (each tax on the
 * adjustments' sum, by the store's tax rounding) and added to the engine's tax; its pay goes to
 * the installer's pay difference. Integer cents throughout; total = subtotal + tax.
 */
export function changeOrderFigures(
	result: Pick<ChangeOrder, 'subtotalCents' | 'taxCents' | 'payDeltaCents'>,
	adjustments: readonly ChangeOrderAdjustment[],
	settings: Pick<StoreSettings, 'taxes' | 'taxRounding'>
) {
	const adjusted = adjustments.reduce((s, a) => s + a.amountCents, 0);
	const adjustedPay = adjustments.reduce((s, a) => s + a.payCents, 0);
	const adjustedTax = adjusted
		? taxes({ material: 0, labour: 0, prep: adjusted, removal: 0 }, settings).reduce(
				(s, t) => s + t.taxCents,
				0
			)
		: 0;
	const subtotalCents = result.subtotalCents + adjusted;
	const taxCents = result.taxCents + adjustedTax;
	return {
		subtotalCents,
		taxCents,
		totalCents: subtotalCents + taxCents,
		payDeltaCents: result.payDeltaCents + adjustedPay
	};
}
