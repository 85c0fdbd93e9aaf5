// Issue 5: the customer pays the deposit on the Stripe fake's checkout page; a declined card
// leaves the job as it was; the paid one makes it sold, with a receipt in the outbox; the manager's
// reconciliation flags every kind of mismatch.
import type { Page } from '@playwright/test';
import pg from 'pg';
import { customerLink, demoJob, makeStore, payByCard, personOf } from './factories';
import { expect, newPage, pageAs, signInAs, test } from './fixtures';
import { lastMailLink } from './helpers';

/**
 * A copy of the demo store of the test's own: its name, price book, people, and a Stripe account
 * of its own, so its payments, payouts and mismatches are the test's alone.
 */
const ownStore = () =>
	makeStore({
		name: 'Tallow Creek Floors',
		people: ['manager', 'sales', 'installer', 'installer'],
		priceBook: true,
		stripe: true
	});

async function customerLinkOf(page: Page, title: string) {
	await page.goto(`/app/jobs?q=${encodeURIComponent(title)}`);
	await page.getByRole('link', { name: new RegExp(title) }).click();
	await page.getByRole('link', { name: 'Open the quote' }).click();
	return page.getByLabel("The customer's link").inputValue();
}

async function payOnCheckout(customer: Page, card: 'Succeeds' | 'Declined') {
	await expect(customer).toHaveURL(/\/dev\/checkout\/cs_\w+/);
	await customer.getByRole('radio', { name: new RegExp(card) }).check();
	await customer.getByRole('button', { name: /^Pay / }).click();
}

test('a declined card leaves the job accepted; the succeeding card makes it sold, with a receipt', async ({
	page,
	context,
	browser
}) => {
	// Two trips through the checkout page: on a loaded machine it takes minutes.
	test.slow();
	const store = await ownStore();
	await demoJob(store, 'Living room oak');
	await signInAs(context, personOf(store, 'sales'));
	const link = await customerLinkOf(page, 'Living room oak');
	const jobUrl = page.url().replace(/\/quote.*$/, '');
	const customer = await newPage(browser, { viewport: { width: 390, height: 844 } });
	await customer.goto(link);
	await expect(
		customer.getByRole('heading', { name: 'Deposit to book the install' })
	).toBeVisible();

	await customer.getByRole('button', { name: 'Pay the deposit by card' }).click();
	await customer.waitForURL(/\/dev\/checkout\/cs_\w+/);
	const session = /cs_\w+/.exec(customer.url())![0];
	await payOnCheckout(customer, 'Declined');
	await expect(customer.getByRole('alert')).toContainText('Your card was declined.');
	await customer.goto(link);
	await expect(customer.getByText('Your card was declined').first()).toBeVisible();
	await page.goto(jobUrl);
	await expect(page.getByText('Accepted', { exact: true }).first()).toBeVisible();

	// Trying again reaches the same checkout: one session, however many tries or tabs.
	await customer.getByRole('button', { name: 'Pay the deposit by card' }).click();
	await customer.waitForURL(/\/dev\/checkout\/cs_\w+/);
	expect(customer.url()).toContain(session);
	await payOnCheckout(customer, 'Succeeds');
	// Back on the customer's page at the address given to Stripe, with nothing stray after it.
	await expect(customer).toHaveURL(new RegExp(`/c/[^?]+\\?paid=${session}$`));
	await expect(customer.getByText('Payment received')).toBeVisible();
	await expect(customer.getByRole('heading', { name: 'Paid so far' })).toBeVisible();

	await page.goto(jobUrl);
	await expect(page.getByText('Sold', { exact: true }).first()).toBeVisible();
	await expect(page.getByText('Accepted → Sold')).toBeVisible();
	await page.getByRole('link', { name: 'Open the payments' }).click();
	await expect(page.getByText('Deposit · Card (online)')).toBeVisible();
	await expect(page.getByRole('cell', { name: 'Paid', exact: true })).toBeVisible();

	const receipt = await newPage(browser);
	await lastMailLink(receipt, 'hana.ruskin@example.com');
	await expect(
		receipt.getByRole('listitem').filter({ hasText: 'To hana.ruskin@example.com' }).first()
	).toContainText('Receipt from Tallow Creek Floors');
	await expect(receipt.getByText(/paid the deposit for J-\d+/).first()).toBeVisible();
});

