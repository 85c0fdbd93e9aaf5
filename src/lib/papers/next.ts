/**
 * "What happens next" after a payment, in the words of the customer's page: the e-mail that
 * tells the customer of the payment says the same step the page and the store's papers describe.
 */
export function nextAfterPayment(
	purpose: 'deposit' | 'balance' | 'change_order',
	balanceDueCents: number
): string | undefined {
	if (balanceDueCents <= 0 && purpose !== 'deposit') {
		return 'Your job is paid in full: nothing more is due. Thank you.';
	}
	if (purpose === 'deposit') {
		return 'Your install is booked in once the store has your deposit: we call you to agree the install days and confirm them by e-mail. Before the first day, please clear the rooms as your quote asks.';
	}
	if (purpose === 'change_order') {
		return 'The installer carries on with the work you approved. The rest is due when the work is finished.';
	}
	return 'The rest can be paid on your page, by card, or at the store.';
}
