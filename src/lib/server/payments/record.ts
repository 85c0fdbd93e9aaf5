import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import type { StoreWriteTx } from '../db/tenant';
import { paymentSucceeded } from './succeeded';

export type RecordResult =
	| { ok: true; payment: payments.Payment }
	| { ok: false; reason: 'not_found' | 'no_accepted_quote' | 'more_than_due' };

/** A payment taken in the store (cash, cheque, card terminal, transfer), with its reference. */
export async function recordInStore(
	tx: StoreWriteTx,
	jobId: string,
	input: {
		purpose: payments.PaymentPurpose;
		method: Exclude<payments.PaymentMethod, 'card'>;
		amountCents: number;
		reference: string;
	},
	actorId: string
): Promise<RecordResult> {
	// The job's lock makes two payments recorded at once see each other's amounts.
	if (!(await jobs.lockStatus(tx, jobId))) return { ok: false, reason: 'not_found' };
	const money = await payments.moneyFor(tx, jobId);
	if (!money.quote) return { ok: false, reason: 'no_accepted_quote' };
	if (input.amountCents > money.ledger.balanceDueCents) {
		return { ok: false, reason: 'more_than_due' };
	}
	const row = await payments.insert(tx, {
		jobId,
		quoteId: money.quote.id,
		purpose: input.purpose,
		method: input.method,
		status: 'succeeded',
		currency: money.quote.currency,
		amountCents: input.amountCents,
		reference: input.reference,
		recordedBy: actorId,
		succeededAt: new Date()
	});
	await paymentSucceeded(tx, row, actorId);
	return { ok: true, payment: row };
}
