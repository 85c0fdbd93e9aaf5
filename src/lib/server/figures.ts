// Who sees which of the store's figures. Page data and API answers are shaped here, on the
// server, so what a member's screens hide never reaches their browser either:
// - sell prices: everyone who reads the price book, quotes or jobs (`priceBook`, `quote`, `job`);
// - costs, installer pay rates and totals, margins: `cost: read` (owner, manager; salespeople
//   only where the owner turns it on in store settings);
// - card fees: `cardFee: read` (owner, manager), never salespeople;
// - an installer's own pay on their jobs: `installerPay: read`.
import type { EstimateResult, PriceBook } from '$lib/estimating';
import type { Ledger } from '$lib/payments/ledger';
import type { JobMoney } from './db/queries/payments';
import type { PriceItem } from './db/queries/price-book';
import { can, type Grants } from './permissions';

/** Whether the member sees costs, installer pay and margins. */
export const seesCosts = (grants: Grants) => can(grants, { cost: ['read'] });

/** Whether the member sees what the card processor kept. */
export const seesCardFees = (grants: Grants) => can(grants, { cardFee: ['read'] });

/** A ledger as the member may see it: card fees are null when hidden. */
export type VisibleLedger = Omit<Ledger, 'feesCents'> & { feesCents: number | null };

export function visibleLedger(grants: Grants, ledger: Ledger): VisibleLedger {
	return seesCardFees(grants) ? ledger : { ...ledger, feesCents: null };
}

/** A job's money as the member may see it: each payment's fee is null when fees are hidden. */
export function visibleMoney(grants: Grants, money: JobMoney) {
	const fees = seesCardFees(grants);
	return {
		...money,
		ledger: visibleLedger(grants, money.ledger),
		payments: fees ? money.payments : money.payments.map((p) => ({ ...p, feeCents: null }))
	};
}

/**
 * Keys of the store-side figures in the price book's data: `costCents`, `payCents`,
 * `payCentsPerSqFt` and any later `cost…`/`pay…` field (the engine's naming rule for them).
 */
const STORE_SIDE = /^(cost|pay)([A-Z]|$)/;

function withoutStoreSide(value: unknown): unknown {
	if (Array.isArray(value)) return value.map(withoutStoreSide);
	if (typeof value !== 'object' || value === null) return value;
	const out: Record<string, unknown> = {};
	for (const [key, v] of Object.entries(value)) {
		if (!STORE_SIDE.test(key)) out[key] = withoutStoreSide(v);
	}
	return out;
}

/** A price-book line as the member may see it: sell prices always, costs and pay with `cost`. */
export function visiblePriceItem(grants: Grants, item: PriceItem): PriceItem {
	if (seesCosts(grants)) return item;
	return { ...item, data: withoutStoreSide(item.data) as PriceItem['data'] };
}

/**
 * The engine's price book for a member's browser (the measure page's live preview): sell prices
 * only unless they see costs. Pay rates become 0 (the engine needs a number; nothing shown on
 * that page depends on them) and costs are left out.
 */
export function visiblePriceBook(grants: Grants, book: PriceBook): PriceBook {
	if (seesCosts(grants)) return book;
	return {
		currency: book.currency,
		floors: book.floors.map(({ material: { costCents: _c, ...material }, ...floor }) => ({
			...floor,
			material,
			payCentsPerSqFt: 0
		})),
		prep: book.prep.map(({ costCents: _c, ...prep }) => ({ ...prep, payCents: 0 })),
		removal: book.removal.map((removal) => ({ ...removal, payCents: 0 })),
		supplies: book.supplies.map(({ costCents: _c, ...supply }) => supply)
	};
}

/** The whole estimate at sell prices: no installer pay, pay total or margin. */
export type SellEstimate = Omit<EstimateResult, 'pay' | 'installerPayCents' | 'margin'>;

export function sellEstimate(result: EstimateResult): SellEstimate {
	const { pay: _p, installerPayCents: _i, margin: _m, ...sell } = result;
	return sell;
}
