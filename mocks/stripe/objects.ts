import type Stripe from 'stripe';
import { newId, now, PREFIX, secret } from './ids';
import { processingFee } from './money';

/**
 * Builders of Stripe objects in the shapes of the API version the installed SDK pins (typed with
 * the SDK's own types, so a field Stripe has is never forgotten). Fields for features the fake
 * does not model (tax, discounts, shipping, Connect…) carry Stripe's empty values.
 */

/** Stripe sends `*_decimal` amounts as strings; the SDK turns them into its Decimal type. */
const decimal = (n: number) => String(n) as unknown as Stripe.Decimal;

export function customerObject(fields: {
	email: string | null;
	name: string | null;
	description: string | null;
	phone: string | null;
	metadata: Record<string, string>;
}): Stripe.Customer {
	return {
		id: newId(PREFIX.customer),
		object: 'customer',
		address: null,
		balance: 0,
		created: now(),
		currency: null,
		default_source: null,
		delinquent: false,
		description: fields.description,
		discount: null,
		email: fields.email,
		invoice_prefix: secret().slice(0, 8).toUpperCase(),
		invoice_settings: {
			custom_fields: null,
			default_payment_method: null,
			footer: null,
			rendering_options: null
		},
		livemode: false,
		metadata: fields.metadata,
		name: fields.name,
		next_invoice_sequence: 1,
		phone: fields.phone,
		preferred_locales: [],
		shipping: null,
		tax_exempt: 'none',
		test_clock: null
	};
}

export interface LineItemInput {
	name: string;
	description: string | null;
	currency: string;
	unitAmount: number;
	quantity: number;
}

export function lineItemObject(input: LineItemInput): Stripe.LineItem {
	const created = now();
	const total = input.unitAmount * input.quantity;
	return {
		id: newId(PREFIX.lineItem),
		object: 'item',
		adjustable_quantity: null,
		amount_discount: 0,
		amount_subtotal: total,
		amount_tax: 0,
		amount_total: total,
		currency: input.currency,
		description: input.name,
		metadata: {},
		price: {
			id: newId(PREFIX.price),
			object: 'price',
			active: false,
			billing_scheme: 'per_unit',
			created,
			currency: input.currency,
			custom_unit_amount: null,
			livemode: false,
			lookup_key: null,
			metadata: {},
			nickname: null,
			product: newId(PREFIX.product),
			recurring: null,
			tax_behavior: 'unspecified',
			tiers_mode: null,
			transform_quantity: null,
			type: 'one_time',
			unit_amount: input.unitAmount,
			unit_amount_decimal: decimal(input.unitAmount)
		},
		quantity: input.quantity
	};
}

export interface SessionInput {
	origin: string;
	currency: string;
	amount: number;
	customer: string | null;
	customerEmail: string | null;
	successUrl: string | null;
	cancelUrl: string | null;
	clientReferenceId: string | null;
	metadata: Record<string, string>;
	expiresAt: number;
}

export function sessionObject(input: SessionInput): Stripe.Checkout.Session {
	const id = newId(PREFIX.session);
	return {
		id,
		object: 'checkout.session',
		adaptive_pricing: null,
		after_expiration: null,
		allow_promotion_codes: null,
		allowed_payment_method_types: null,
		amount_subtotal: input.amount,
		amount_total: input.amount,
		automatic_tax: { enabled: false, liability: null, provider: null, status: null },
		billing_address_collection: null,
		cancel_url: input.cancelUrl,
		client_reference_id: input.clientReferenceId,
		client_secret: null,
		collected_information: null,
		consent: null,
		consent_collection: null,
		created: now(),
		currency: input.currency,
		currency_conversion: null,
		custom_fields: [],
		custom_text: {
			after_submit: null,
			shipping_address: null,
			submit: null,
			terms_of_service_acceptance: null
		},
		customer: input.customer,
		customer_account: null,
		customer_creation: input.customer ? null : 'if_required',
		customer_details: null,
		customer_email: input.customerEmail,
		discounts: [],
		expires_at: input.expiresAt,
		integration_identifier: null,
		invoice: null,
		invoice_creation: null,
		livemode: false,
		locale: null,
		managed_payments: null,
		metadata: input.metadata,
		mode: 'payment',
		origin_context: null,
		payment_intent: null,
		payment_link: null,
		payment_method_collection: 'if_required',
		payment_method_configuration_details: null,
		payment_method_options: { card: { request_three_d_secure: 'automatic' } },
		payment_method_types: ['card'],
		payment_status: 'unpaid',
		permissions: null,
		recovered_from: null,
		saved_payment_method_options: null,
		setup_intent: null,
		shipping_address_collection: null,
		shipping_cost: null,
		shipping_options: [],
		status: 'open',
		submit_type: null,
		subscription: null,
		success_url: input.successUrl,
		total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
		ui_mode: 'hosted',
		url: `${input.origin}/dev/checkout/${id}`,
		wallet_options: null
	};
}

