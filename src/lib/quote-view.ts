import {
	forCustomer,
	type EstimateResult,
	type Margin,
	type Outline,
	type PayLine,
	type PriceLine,
	type Totals
} from '$lib/estimating';

/** What each quote status means, in words for the store's staff. */
export const QUOTE_STATUS_LABELS = {
	draft: 'Draft: not sent',
	sent: 'Sent to the customer',
	accepted: 'Accepted by the customer',
	changes_requested: 'Customer asked for changes',
	superseded: 'Replaced by a newer version',
	withdrawn: 'Withdrawn by the store'
} as const satisfies Record<string, string>;

/** A quote as the customer may see it, with the store-only figures when the viewer may. */
export interface QuoteViewData {
	currency: string;
	metric?: boolean;
	rooms: { id: string; name: string; areaSqFt: number; outline?: Outline }[];
	lines: PriceLine[];
	findings: {
		id: string;
		roomId: string;
		pass: boolean;
		message: string;
		suggestedPrep: { kind: string; note: string }[];
		cautionTexts: string[];
	}[];
	totals: Totals;
	cautions: string[];
	/** The order of work with the waits that hold the next step (stored quotes may lack steps). */
	schedule: { days: number; steps?: { key: string; label: string; waitHours?: number }[] };
	/** Installer pay per line: store staff with the permission only. */
	pay?: PayLine[];
	margin?: Margin;
}

/**
 * What a viewer of a quote receives. Built on the server, so installer pay and margins never
 * reach a customer's (or a salesperson's) browser unless `storeFigures` is true.
 */
export function quoteView(
	result: EstimateResult,
	options: { currency: string; metric?: boolean; storeFigures?: boolean }
): QuoteViewData {
	const view = forCustomer(result);
	return {
		...view,
		currency: options.currency,
		metric: options.metric,
		...(options.storeFigures ? { pay: result.pay, margin: result.margin } : {})
	};
}
