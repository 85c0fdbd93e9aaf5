import { formatMoney } from '$lib/format';
import { jobLabel } from '$lib/jobs/status';
import { customerLink } from '../customer-page';
import * as changeOrders from '../db/queries/change-orders';
import * as customers from '../db/queries/customers';
import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import { readProfile, readStore } from '../db/queries/stores';
import type { StoreWriteTx } from '../db/tenant';
import { queueMail } from '../mail/queue';
import { balanceMail } from '../mail/templates';

export type BalanceRequest =
	| { queued: true; balanceDueCents: number }
	| { queued: false; reason: 'not_found' | 'not_completed' | 'nothing_due' | 'no_email' };

/**
 * Asks the customer for the balance of a completed job: the e-mail (a task, in the caller's
 * transaction) says what is due — the accepted quote and the approved change orders, less the
 * payments net of refunds, as the ledger has it — with the link to sign off and pay. Called when
 * the installer completes the job, and on the customer's sign-off if it was not sent then.
 */
export async function requestBalance(
	tx: StoreWriteTx,
	jobId: string,
	actorId: string | null = null
): Promise<BalanceRequest> {
	const job = await jobs.readForStore(tx, jobId);
	if (!job) return { queued: false, reason: 'not_found' };
	if (job.status !== 'completed') return { queued: false, reason: 'not_completed' };
	const money = await payments.moneyFor(tx, jobId);
	const due = money.ledger.balanceDueCents;
	if (due <= 0) return { queued: false, reason: 'nothing_due' };
	const customer = await customers.read(tx, job.customerId);
	if (!customer?.email) return { queued: false, reason: 'no_email' };
	const store = await readStore(tx);
	if (!store) return { queued: false, reason: 'not_found' };
	const profile = await readProfile(tx);
	await queueMail(
		tx,
		'balance-request',
		balanceMail({
			to: customer.email,
			storeName: store.name,
			storePhone: profile.phone,
			replyTo: profile.email,
			customerName: customer.name,
			jobLabel: jobLabel(job.number),
			jobTitle: job.title,
			balance: formatMoney(due, money.currency),
			url: await customerLink(tx, jobId)
		}),
		{ jobId, createdBy: actorId }
	);
	return { queued: true, balanceDueCents: due };
}

/** Whether the balance e-mail of the job was already queued (sent or on its way). */
export function balanceRequested(tx: StoreWriteTx, jobId: string) {
	return changeOrders.mailQueued(tx, jobId, 'balance-request');
}
