/**
 * A job's money in integer cents (the currency's smallest unit): what it owes from its accepted
 * quote and approved change orders, what was paid and refunded, and what is still due.
 */
export type PaymentStatus = 'pending' | 'succeeded' | 'failed' | 'refunded';
export type PaymentPurpose = 'deposit' | 'balance' | 'change_order';

export interface LedgerPayment {
	purpose: PaymentPurpose;
	status: PaymentStatus;
	amountCents: number;
	refundedCents: number;
	feeCents: number | null;
}

export interface Ledger {
	/** The accepted quote's total plus approved change orders. */
	owedCents: number;
	/** Money received (payments that succeeded, including any later refunded). */
	receivedCents: number;
	refundedCents: number;
	/** Received less refunded. */
	netPaidCents: number;
	/** What the job still owes; never below zero (an overpayment shows as credit). */
	balanceDueCents: number;
	creditCents: number;
	/** The deposit still to pay before the install is booked. */
	depositDueCents: number;
	feesCents: number;
	pendingCents: number;
}

const received = (p: LedgerPayment) => p.status === 'succeeded' || p.status === 'refunded';

/** The ledger of a job from its payments. */
export function ledger(input: {
	quoteTotalCents: number;
	depositCents: number;
	changeOrdersCents?: number;
	payments: LedgerPayment[];
}): Ledger {
	for (const p of input.payments) {
		if (!Number.isInteger(p.amountCents) || !Number.isInteger(p.refundedCents)) {
			throw new Error('Payments are integers in the smallest currency unit');
		}
		if (p.refundedCents > p.amountCents) throw new Error('A refund cannot exceed its payment');
	}
	const owedCents = input.quoteTotalCents + (input.changeOrdersCents ?? 0);
	const paid = input.payments.filter(received);
	const receivedCents = paid.reduce((s, p) => s + p.amountCents, 0);
	const refundedCents = paid.reduce((s, p) => s + p.refundedCents, 0);
	const netPaidCents = receivedCents - refundedCents;
	return {
		owedCents,
		receivedCents,
		refundedCents,
		netPaidCents,
		balanceDueCents: Math.max(0, owedCents - netPaidCents),
		creditCents: Math.max(0, netPaidCents - owedCents),
		depositDueCents: Math.max(0, input.depositCents - netPaidCents),
		feesCents: paid.reduce((s, p) => s + (p.feeCents ?? 0), 0),
		pendingCents: input.payments
			.filter((p) => p.status === 'pending')
			.reduce((s, p) => s + p.amountCents, 0)
	};
}

/** How much of a payment can still be refunded. */
export function refundable(
	p: Pick<LedgerPayment, 'status' | 'amountCents' | 'refundedCents'>
): number {
	return received(p as LedgerPayment) ? p.amountCents - p.refundedCents : 0;
}
