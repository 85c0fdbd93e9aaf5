import { describe, expect, it } from 'vitest';
import { invitationMail, quoteMail, receiptMail } from './templates';

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
