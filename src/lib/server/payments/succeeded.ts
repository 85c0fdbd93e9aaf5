import { soldByDeposit } from '$lib/jobs/status';
import * as jobs from '../db/queries/jobs';
import type { Payment } from '../db/queries/payments';
import type { StoreWriteTx } from '../db/tenant';

/**
 * What follows a payment that succeeded, in the same transaction as the payment, so the two
 * never disagree: a deposit sells the job the customer accepted.
 */
export async function paymentSucceeded(
	tx: StoreWriteTx,
	paid: Pick<Payment, 'jobId' | 'purpose'>,
	actorId: string | null
) {
	if (paid.purpose !== 'deposit') return;
	const status = await jobs.lockStatus(tx, paid.jobId);
	if (status && soldByDeposit(status)) {
		await jobs.move(tx, paid.jobId, 'sold', actorId, 'Deposit paid');
	}
}
