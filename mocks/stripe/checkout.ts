import type Stripe from 'stripe';
import { formatAmount } from './money';
import { TEST_CARDS, type TestCardName } from './payments';
import type { Store } from './store';

/** What the hosted page shows of a Checkout Session. */
export interface CheckoutView {
	id: string;
	status: 'open' | 'complete' | 'expired';
	paid: boolean;
	currency: string;
	amountTotal: number;
	/** The total written for people (`$1,250.00`, `¥12,000`). */
	total: string;
	lines: {
		name: string;
		quantity: number;
		unit: string;
		amount: string;
	}[];
	/** The store's name from the session's `metadata.store_name`, when the app gave it. */
	storeName: string | null;
	email: string | null;
	/** Where the page sends the payer once paid, with `{CHECKOUT_SESSION_ID}` filled in. */
	successUrl: string | null;
	cancelUrl: string | null;
	expiresAt: number;
	/** The last decline on this session's payment, if the latest attempt failed. */
	lastError: { code: string | null; declineCode: string | null; message: string } | null;
}

/** The test cards the page offers, with Stripe's published test numbers. */
export const CHECKOUT_CARDS: { name: TestCardName; number: string; label: string }[] = [
	{ name: 'success', number: TEST_CARDS.success.number, label: 'Succeeds' },
	{ name: 'decline', number: TEST_CARDS.decline.number, label: 'Declined (generic decline)' }
];

export function successUrlOf(session: Stripe.Checkout.Session) {
	return session.success_url?.replaceAll('{CHECKOUT_SESSION_ID}', session.id) ?? null;
}

export function checkoutView(store: Store, id: string): CheckoutView | null {
	const session = store.state.checkoutSessions[id];
	if (!session) return null;
	const currency = session.currency ?? 'usd';
	const intentId =
		typeof session.payment_intent === 'string'
			? session.payment_intent
			: session.payment_intent?.id;
	const intent = intentId ? store.state.paymentIntents[intentId] : undefined;
	const error = intent?.last_payment_error;
	const customerId = typeof session.customer === 'string' ? session.customer : session.customer?.id;
	return {
		id: session.id,
		status: (session.status ?? 'open') as CheckoutView['status'],
		paid: session.payment_status === 'paid',
		currency,
		amountTotal: session.amount_total ?? 0,
		total: formatAmount(session.amount_total ?? 0, currency),
		lines: (store.state.lineItems[id] ?? []).map((item) => ({
			name: item.description ?? '',
			quantity: item.quantity ?? 1,
			unit: formatAmount(item.price?.unit_amount ?? 0, currency),
			amount: formatAmount(item.amount_total, currency)
		})),
		storeName: session.metadata?.store_name ?? null,
		email:
			session.customer_details?.email ??
			session.customer_email ??
			(customerId ? (store.state.customers[customerId]?.email ?? null) : null),
		successUrl: successUrlOf(session),
		cancelUrl: session.cancel_url,
		expiresAt: session.expires_at,
		lastError:
			error && session.status === 'open'
				? {
						code: error.code ?? null,
						declineCode: error.decline_code ?? null,
						message: error.message ?? 'Your card was declined.'
					}
				: null
	};
}
