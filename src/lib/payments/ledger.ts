/**
 * A job's money in integer cents (the currency's smallest unit): what it owes from its accepted
 * quote and approved change orders, what was paid, refunded and credited, and what is still due.
 * This is the one place these figures are worked out: the job's money page, the customer's page,
 * the receipts and the reconciliation page all read them from here.
 *
 * The rule (common practice in bookkeeping for customer accounts):
 *   balance = owed − paid + refunded − credits
 * A refund gives money back; a credit lowers what is owed. A refund for an overcharge is both (a
 * credit line for the same amount), so the balance does not move. A refund on cancellation
 * closes the job's money: a closing credit takes what is still owed to zero. Any other refund is
 * money given back and owed again.
 */
export type PaymentStatus = 'pending' | 'succeeded' | 'failed' | 'refunded';
export type PaymentPurpose = 'deposit' | 'balance' | 'change_order';
export type RefundReason = 'cancellation' | 'overcharge' | 'other';
export type RefundStatus = 'pending' | 'succeeded' | 'failed';

export interface LedgerPayment {
	purpose: PaymentPurpose;
	status: PaymentStatus;
	amountCents: number;
	refundedCents: number;
	feeCents: number | null;
}

export interface LedgerRefund {
	amountCents: number;
	reason: RefundReason;
	status: RefundStatus;
}

export interface Ledger {
	/** The accepted quote's total plus approved change orders. */
	owedCents: number;
	/** Money received (payments that succeeded, including any later refunded). */
	receivedCents: number;
	refundedCents: number;
	/** Received less refunded. */
	netPaidCents: number;
	/** Credit lines for refunds made because the customer was overcharged. */
	overchargeCreditCents: number;
	/** The credit that closes a cancelled job's money (what was still owed on it). */
	closingCreditCents: number;
	/** Every credit line: overcharges and the closing credit. */
	creditsCents: number;
	/** owed − received + refunded − credits, to the cent; negative when the store owes the customer. */
	balanceCents: number;
	/** What the job still owes; never below zero. */
	balanceDueCents: number;
	/** What the customer paid beyond what is owed (the balance below zero). */
	overpaidCents: number;
	/** The deposit still to pay before the install is booked; a refund never makes it due again. */
	depositDueCents: number;
	/** Whether the job's money is closed (cancelled, or a cancellation refund was made). */
	closed: boolean;
	feesCents: number;
	pendingCents: number;
	/** The refund lines given (those not refused), whatever their reason. */
	refundLinesCents: number;
}

const received = (p: Pick<LedgerPayment, 'status'>) =>
	p.status === 'succeeded' || p.status === 'refunded';
const sum = <T>(rows: T[], cents: (row: T) => number) => rows.reduce((s, r) => s + cents(r), 0);
/** A refund that is or will be money given back (not one Stripe or the store refused). */
const live = (r: LedgerRefund) => r.status !== 'failed';

function checkCents(n: number, what: string) {
	if (!Number.isSafeInteger(n))
		throw new Error(`${what} are integers in the smallest currency unit`);
}

/** The ledger of a job from its payments and refunds. */
export function ledger(input: {
	quoteTotalCents: number;
	depositCents: number;
	changeOrdersCents?: number;
	payments: LedgerPayment[];
	refunds?: LedgerRefund[];
	/** The job was cancelled: nothing more is owed on it. */
	cancelled?: boolean;
}): Ledger {
	const refunds = input.refunds ?? [];
	checkCents(input.quoteTotalCents, 'Amounts');
	checkCents(input.depositCents, 'Amounts');
	checkCents(input.changeOrdersCents ?? 0, 'Amounts');
	for (const p of input.payments) {
		checkCents(p.amountCents, 'Payments');
		checkCents(p.refundedCents, 'Payments');
		if (p.refundedCents < 0) throw new Error('A refund is a positive amount');
		if (p.refundedCents > p.amountCents) throw new Error('A refund cannot exceed its payment');
	}
	for (const r of refunds) {
		checkCents(r.amountCents, 'Refunds');
		if (r.amountCents <= 0) throw new Error('A refund is a positive amount');
	}
	const owedCents = input.quoteTotalCents + (input.changeOrdersCents ?? 0);
	const paid = input.payments.filter(received);
	const receivedCents = sum(paid, (p) => p.amountCents);
	const refundedCents = sum(paid, (p) => p.refundedCents);
	const netPaidCents = receivedCents - refundedCents;
	const overchargeCreditCents = sum(
		refunds.filter((r) => live(r) && r.reason === 'overcharge'),
		(r) => r.amountCents
	);
	const closed =
		Boolean(input.cancelled) || refunds.some((r) => live(r) && r.reason === 'cancellation');
	const beforeClosing = owedCents - receivedCents + refundedCents - overchargeCreditCents;
	const closingCreditCents = closed ? Math.max(0, beforeClosing) : 0;
	const creditsCents = overchargeCreditCents + closingCreditCents;
	const balanceCents = owedCents - receivedCents + refundedCents - creditsCents;
	const balanceDueCents = Math.max(0, balanceCents);
	return {
		owedCents,
		receivedCents,
		refundedCents,
		netPaidCents,
		overchargeCreditCents,
		closingCreditCents,
		creditsCents,
		balanceCents,
		balanceDueCents,
		overpaidCents: Math.max(0, -balanceCents),
		// Counted against money received, so a refund never puts the deposit back as due; never
		// more than is owed in all (a credit can leave less than the deposit to pay, and paying
		// that settles the deposit) nor than the balance.
		depositDueCents: closed
			? 0
			: Math.min(
					balanceDueCents,
					Math.max(0, Math.min(input.depositCents, owedCents) - receivedCents)
				),
		closed,
		feesCents: sum(paid, (p) => p.feeCents ?? 0),
		pendingCents: sum(
			input.payments.filter((p) => p.status === 'pending'),
			(p) => p.amountCents
		),
		refundLinesCents: sum(refunds.filter(live), (r) => r.amountCents)
	};
}

/** How much of a payment can still be refunded. */
export function refundable(
	p: Pick<LedgerPayment, 'status' | 'amountCents' | 'refundedCents'>
): number {
	return received(p) ? p.amountCents - p.refundedCents : 0;
}

export type PaymentState = 'pending' | 'failed' | 'paid' | 'partly_refunded' | 'refunded';

export const PAYMENT_STATE_LABELS: Record<PaymentState, string> = {
	pending: 'Pending',
	failed: 'Failed',
	paid: 'Paid',
	partly_refunded: 'Partly refunded',
	refunded: 'Refunded'
};

/** Where a payment stands: partly refunded until nothing is left on it. */
export function paymentState(
	p: Pick<LedgerPayment, 'status' | 'amountCents' | 'refundedCents'>
): PaymentState {
	if (!received(p)) return p.status === 'failed' ? 'failed' : 'pending';
	if (p.refundedCents <= 0) return 'paid';
	return p.refundedCents >= p.amountCents ? 'refunded' : 'partly_refunded';
}

/** The stored status of a payment with `refundedCents` given back: refunded only when all of it is. */
export function statusAfterRefunds(amountCents: number, refundedCents: number): PaymentStatus {
	return refundedCents >= amountCents ? 'refunded' : 'succeeded';
}