export interface PaymentIntentInput {
	amount: number;
	currency: string;
	customer: string | null;
	description: string | null;
	metadata: Record<string, string>;
	receiptEmail: string | null;
}

export function paymentIntentObject(input: PaymentIntentInput): Stripe.PaymentIntent {
	const id = newId(PREFIX.paymentIntent);
	return {
		id,
		object: 'payment_intent',
		allowed_payment_method_types: null,
		amount: input.amount,
		amount_capturable: 0,
		amount_details: { tip: {} },
		amount_received: 0,
		application: null,
		application_fee_amount: null,
		automatic_payment_methods: null,
		canceled_at: null,
		cancellation_reason: null,
		capture_method: 'automatic_async',
		client_secret: `${id}_secret_${secret()}`,
		confirmation_method: 'automatic',
		created: now(),
		currency: input.currency,
		customer: input.customer,
		customer_account: null,
		description: input.description,
		excluded_payment_method_types: null,
		last_payment_error: null,
		latest_charge: null,
		livemode: false,
		managed_payments: null,
		metadata: input.metadata,
		next_action: null,
		on_behalf_of: null,
		payment_method: null,
		payment_method_configuration_details: null,
		payment_method_options: {
			card: {
				installments: null,
				mandate_options: null,
				network: null,
				request_three_d_secure: 'automatic'
			}
		},
		payment_method_types: ['card'],
		payment_record: null,
		processing: null,
		receipt_email: input.receiptEmail,
		review: null,
		setup_future_usage: null,
		shipping: null,
		source: null,
		statement_descriptor: null,
		statement_descriptor_suffix: null,
		status: 'requires_payment_method',
		transfer_data: null,
		transfer_group: null
	};
}

/** A test card as the fake knows it. */
export interface TestCard {
	number: string;
	last4: string;
	brand: 'visa';
	/** Null for a card that succeeds; else the issuer's decline code. */
	declineCode: string | null;
}

export function chargeObject(input: {
	intent: Stripe.PaymentIntent;
	card: TestCard;
	paymentMethod: string;
	billing: { email: string | null; name: string | null };
	balanceTransaction: string | null;
}): Stripe.Charge {
	const { intent, card } = input;
	const declined = card.declineCode !== null;
	const year = new Date().getUTCFullYear() + 3;
	const id = newId(PREFIX.charge);
	return {
		id,
		object: 'charge',
		amount: intent.amount,
		amount_captured: declined ? 0 : intent.amount,
		amount_refunded: 0,
		application: null,
		application_fee: null,
		application_fee_amount: null,
		balance_transaction: input.balanceTransaction,
		billing_details: {
			address: null,
			email: input.billing.email,
			name: input.billing.name,
			phone: null,
			tax_id: null
		},
		calculated_statement_descriptor: 'FLUSHLINE TEST',
		captured: !declined,
		created: now(),
		currency: intent.currency,
		customer: typeof intent.customer === 'string' ? intent.customer : (intent.customer?.id ?? null),
		description: intent.description,
		disputed: false,
		failure_balance_transaction: null,
		failure_code: declined ? 'card_declined' : null,
		failure_message: declined ? 'Your card was declined.' : null,
		fraud_details: {},
		livemode: false,
		metadata: { ...intent.metadata },
		on_behalf_of: null,
		outcome: declined
			? {
					advice_code: 'try_again_later',
					network_advice_code: null,
					network_decline_code: null,
					network_status: 'declined_by_network',
					reason: card.declineCode,
					risk_level: 'normal',
					risk_score: 20,
					seller_message: 'The bank did not return any further details with this decline.',
					type: 'issuer_declined'
				}
			: {
					advice_code: null,
					network_advice_code: null,
					network_decline_code: null,
					network_status: 'approved_by_network',
					reason: null,
					risk_level: 'normal',
					risk_score: 20,
					seller_message: 'Payment complete.',
					type: 'authorized'
				},
		paid: !declined,
		payment_intent: intent.id,
		payment_method: input.paymentMethod,
		payment_method_details: {
			type: 'card',
			card: {
				amount_authorized: declined ? null : intent.amount,
				authorization_code: declined ? null : String(100000 + (intent.amount % 900000)),
				brand: card.brand,
				checks: { address_line1_check: null, address_postal_code_check: null, cvc_check: 'pass' },
				country: 'US',
				electronic_commerce_indicator: null,
				exp_month: 12,
				exp_year: year,
				extended_authorization: { status: 'disabled' },
				fingerprint: `fake${card.last4}`,
				funding: 'credit',
				incremental_authorization: { status: 'unavailable' },
				installments: null,
				last4: card.last4,
				mandate: null,
				multicapture: { status: 'unavailable' },
				network: card.brand,
				network_token: { used: false },
				network_transaction_id: declined ? null : secret().slice(0, 15),
				overcapture: { maximum_amount_capturable: intent.amount, status: 'unavailable' },
				regulated_status: 'unregulated',
				three_d_secure: null,
				transaction_link_id: null,
				wallet: null
			}
		},
		receipt_email: intent.receipt_email,
		receipt_number: null,
		receipt_url: declined ? null : `https://pay.stripe.com/receipts/fake/${id}`,
		refunded: false,
		review: null,
		shipping: null,
		source: null,
		source_transfer: null,
		statement_descriptor: null,
		statement_descriptor_suffix: null,
		status: declined ? 'failed' : 'succeeded',
		transfer_data: null,
		transfer_group: null
	};
}

