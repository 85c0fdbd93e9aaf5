import { z } from 'zod';
import { optionalEmail, optionalText } from './fields';

/**
 * The local Stripe fake's pages and controls (only while no Stripe key is set): the hosted
 * checkout form and the JSON controls the browser tests use.
 */

export const testCheckoutSchema = z.object({
	card: z.enum(['success', 'decline'], { error: 'Choose one of the test cards' }),
	email: optionalEmail,
	name: optionalText(100)
});

const eventId = z.string().regex(/^evt_\w+$/, 'An event id (evt_…)');

export const deliverSchema = z.object({
	events: z.array(eventId).min(1, 'Name at least one event').max(100),
	/** Deliver the list this many times. */
	times: z.int().min(1).max(10).default(1),
	/** Sign as if sent this many seconds ago (Stripe's tolerance is 300). */
	lateBy: z
		.int()
		.min(0)
		.max(30 * 24 * 3600)
		.optional(),
	badSignature: z.boolean().optional()
});

export const deliveryModeSchema = z.object({ mode: z.enum(['auto', 'hold']) });

const stripeAccountId = z.string().regex(/^acct_[A-Za-z0-9]{6,}$/, 'A Stripe account id (acct_…)');

export const payoutSchema = z.object({
	account: stripeAccountId.optional(),
	currency: z
		.string()
		.regex(/^[a-zA-Z]{3}$/, 'A three-letter currency code')
		.transform((c) => c.toLowerCase())
		.optional()
});

/** A test Checkout Session made through the SDK, as the payment pages will make them. */
export const testSessionSchema = z.object({
	amount: z.int('Whole smallest units (cents, or yen)').min(1).max(99_999_999),
	currency: z
		.string()
		.regex(/^[a-zA-Z]{3}$/, 'A three-letter currency code')
		.transform((c) => c.toLowerCase())
		.default('usd'),
	name: z.string().trim().min(1).max(250).default('Test deposit'),
	customer_email: z.email().optional(),
	success_url: z.url().optional(),
	cancel_url: z.url().optional(),
	metadata: z.record(z.string().max(40), z.string().max(500)).optional(),
	/** A store's connected account (`acct_…`); the platform's own without it. */
	account: stripeAccountId.optional()
});

/**
 * The tester's form on /dev/stripe: an amount as typed (`1250.00`, or `12000` in yen), read by
 * `readMoney` in the currency chosen.
 */
export const testPaymentFormSchema = z.object({
	amount: z.string({ error: 'Enter an amount' }).trim().max(30, 'Enter an amount like 1250.00'),
	currency: z.enum(['usd', 'cad', 'eur', 'gbp', 'jpy'], { error: 'Choose a currency' }),
	name: z.string().trim().min(1, 'Say what the payment is for').max(250)
});
