import { formatMoney } from '$lib/format';
import { jobLabel } from '$lib/jobs/status';
import { config } from '../config';
import { customerLink } from '../customer-page';
import * as customers from '../db/queries/customers';
import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import { emailOf, readProfile, readStore } from '../db/queries/stores';
import { readInStore, type StoreTx } from '../db/tenant';
import { mailer } from '../mail';
import { paidNoticeMail, receiptMail, type Mail } from '../mail/templates';

const PURPOSE_WORDS: Record<payments.Payment['purpose'], string> = {
	deposit: 'deposit',
	balance: 'balance',
	change_order: 'change order'
};

/** The customer's receipt and the salesperson's notice of a payment (those with an address). */
export async function paymentMailsFor(tx: StoreTx, paid: payments.Payment): Promise<Mail[]> {
	const store = await readStore(tx);
	const job = await jobs.readForStore(tx, paid.jobId);
	if (!store || !job) return [];
	const profile = await readProfile(tx);
	const money = await payments.moneyFor(tx, paid.jobId);
	const customer = await customers.read(tx, job.customerId);
	const seller = await emailOf(tx, job.salespersonId);
	const amount = formatMoney(paid.amountCents, paid.currency);
	const what = PURPOSE_WORDS[paid.purpose];
	const mails: Mail[] = [];
	if (customer?.email) {
		mails.push(
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
				url: customerLink(tx.storeId, job.id)
			})
		);
	}
	if (seller) {
		mails.push(
			paidNoticeMail({
				to: seller,
				storeName: store.name,
				customerName: job.customerName,
				jobLabel: jobLabel(job.number),
				jobTitle: job.title,
				what,
				amount,
				url: `${config.origin}/app/jobs/${job.id}/payments`
			})
		);
	}
	return mails;
}

/** Sends a payment's receipt and notice; a failed e-mail never undoes a payment. */
export async function announcePayment(storeId: string, paid: payments.Payment) {
	try {
		const mails = await readInStore(storeId, (tx) => paymentMailsFor(tx, paid));
		for (const mail of mails) await mailer(mail);
	} catch (e) {
		console.error(`Could not send the receipt for payment ${paid.id}`, e);
	}
}
