import { describe, expect, it } from 'vitest';
import { inHouseWord } from '$lib/papers/testing';
import { nextAfterPayment } from '$lib/papers/next';
import { DEFAULT_PAPERS } from '$lib/papers/store-papers';
import { changeOrderMail, invitationMail, quoteMail, receiptMail, refundMail } from './templates';

// 03:30 UTC on 4 March 2027 is 9:30 PM on 3 March in Chicago (UTC−6 in winter).
const at = new Date('2027-03-04T03:30:00Z');
const common = {
	to: 'greta@example.test',
	storeName: 'Tallow Creek Floors',
	storePhone: '',
	customerName: 'Greta',
	url: 'http://127.0.0.1/c/x',
	timeZone: 'America/Chicago'
};

describe('e-mails date things in the store\u2019s time zone', () => {
	it('the receipt, with the zone named', () => {
		const mail = receiptMail({
			...common,
			jobLabel: 'J-0004',
			jobTitle: 'Two bedrooms, carpet',
			what: 'deposit',
			amount: '$500.00',
			paidSoFar: '$500.00',
			balance: '$1,200.00',
			paidAt: at,
			reference: 'ch_1'
		});
		expect(mail.text).toContain('on March 3, 2027 at 9:30 PM CST.');
	});

	it('the quote and the invitation', () => {
		const quote = quoteMail({
			...common,
			jobTitle: 'Hall',
			total: '$1.00',
			deposit: '$0.50',
			validUntil: at
		});
		expect(quote.text).toContain('It is good until March 3, 2027.');
		const invite = invitationMail({
			to: 'new@example.test',
			storeName: 'Tallow Creek Floors',
			inviterName: 'Mira',
			roleLabel: 'Sales',
			url: 'http://127.0.0.1/invite/x',
			expiresAt: at,
			timeZone: 'Asia/Tokyo'
		});
		expect(invite.text).toContain('good until March 4, 2027.');
	});
});

/** A job's money as the customer's page shows it, for the e-mails to repeat. */
const money = {
	...common,
	storeName: 'Tallow Creek Floors',
	storePhone: '555-0140',
	jobLabel: 'J-0012',
	jobTitle: 'Kitchen and hall, vinyl plank',
	logoUrl: 'http://127.0.0.1/c/x/logo',
	paidSoFar: '$1,180.00',
	balance: '$2,340.50',
	reference: 'ch_3Pq'
};

describe('the receipt, refund and change-order e-mails match the papers', () => {
	it("the receipt: the store's letterhead, the page's figures and what happens next", () => {
		const mail = receiptMail({
			...money,
			what: 'deposit',
			amount: '$1,180.00',
			paidAt: at,
			next: nextAfterPayment('deposit', 234_050)
		});
		expect(mail.fromName).toBe('Tallow Creek Floors');
		expect(mail.subject).toBe(
			'Receipt from Tallow Creek Floors: $1,180.00 for Kitchen and hall, vinyl plank'
		);
		expect(mail.text.split('\n')[0]).toBe('Tallow Creek Floors');
		expect(mail.text).toContain(
			'Received: $1,180.00\nPaid so far: $1,180.00\nStill to pay: $2,340.50'
		);
		expect(mail.text).toContain('What happens next\nYour install is booked in');
		expect(mail.html).toContain('<img src="http://127.0.0.1/c/x/logo" alt="Tallow Creek Floors"');
		expect(mail.html).toContain(
			'<h2 style="font-size:17px;margin:20px 0 8px">What happens next</h2>'
		);
		expect(inHouseWord(mail.text)).toBeUndefined();
	});

	it('the receipt that pays the job off says nothing more is due; no logo, no image', () => {
		const mail = receiptMail({
			...money,
			logoUrl: undefined,
			balance: '$0.00',
			what: 'balance',
			amount: '$2,340.50',
			paidAt: at,
			next: nextAfterPayment('balance', 0)
		});
		expect(mail.text).toContain('Still to pay: $0.00');
		expect(mail.text).toContain('nothing more is due');
		expect(mail.html).not.toContain('<img');
	});

	it('the refund: the amount back, the same figures, and when the card shows it', () => {
		const mail = refundMail({
			...money,
			amount: '$120.00',
			why: 'an overcharge (what you owe is lowered by the same amount)',
			where: 'to the card you paid with',
			refundedAt: at
		});
		expect(mail.subject).toBe(
			'Refund from Tallow Creek Floors: $120.00 for Kitchen and hall, vinyl plank'
		);
		expect(mail.text).toContain(
			'Refunded: $120.00\nPaid so far: $1,180.00\nStill to pay: $2,340.50'
		);
		expect(mail.text).toContain('on March 3, 2027 at 9:30 PM CST');
		expect(mail.text).toContain('several business days');
		expect(mail.html).toContain('alt="Tallow Creek Floors"');
	});

	it('the change order: each item in plain words with its amount, the total, what happens next', () => {
		const mail = changeOrderMail({
			...money,
			changeLabel: 'CO-1',
			totalCents: 8_500,
			total: '$85.00',
			items: [
				[
					'Close the hole in the subfloor in Kitchen so the new floor has solid support everywhere.',
					'$85.00'
				]
			]
		});
		expect(mail.text).toContain(
			'Close the hole in the subfloor in Kitchen so the new floor has solid support everywhere.: $85.00\nTotal: $85.00'
		);
		expect(mail.text).toContain('What happens next\nOnce you approve it, the installer carries on');
		expect(mail.html).toContain('alt="Tallow Creek Floors"');
		expect(inHouseWord(mail.text)).toBeUndefined();
		const credit = changeOrderMail({
			...money,
			changeLabel: 'CO-2',
			totalCents: -1_000,
			total: '$10.00'
		});
		expect(credit.text).toContain('a credit of $10.00');
		expect(credit.text).toContain('the credit comes off the balance');
	});

	it("the quote: total and deposit as on the page, and the store's next steps", () => {
		const mail = quoteMail({
			...money,
			total: '$3,520.50',
			deposit: '$1,180.00',
			validUntil: at,
			nextSteps: DEFAULT_PAPERS.nextSteps
		});
		expect(mail.text).toContain('Total: $3,520.50\nDeposit to book the install: $1,180.00');
		expect(mail.text).toContain(`What happens next\n${DEFAULT_PAPERS.nextSteps}`);
	});
});
