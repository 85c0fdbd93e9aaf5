// Card payments for integration tests: a store with its own Stripe account and an accepted quote,
// its deposit's Checkout Session, and the events the Stripe fake made for it.
import * as customers from '$lib/server/db/queries/customers';
import { saveStripeAccount } from '$lib/server/db/queries/settings';
import { inStore } from '$lib/server/db/tenant';
import { startCheckout } from '$lib/server/payments/checkout';
import type { stripeFakeForTests } from '$mocks/stripe/testing';
import { makeQuotedJob, makeStore, sendAndAccept, unique, type TestStore } from './factories';

type Fake = ReturnType<typeof stripeFakeForTests>;

/** A Stripe account id no other test has. */
export const newAccount = () => `acct_${unique('s').replace(/[^a-z0-9]/gi, '')}`;

/** A store with its own Stripe account and an accepted quote, ready for the deposit. */
export async function acceptedJob(name = 'Card Floors') {
	const store = await makeStore(name);
	const account = newAccount();
	await inStore(store.id, (tx) => saveStripeAccount(tx, account));
	const made = await makeQuotedJob(store);
	await inStore(store.id, (tx) =>
		customers.update(tx, made.customer.id, { email: 'customer@test.example' })
	);
	await sendAndAccept(store, made, 'customer@test.example');
	return { store, account, ...made };
}

/** The deposit's Checkout Session id, as the customer's Pay button makes it. */
export async function depositSession(t: Fake, store: TestStore, jobId: string) {
	const started = await startCheckout(
		{ storeId: store.id, jobId, purpose: 'deposit', linkToken: 'tok' },
		t.stripe
	);
	if (!started.ok) throw new Error(`checkout: ${started.reason}`);
	return /\/dev\/checkout\/(cs_[\w]+)/.exec(started.url)![1];
}

/** The events Stripe made in an account since `after`, oldest first (as delivered). */
export function eventsFor(t: Fake, account: string, after: number) {
	return t.fake
		.events()
		.filter((e) => e.account === account && e.created >= after)
		.reverse();
}
