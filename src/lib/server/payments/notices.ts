import { formatMoney } from '$lib/format';
import { nextAfterPayment } from '$lib/papers/next';
import { jobLabel } from '$lib/jobs/status';
import { config } from '../config';
import { customerLink } from '../customer-page';
import * as customers from '../db/queries/customers';
import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import { emailOf, readProfile, readStore } from '../db/queries/stores';
import type { StoreWriteTx } from '../db/tenant';
import { queueMail } from '../mail/queue';
import { paidNoticeMail, receiptMail, refundMail, type MoneyMailInput } from '../mail/templates';

const PURPOSE_WORDS: Record<payments.Payment['purpose'], string> = {
	deposit: 'deposit',
	balance: 'balance',
	change_order: 'change order'
};

/**
 * The job of a payment and what the customer's money e-mails say of it (the balance as the ledger
 * has it now, in this transaction); `to` is empty when the customer has no address.
 */
async function moneyMailOf(tx: StoreWriteTx, paid: payments.Payment, amountCents: number) {
	const store = await readStore(tx);
	const job = await jobs.readForStore(tx, paid.jobId);
	if (!store || !job) return null;
	const profile = await readProfile(tx);
	const money = await payments.moneyFor(tx, paid.jobId);
	const customer = await customers.read(tx, job.customerId);
	const url = await customerLink(tx, job.id);
	const mail: MoneyMailInput = {
		to: customer?.email ?? '',
		storeName: store.name,
		storePhone: profile.phone,
		customerName: customer?.name ?? job.customerName,
		jobLabel: jobLabel(job.number),
		jobTitle: job.title,
		amount: formatMoney(amountCents, paid.currency),
		// The same figures as the customer's page: paid so far and still to pay.
		paidSoFar: formatMoney(money.ledger.netPaidCents, money.currency),
		balance: formatMoney(money.ledger.balanceDueCents, money.currency),
		reference: '',
		url,
		timeZone: store.timeZone,
		logoUrl: profile.logoKey ? `${url}/logo` : undefined
	};
	return { store, job, mail, balanceDueCents: money.ledger.balanceDueCents };
}

/**
 * Queues the customer's receipt and the salesperson's notice of a payment (to those with an
 * address), in the transaction that recorded it.
 */
export async function announcePayment(tx: StoreWriteTx, paid: payments.Payment) {
	const found = await moneyMailOf(tx, paid, paid.amountCents);
	if (!found) return;
	const { store, job, mail } = found;
	const seller = await emailOf(tx, job.salespersonId);
	const what = PURPOSE_WORDS[paid.purpose];
	const about = { jobId: job.id };
	if (mail.to) {
		await queueMail(
			tx,
			'receipt',
			receiptMail({
				...mail,
				what,
				paidAt: paid.succeededAt ?? new Date(),
				reference: paid.stripeChargeId ?? paid.id,
				next: nextAfterPayment(paid.purpose, found.balanceDueCents)
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
				jobLabel: mail.jobLabel,
				jobTitle: job.title,
				what,
				amount: mail.amount,
				url: `${config.origin}/app/jobs/${job.id}/payments`
			}),
			about
		);
	}
}

const REFUND_WHY: Record<payments.RefundReason, string> = {
	overcharge: 'an overcharge (what you owe is lowered by the same amount)',
	cancellation: 'the cancelled job',
	other: 'money given back'
};

/**
 * Queues the customer's notice of a refund that has been made (to a customer with an address), in
 * the transaction that recorded it: every refund, whatever its reason or where it was made.
 */
export async function announceRefund(
	tx: StoreWriteTx,
	paid: payments.Payment,
	given: Pick<payments.Refund, 'id' | 'amountCents' | 'reason' | 'stripeRefundId'>
) {
	const found = await moneyMailOf(tx, paid, given.amountCents);
	if (!found?.mail.to) return;
	await queueMail(
		tx,
		'refund',
		refundMail({
			...found.mail,
			why: REFUND_WHY[given.reason],
			where:
				paid.method === 'card' ? 'to the card you paid with' : 'as the store arranged with you',
			refundedAt: new Date(),
			reference: given.stripeRefundId ?? given.id
		}),
		{ jobId: found.job.id }
	);
}
