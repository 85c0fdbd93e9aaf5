import { formatMoney } from '$lib/format';
import { jobLabel } from '$lib/jobs/status';
import { config } from '../config';
import { customerLink } from '../customer-page';
import * as customers from '../db/queries/customers';
import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import { emailOf, readProfile, readStore } from '../db/queries/stores';
import type { StoreWriteTx } from '../db/tenant';
import { queueMail } from '../mail/queue';
import { paidNoticeMail, receiptMail } from '../mail/templates';

const PURPOSE_WORDS: Record<payments.Payment['purpose'], string> = {
	deposit: 'deposit',
	balance: 'balance',
	change_order: 'change order'
};

/**
 * Queues the customer's receipt and the salesperson's notice of a payment (to those with an
 * address), in the transaction that recorded it.
 */
export async function announcePayment(tx: StoreWriteTx, paid: payments.Payment) {
	const store = await readStore(tx);
	const job = await jobs.readForStore(tx, paid.jobId);
	if (!store || !job) return;
	const profile = await readProfile(tx);
	const money = await payments.moneyFor(tx, paid.jobId);
	const customer = await customers.read(tx, job.customerId);
	const seller = await emailOf(tx, job.salespersonId);
	const amount = formatMoney(paid.amountCents, paid.currency);
	const what = PURPOSE_WORDS[paid.purpose];
	const about = { jobId: job.id };
	if (customer?.email) {
		await queueMail(
			tx,
			'receipt',
			receiptMail({
				to: customer.email,
				storeName: store.name,
				storePhone: profile.phone,
				customerName: customer.name,
				jobLabel: jobLabel(job.number),
				jobTitle: job.title,
				what,
				amount,
				balance: formatMoney(money.ledger.balanceDueCents, money.currency),
				paidAt: paid.succeededAt ?? new Date(),
				reference: paid.stripeChargeId ?? paid.id,
				url: customerLink(tx.storeId, job.id),
				timeZone: store.timeZone
			}),
			about
		);
	}
	if (seller) {
		await queueMail(
			tx,
			'paid-notice',
			paidNoticeMail({
				to: seller,
				storeName: store.name,
				customerName: job.customerName,
				jobLabel: jobLabel(job.number),
				jobTitle: job.title,
				what,
				amount,
				url: `${config.origin}/app/jobs/${job.id}/payments`
			}),
			about
		);
	}
}