export function refundObject(input: {
	charge: Stripe.Charge;
	amount: number;
	reason: Stripe.Refund.Reason | null;
	metadata: Record<string, string>;
	balanceTransaction: string;
}): Stripe.Refund {
	const { charge } = input;
	return {
		id: newId(PREFIX.refund),
		object: 'refund',
		amount: input.amount,
		balance_transaction: input.balanceTransaction,
		charge: charge.id,
		created: now(),
		currency: charge.currency,
		customer: typeof charge.customer === 'string' ? charge.customer : (charge.customer?.id ?? null),
		customer_account: null,
		destination_details: {
			type: 'card',
			card: {
				reference_status: 'pending',
				reference_type: 'acquirer_reference_number',
				type: 'refund'
			}
		},
		metadata: input.metadata,
		payment_intent:
			typeof charge.payment_intent === 'string'
				? charge.payment_intent
				: (charge.payment_intent?.id ?? null),
		payment_method: charge.payment_method,
		reason: input.reason,
		receipt_number: null,
		source_transfer_reversal: null,
		status: 'succeeded',
		transfer_reversal: null
	};
}

/**
 * A balance transaction. Charges carry the fake's fee (see `processingFee`); refunds and payouts
 * carry none. Funds are available at once in the fake (Stripe holds card funds for some days).
 */
export function balanceTransactionObject(input: {
	type: 'charge' | 'refund' | 'payout';
	amount: number;
	currency: string;
	source: string;
	description: string | null;
}): Stripe.BalanceTransaction {
	const created = now();
	const fee = input.type === 'charge' ? processingFee(input.amount) : 0;
	return {
		id: newId(PREFIX.balanceTransaction),
		object: 'balance_transaction',
		amount: input.amount,
		available_on: created,
		balance_type: 'payments',
		created,
		currency: input.currency,
		description: input.description,
		exchange_rate: null,
		fee,
		fee_details: fee
			? [
					{
						amount: fee,
						application: null,
						currency: input.currency,
						description: 'Stripe processing fees',
						type: 'stripe_fee'
					}
				]
			: [],
		net: input.amount - fee,
		reporting_category: input.type,
		source: input.source,
		status: 'available',
		type: input.type
	};
}

export function payoutObject(input: {
	id: string;
	amount: number;
	currency: string;
	balanceTransaction: string;
}): Stripe.Payout {
	const created = now();
	return {
		id: input.id,
		object: 'payout',
		amount: input.amount,
		application_fee: null,
		application_fee_amount: null,
		arrival_date: created,
		automatic: true,
		balance_transaction: input.balanceTransaction,
		created,
		currency: input.currency,
		description: 'STRIPE PAYOUT',
		destination: 'ba_fake_bank_account',
		failure_balance_transaction: null,
		failure_code: null,
		failure_message: null,
		livemode: false,
		metadata: {},
		method: 'standard',
		original_payout: null,
		payout_method: null,
		reconciliation_status: 'completed',
		reversed_by: null,
		source_type: 'card',
		statement_descriptor: null,
		status: 'paid',
		trace_id: { status: 'supported', value: `FAKE${secret().slice(0, 10).toUpperCase()}` },
		type: 'bank'
	};
}

export function eventObject(input: {
	type: Stripe.Event.Type;
	object: { id: string; object: string };
	previous?: Record<string, unknown>;
	request: Stripe.Event.Request;
	apiVersion: string;
	/** The connected account the object lives in (Connect events carry it). */
	account?: string | null;
}): Stripe.Event {
	const event: Stripe.EventBase = {
		id: newId(PREFIX.event),
		object: 'event',
		...(input.account ? { account: input.account } : {}),
		api_version: input.apiVersion,
		created: now(),
		data: {
			object: structuredClone(input.object),
			...(input.previous ? { previous_attributes: input.previous } : {})
		},
		livemode: false,
		pending_webhooks: 1,
		request: input.request,
		type: input.type
	};
	return event as Stripe.Event;
}