test('the manager records a cheque and refunds part of it, never more than was paid', async ({
	page,
	context
}) => {
	const store = await ownStore();
	await demoJob(store, 'Laundry sheet vinyl', { installer: personOf(store, 'installer', 1) });
	await signInAs(context, personOf(store, 'manager'));
	await page.goto('/app/jobs?q=Laundry sheet vinyl');
	await page.getByRole('link', { name: /Laundry sheet vinyl/ }).click();
	await page.getByRole('link', { name: 'Open the payments' }).click();
	const due = await page.getByTestId('ledger-balance-due').innerText();
	await page.getByLabel('For').selectOption('balance');
	await page.getByLabel('Paid by').selectOption('cheque');
	await page.getByLabel('Amount ($)').last().fill('25.00');
	await page.getByRole('button', { name: 'Record the payment' }).click();
	await expect(
		page.getByText('Write down the cheque number, slip or transfer reference')
	).toBeVisible();
	await expect(page.getByLabel('Amount ($)').last()).toHaveValue('25.00');
	await page.getByLabel('Reference').fill('Cheque 1043');
	await page.getByRole('button', { name: 'Record the payment' }).click();
	await expect(page.getByText('Payment recorded.')).toBeVisible();
	expect(await page.getByTestId('ledger-balance-due').innerText()).not.toBe(due);

	const cheque = page.locator('details').filter({ hasText: /\$25\.00 left/ });
	await cheque.locator('summary').click();
	await cheque.getByLabel('Amount ($)').fill('30');
	await cheque.getByLabel('Reason').selectOption('overcharge');
	await cheque.getByRole('button', { name: 'Record the refund' }).click();
	await expect(page.getByText('More than is left on this payment.')).toBeVisible();
	await cheque.getByLabel('Amount ($)').fill('10');
	await cheque.getByRole('button', { name: 'Record the refund' }).click();
	await expect(page.getByText('Refund made.')).toBeVisible();
	await expect(page.getByText('−$10.00 refunded')).toBeVisible();
	// An overcharge refund is a credit line: the balance due did not move, and the cheque is partly refunded.
	await expect(page.getByText('Partly refunded')).toBeVisible();
	await expect(page.getByTestId('ledger-credits')).toHaveText('$10.00');
});

test('the reconciliation flags a mismatch of each kind, and exports the period', async ({
	page,
	context,
	request,
	baseURL,
	browser
}) => {
	// A deposit paid by card that matches; then one mismatch of each kind beside it.
	const store = await ownStore();
	await payByCard(request, customerLink(store, await demoJob(store, 'Living room oak')));
	const loose = await request.post('/dev/stripe/checkout-sessions', {
		headers: { 'content-type': 'application/json', origin: baseURL! },
		data: {
			amount: 12_345,
			name: 'Counter sale',
			account: store.stripeAccount,
			customer_email: 'walk-in@example.com'
		}
	});
	expect(loose.status()).toBe(200);
	await page.goto((await loose.json()).url);
	await payOnCheckout(page, 'Succeeds');
	await page.waitForURL(/\/dev\/stripe\?paid=cs_/);

	const db = new pg.Client({ connectionString: process.env.DATABASE_OWNER_URL });
	await db.connect();
	try {
		await db.query('begin');
		await db.query(`select set_config('app.store_id', $1, true)`, [store.id]);
		// A card payment in the ledger that Stripe never saw, and one whose amount was changed.
		const paid = await db.query(
			`select job_id, id from payment where method = 'card' and status = 'succeeded' limit 1`
		);
		await db.query(
			`insert into payment (id, organization_id, job_id, purpose, method, status, currency, amount_cents, stripe_charge_id, succeeded_at)
			 values (gen_random_uuid(), $1, $2, 'balance', 'card', 'succeeded', 'USD', 7000, 'ch_not_in_stripe', now())`,
			[store.id, paid.rows[0].job_id]
		);
		await db.query(`update payment set amount_cents = amount_cents - 500 where id = $1`, [
			paid.rows[0].id
		]);
		await db.query('commit');
	} finally {
		await db.end();
	}
	expect(
		(
			await request.post('/dev/stripe/payouts', {
				headers: { 'content-type': 'application/json', origin: baseURL! },
				data: { account: store.stripeAccount }
			})
		).status()
	).toBe(200);

	await signInAs(context, personOf(store, 'manager'));
	await page.goto('/app/payments');
	await expect(page.getByRole('heading', { name: 'Payments', level: 1 })).toBeVisible();
	await expect(page.getByTestId('count-amount_differs')).toHaveText('1');
	await expect(page.getByTestId('count-stripe_only')).toHaveText('1');
	await expect(page.getByTestId('count-ledger_only')).toHaveText('1');
	await expect(page.getByText('No ledger payment for this charge')).toBeVisible();
	await expect(page.getByText(/Stripe has no such charge in the period/)).toBeVisible();
	await expect(page.getByText(/Stripe charged \$[\d,.]+, the ledger has \$[\d,.]+/)).toBeVisible();
	await expect(page.getByRole('region', { name: 'Payouts' }).getByRole('row')).toHaveCount(2);

	await page.getByTestId('count-stripe_only').click();
	await expect(page.getByText('No ledger payment for this charge')).toBeVisible();
	await expect(page.getByText(/Stripe has no such charge/)).toHaveCount(0);

	const csv = await page.request.get('/app/payments/export.csv');
	expect(csv.headers()['content-type']).toContain('text/csv');
	const text = await csv.text();
	expect(text.split('\n')[0]).toBe(
		'kind,status,date,job,stripe_id,payment_id,currency,stripe_amount,ledger_amount,stripe_fee,ledger_fee,note'
	);
	expect(text).toContain('stripe_only');
	expect(text).toContain('123.45');
	expect(text).toMatch(/^payout,paid,/m);

	// A salesperson may not reconcile.
	const sales = await pageAs(browser, personOf(store, 'sales'));
	expect((await sales.goto('/app/payments'))?.status()).toBe(403);
});
