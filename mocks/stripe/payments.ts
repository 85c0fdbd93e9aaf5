import type Stripe from 'stripe';
import { invalid, missingParam, StripeFakeError } from './errors';
import type { Reader } from './form';
import { newId, now, PREFIX } from './ids';
import { checkChargeAmount, formatAmount, readCurrency } from './money';
import {
	balanceTransactionObject,
	chargeObject,
	customerObject,
	lineItemObject,
	paymentIntentObject,
	payoutObject,
	refundObject,
	sessionObject,
	type LineItemInput,
	type TestCard
} from './objects';
import type { Store } from './store';
import type { Webhooks } from './webhooks';

/**
 * The two test cards of the fake, with Stripe's published test numbers
 * (https://docs.stripe.com/testing#cards and #declined-payments) and test PaymentMethod ids.
 */
export const TEST_CARDS = {
	success: { number: '4242424242424242', last4: '4242', brand: 'visa', declineCode: null },
	decline: {
		number: '4000000000000002',
		last4: '0002',
		brand: 'visa',
		declineCode: 'generic_decline'
	}
} satisfies Record<string, TestCard>;

export type TestCardName = keyof typeof TEST_CARDS;

const TEST_PAYMENT_METHODS: Record<string, TestCardName> = {
	pm_card_visa: 'success',
	pm_card_chargeDeclined: 'decline'
};

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/** What a payment attempt on the hosted page came to. */
export type PayResult =
	| { outcome: 'paid'; session: Stripe.Checkout.Session; events: string[] }
	| {
			outcome: 'declined';
			session: Stripe.Checkout.Session;
			error: Stripe.PaymentIntent.LastPaymentError;
			events: string[];
	  }
	| { outcome: 'already_paid'; session: Stripe.Checkout.Session; events: [] }
	| { outcome: 'expired'; session: Stripe.Checkout.Session; events: [] };

const idOf = (value: string | { id: string } | null) =>
	typeof value === 'string' ? value : (value?.id ?? null);

function readUrl(reader: Reader, key: string) {
	const value = reader.string(key, { max: 5000 });
	if (value === undefined) return null;
	let url: URL | null;
	try {
		url = new URL(value.replace('{CHECKOUT_SESSION_ID}', 'x'));
	} catch {
		url = null;
	}
	if (!url || !['http:', 'https:'].includes(url.protocol))
		throw invalid('Not a valid URL', reader.name(key), 'url_invalid');
	return value;
}

function readEmail(reader: Reader, key: string) {
	const value = reader.string(key, { max: 512 });
	if (value === undefined) return null;
	if (!EMAIL.test(value))
		throw invalid(`Invalid email address: ${value}`, reader.name(key), 'email_invalid');
	return value;
}

/**
 * What the fake does: customers, Checkout Sessions and their payment, PaymentIntents, charges
 * with balance transactions, refunds and payouts. Every change records Stripe's events; callers
 * save the store afterwards.
 */
export class Payments {
	constructor(
		private readonly store: Store,
		private readonly webhooks: Webhooks,
		private readonly origin: string
	) {}

	private get state() {
		return this.store.state;
	}

	// ---- customers ----

	createCustomer(reader: Reader, request: Stripe.Event.Request) {
		reader.only('email', 'name', 'description', 'phone', 'metadata', 'expand');
		const customer = customerObject({
			email: readEmail(reader, 'email'),
			name: reader.string('name', { max: 256 }) ?? null,
			description: reader.string('description', { max: 350 }) ?? null,
			phone: reader.string('phone', { max: 20 }) ?? null,
			metadata: reader.metadata()
		});
		this.state.customers[customer.id] = customer;
		this.webhooks.record('customer.created', customer, request);
		return customer;
	}

	updateCustomer(id: string, reader: Reader, request: Stripe.Event.Request) {
		reader.only('email', 'name', 'description', 'phone', 'metadata', 'expand');
		const customer = this.store.get('customers', id);
		const previous: Record<string, unknown> = {};
		const set = <K extends 'email' | 'name' | 'description' | 'phone'>(
			key: K,
			value: string | null | undefined
		) => {
			if (value === undefined || value === customer[key]) return;
			previous[key] = customer[key] ?? null;
			customer[key] = value;
		};
		if (reader.has('email'))
			set('email', reader.params.email === '' ? null : readEmail(reader, 'email'));
		for (const key of ['name', 'description', 'phone'] as const) {
			if (reader.has(key))
				set(key, reader.params[key] === '' ? null : reader.string(key, { max: 350 }));
		}
		if (reader.has('metadata')) {
			const metadata = reader.metadata('metadata', customer.metadata);
			previous.metadata = customer.metadata;
			customer.metadata = metadata;
		}
		if (Object.keys(previous).length)
			this.webhooks.record('customer.updated', customer, request, previous);
		return customer;
	}

	// ---- Checkout Sessions ----

	createSession(reader: Reader) {
		reader.only(
			'mode',
			'line_items',
			'customer',
			'customer_email',
			'customer_creation',
			'success_url',
			'cancel_url',
			'metadata',
			'payment_intent_data',
			'client_reference_id',
			'expires_at',
			'payment_method_types',
			'expand'
		);
		const mode = reader.required('mode');
		if (mode !== 'payment') {
			throw invalid('The local Stripe fake takes mode=payment only.', 'mode');
		}
		const items = reader.array('line_items', { required: true });
		if (!items.length)
			throw invalid('Missing required param: line_items.', 'line_items', 'parameter_missing');
		if (items.length > 100)
			throw invalid('A Checkout Session can have up to 100 line items.', 'line_items');
		const inputs: LineItemInput[] = items.map((item) => {
			item.only('price_data', 'quantity', 'price');
			if (item.has('price')) {
				throw invalid(
					'The local Stripe fake takes line items with price_data only.',
					item.name('price')
				);
			}
			const priceData = item
				.object('price_data', { required: true })!
				.only('currency', 'unit_amount', 'product_data');
			const product = priceData
				.object('product_data', { required: true })!
				.only('name', 'description', 'metadata');
			return {
				name: product.required('name', 250),
				description: product.string('description', { max: 500 }) ?? null,
				currency: readCurrency(priceData.params.currency, priceData.name('currency')),
				unitAmount: priceData.integer('unit_amount', { required: true, min: 0 })!,
				quantity: item.integer('quantity', { required: true, min: 1 })!
			};
		});
		const currency = inputs[0].currency;
		inputs.forEach((input, i) => {
			if (input.currency !== currency) {
				throw invalid(
					'All line items of a Checkout Session must have the same currency.',
					`line_items[${i}][price_data][currency]`
				);
			}
		});
		const amount = inputs.reduce((sum, input) => sum + input.unitAmount * input.quantity, 0);
		checkChargeAmount(amount, currency, 'line_items');

		const customer = reader.string('customer');
		if (customer && !this.state.customers[customer])
			throw missingParam('customer', customer, 'customer');
		const customerEmail = readEmail(reader, 'customer_email');
		if (customer && customerEmail) {
			throw invalid(
				'You may only specify one of these parameters: customer, customer_email.',
				'customer_email'
			);
		}
		const types = reader.strings('payment_method_types');
		types.forEach((type, i) => {
			if (type !== 'card') {
				throw invalid(
					`The local Stripe fake takes card payments only; got ${type}.`,
					`payment_method_types[${i}]`
				);
			}
		});
		const created = now();
		const expiresAt = reader.integer('expires_at') ?? created + 24 * 3600;
		if (expiresAt < created + 30 * 60) {
			throw invalid(
				'The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.',
				'expires_at'
			);
		}
		if (expiresAt > created + 24 * 3600) {
			throw invalid(
				'The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.',
				'expires_at'
			);
		}
		const intentData = reader
			.object('payment_intent_data')
			?.only('metadata', 'description', 'receipt_email');
		const session = sessionObject({
			origin: this.origin,
			currency,
			amount,
			customer: customer ?? null,
			customerEmail,
			successUrl: readUrl(reader, 'success_url'),
			cancelUrl: readUrl(reader, 'cancel_url'),
			clientReferenceId: reader.string('client_reference_id', { max: 200 }) ?? null,
			metadata: reader.metadata(),
			expiresAt
		});
		session.customer_creation =
			reader.oneOf('customer_creation', ['always', 'if_required'] as const) ??
			(customer ? null : 'if_required');
		this.state.checkoutSessions[session.id] = session;
		this.state.lineItems[session.id] = inputs.map(lineItemObject);
		this.state.intentData[session.id] = {
			metadata: intentData?.metadata() ?? {},
			description: intentData?.string('description', { max: 1000 }) ?? null,
			receiptEmail: intentData ? readEmail(intentData, 'receipt_email') : null
		};
		return session;
	}

	expireSession(id: string, request: Stripe.Event.Request) {
		const session = this.store.get('checkoutSessions', id);
		if (session.status !== 'open') {
			throw invalid(
				`Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of "${session.status}".`,
				undefined
			);
		}
		this.expire(session, request);
		return session;
	}

	private expire(
		session: Stripe.Checkout.Session,
		request: Stripe.Event.Request = { id: null, idempotency_key: null }
	) {
		session.status = 'expired';
		session.url = null;
		const intentId = idOf(session.payment_intent);
		const intent = intentId ? this.state.paymentIntents[intentId] : undefined;
		if (intent && intent.status !== 'succeeded') {
			intent.status = 'canceled';
			intent.canceled_at = now();
			intent.cancellation_reason = 'automatic';
			this.webhooks.record('payment_intent.canceled', intent);
		}
		this.webhooks.record('checkout.session.expired', session, request);
	}

	/** Expires open sessions whose `expires_at` has passed, as Stripe does on its own. Returns whether any did. */
	sweepExpired(): boolean {
		const time = now();
		let changed = false;
		for (const session of Object.values(this.state.checkoutSessions)) {
			if (session.status === 'open' && session.expires_at <= time) {
				this.expire(session);
				changed = true;
			}
		}
		return changed;
	}

	/**
	 * A payment on the hosted page with one of the test cards. Paying a session that is already
	 * paid (a second tab) charges nothing and says so; a declined card leaves the session open.
	 */
	pay(
		sessionId: string,
		cardName: TestCardName,
		billing: { email: string | null; name: string | null }
	): PayResult {
		const session = this.store.get('checkoutSessions', sessionId);
		if (session.status === 'open' && session.expires_at <= now()) this.expire(session);
		if (session.status === 'complete') return { outcome: 'already_paid', session, events: [] };
		if (session.status !== 'open') return { outcome: 'expired', session, events: [] };

		const before = new Set(Object.keys(this.state.events));
		const email = billing.email ?? session.customer_email ?? this.customerEmail(session);
		let intent = idOf(session.payment_intent)
			? this.state.paymentIntents[idOf(session.payment_intent)!]
			: undefined;
		if (!intent) {
			const data = this.state.intentData[session.id] ?? {
				metadata: {},
				description: null,
				receiptEmail: null
			};
			intent = paymentIntentObject({
				amount: session.amount_total ?? 0,
				currency: session.currency ?? 'usd',
				customer: idOf(session.customer),
				description: data.description,
				metadata: data.metadata,
				receiptEmail: data.receiptEmail
			});
			this.state.paymentIntents[intent.id] = intent;
			session.payment_intent = intent.id;
			this.webhooks.record('payment_intent.created', intent);
		}
		const charge = this.attempt(intent, TEST_CARDS[cardName], `pm_${newId('').slice(0, 24)}`, {
			email,
			name: billing.name
		});
		const events = () => Object.keys(this.state.events).filter((id) => !before.has(id));
		if (!charge.paid) {
			return { outcome: 'declined', session, error: intent.last_payment_error!, events: events() };
		}
		if (session.customer_creation === 'always' && !session.customer) {
			const customer = customerObject({
				email,
				name: billing.name,
				description: null,
				phone: null,
				metadata: {}
			});
			this.state.customers[customer.id] = customer;
			this.webhooks.record('customer.created', customer);
			session.customer = customer.id;
			intent.customer = customer.id;
			charge.customer = customer.id;
		}
		session.status = 'complete';
		session.payment_status = 'paid';
		session.url = null;
		session.customer_details = {
			address: null,
			business_name: null,
			email,
			individual_name: null,
			name: billing.name,
			phone: null,
			tax_exempt: 'none',
			tax_ids: []
		};
		this.webhooks.record('checkout.session.completed', session);
		return { outcome: 'paid', session, events: events() };
	}

	private customerEmail(session: Stripe.Checkout.Session) {
		const id = idOf(session.customer);
		return id ? (this.state.customers[id]?.email ?? null) : null;
	}

	/** One charge attempt on a PaymentIntent: the charge, its balance transaction and events. */
	private attempt(
		intent: Stripe.PaymentIntent,
		card: TestCard,
		paymentMethod: string,
		billing: { email: string | null; name: string | null },
		request: Stripe.Event.Request = { id: null, idempotency_key: null }
	): Stripe.Charge {
		const charge = chargeObject({ intent, card, paymentMethod, billing, balanceTransaction: null });
		this.state.charges[charge.id] = charge;
		intent.latest_charge = charge.id;
		if (card.declineCode) {
			intent.status = 'requires_payment_method';
			intent.payment_method = null;
			intent.last_payment_error = {
				type: 'card_error',
				code: 'card_declined',
				decline_code: card.declineCode,
				message: 'Your card was declined.',
				charge: charge.id,
				advice_code: 'try_again_later',
				doc_url: 'https://docs.stripe.com/error-codes/card-declined',
				payment_method_type: 'card'
			};
			this.webhooks.record('charge.failed', charge, request);
			this.webhooks.record('payment_intent.payment_failed', intent, request);
			return charge;
		}
		const transaction = balanceTransactionObject({
			type: 'charge',
			amount: charge.amount,
			currency: charge.currency,
			source: charge.id,
			description: charge.description
		});
		this.state.balanceTransactions[transaction.id] = transaction;
		charge.balance_transaction = transaction.id;
		intent.status = 'succeeded';
		intent.amount_received = intent.amount;
		intent.payment_method = paymentMethod;
		intent.last_payment_error = null;
		this.webhooks.record('charge.succeeded', charge, request);
		this.webhooks.record('payment_intent.succeeded', intent, request);
		return charge;
	}

	// ---- PaymentIntents through the API ----

	createPaymentIntent(reader: Reader, request: Stripe.Event.Request) {
		reader.only(
			'amount',
			'currency',
			'customer',
			'description',
			'metadata',
			'receipt_email',
			'payment_method',
			'payment_method_types',
			'confirm',
			'expand'
		);
		const amount = reader.integer('amount', { required: true, min: 1 })!;
		const currency = readCurrency(reader.params.currency, 'currency');
		checkChargeAmount(amount, currency, 'amount');
		const customer = reader.string('customer');
		if (customer && !this.state.customers[customer])
			throw missingParam('customer', customer, 'customer');
		reader.strings('payment_method_types').forEach((type, i) => {
			if (type !== 'card')
				throw invalid(
					`The local Stripe fake takes card payments only; got ${type}.`,
					`payment_method_types[${i}]`
				);
		});
		const paymentMethod = this.testPaymentMethod(reader);
		const intent = paymentIntentObject({
			amount,
			currency,
			customer: customer ?? null,
			description: reader.string('description', { max: 1000 }) ?? null,
			metadata: reader.metadata(),
			receiptEmail: readEmail(reader, 'receipt_email')
		});
		this.state.paymentIntents[intent.id] = intent;
		this.webhooks.record('payment_intent.created', intent, request);
		if (paymentMethod) {
			intent.status = 'requires_confirmation';
			intent.payment_method = paymentMethod;
		}
		if (reader.boolean('confirm')) this.confirm(intent, paymentMethod, request);
		return intent;
	}

	confirmPaymentIntent(id: string, reader: Reader, request: Stripe.Event.Request) {
		reader.only('payment_method', 'expand');
		const intent = this.store.get('paymentIntents', id);
		if (intent.status === 'succeeded' || intent.status === 'canceled') {
			throw new StripeFakeError(400, {
				type: 'invalid_request_error',
				code: 'payment_intent_unexpected_state',
				message: `You cannot confirm this PaymentIntent because it has a status of ${intent.status}.`,
				payment_intent: structuredClone(intent)
			});
		}
		const paymentMethod = this.testPaymentMethod(reader) ?? idOf(intent.payment_method);
		this.confirm(intent, paymentMethod, request);
		return intent;
	}

	private testPaymentMethod(reader: Reader): string | null {
		const id = reader.string('payment_method');
		if (!id) return null;
		if (!TEST_PAYMENT_METHODS[id]) {
			throw invalid(
				`No such PaymentMethod: '${id}'. The local Stripe fake knows ${Object.keys(TEST_PAYMENT_METHODS).join(' and ')}.`,
				'payment_method',
				'resource_missing'
			);
		}
		return id;
	}

	/** Confirms with a test PaymentMethod; a decline answers 402 as Stripe does. */
	private confirm(
		intent: Stripe.PaymentIntent,
		paymentMethod: string | null,
		request: Stripe.Event.Request
	) {
		if (!paymentMethod || !TEST_PAYMENT_METHODS[paymentMethod]) {
			throw invalid(
				"You cannot confirm this PaymentIntent because it's missing a payment method. Pass payment_method (pm_card_visa or pm_card_chargeDeclined).",
				'payment_method',
				'payment_intent_unexpected_state'
			);
		}
		const card = TEST_CARDS[TEST_PAYMENT_METHODS[paymentMethod]];
		const email =
			intent.receipt_email ??
			(idOf(intent.customer)
				? (this.state.customers[idOf(intent.customer)!]?.email ?? null)
				: null);
		const charge = this.attempt(intent, card, paymentMethod, { email, name: null }, request);
		if (!charge.paid) {
			this.store.save();
			throw new StripeFakeError(402, {
				type: 'card_error',
				code: 'card_declined',
				decline_code: card.declineCode ?? undefined,
				message: 'Your card was declined.',
				charge: charge.id,
				payment_intent: structuredClone(intent)
			});
		}
	}

	// ---- refunds ----

	createRefund(reader: Reader, request: Stripe.Event.Request) {
		reader.only('charge', 'payment_intent', 'amount', 'reason', 'metadata', 'expand');
		const chargeId = reader.string('charge');
		const intentId = reader.string('payment_intent');
		if (!chargeId && !intentId) {
			throw invalid(
				'One of the following params should be provided for this request: payment_intent or charge.',
				'charge',
				'parameter_missing'
			);
		}
		let charge: Stripe.Charge | undefined;
		if (chargeId) {
			charge = this.state.charges[chargeId];
			if (!charge) throw missingParam('charge', chargeId, 'charge');
		}
		if (intentId) {
			const intent = this.state.paymentIntents[intentId];
			if (!intent) throw missingParam('payment_intent', intentId, 'payment_intent');
			if (intent.status !== 'succeeded') {
				throw invalid(
					`This PaymentIntent (${intentId}) does not have a successful charge to refund.`,
					'payment_intent'
				);
			}
			const latest = this.state.charges[idOf(intent.latest_charge)!];
			if (charge && charge.id !== latest.id) {
				throw invalid(
					`Charge ${charge.id} does not belong to PaymentIntent ${intentId}.`,
					'charge'
				);
			}
			charge = latest;
		}
		if (!charge) throw invalid('No charge to refund.', 'charge');
		if (charge.status !== 'succeeded') {
			throw invalid(
				`Charge ${charge.id} has not succeeded, so it cannot be refunded.`,
				'charge',
				'charge_not_refundable'
			);
		}
		const remaining = charge.amount - charge.amount_refunded;
		if (remaining <= 0) {
			throw invalid(
				`Charge ${charge.id} has already been refunded.`,
				'charge',
				'charge_already_refunded'
			);
		}
		const amount = reader.integer('amount', { min: 1 }) ?? remaining;
		if (amount > remaining) {
			throw invalid(
				`Refund amount (${formatAmount(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatAmount(remaining, charge.currency)})`,
				'amount',
				'amount_too_large'
			);
		}
		const reason =
			reader.oneOf('reason', ['duplicate', 'fraudulent', 'requested_by_customer'] as const) ?? null;
		const refund = refundObject({
			charge,
			amount,
			reason,
			metadata: reader.metadata(),
			balanceTransaction: ''
		});
		const transaction = balanceTransactionObject({
			type: 'refund',
			amount: -amount,
			currency: charge.currency,
			source: refund.id,
			description: reason ? `REFUND FOR CHARGE (${reason})` : 'REFUND FOR CHARGE'
		});
		refund.balance_transaction = transaction.id;
		this.state.balanceTransactions[transaction.id] = transaction;
		this.state.refunds[refund.id] = refund;
		const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
		charge.amount_refunded += amount;
		charge.refunded = charge.amount_refunded === charge.amount;
		this.webhooks.record('refund.created', refund, request);
		this.webhooks.record('charge.refunded', charge, request, previous);
		return refund;
	}

	updateRefund(id: string, reader: Reader, request: Stripe.Event.Request) {
		reader.only('metadata', 'expand');
		const refund = this.store.get('refunds', id);
		if (reader.has('metadata')) {
			const previous = { metadata: refund.metadata };
			refund.metadata = reader.metadata('metadata', refund.metadata ?? {});
			this.webhooks.record('refund.updated', refund, request, previous);
		}
		return refund;
	}

	// ---- balance and payouts ----

	/** Balance transactions not yet taken by a payout, per currency (their net amounts). */
	unpaid(): Map<string, Stripe.BalanceTransaction[]> {
		const byCurrency = new Map<string, Stripe.BalanceTransaction[]>();
		for (const txn of Object.values(this.state.balanceTransactions)) {
			if (txn.type === 'payout' || this.state.paidOutBy[txn.id]) continue;
			byCurrency.set(txn.currency, [...(byCurrency.get(txn.currency) ?? []), txn]);
		}
		return byCurrency;
	}

	balance(): Stripe.Balance {
		const available = [...this.unpaid()].map(([currency, txns]) => {
			const amount = txns.reduce((sum, t) => sum + t.net, 0);
			return { amount, currency, source_types: { card: amount } };
		});
		return {
			object: 'balance',
			available: available.length
				? available
				: [{ amount: 0, currency: 'usd', source_types: { card: 0 } }],
			livemode: false,
			pending: (available.length ? available : [{ currency: 'usd' }]).map((a) => ({
				amount: 0,
				currency: a.currency,
				source_types: { card: 0 }
			}))
		};
	}

	/**
	 * Pays out the available balance, as Stripe's automatic payouts do on their schedule: one payout
	 * per currency whose balance is positive, taking every balance transaction not yet paid out
	 * (they then list under `balance_transactions?payout=po_…`, with the payout's own transaction).
	 */
	makePayout(currency?: string): Stripe.Payout[] {
		const payouts: Stripe.Payout[] = [];
		for (const [code, txns] of this.unpaid()) {
			if (currency && code !== currency.toLowerCase()) continue;
			const amount = txns.reduce((sum, t) => sum + t.net, 0);
			if (amount <= 0) continue;
			const id = newId(PREFIX.payout);
			const transaction = balanceTransactionObject({
				type: 'payout',
				amount: -amount,
				currency: code,
				source: id,
				description: 'STRIPE PAYOUT'
			});
			this.state.balanceTransactions[transaction.id] = transaction;
			const payout = payoutObject({
				id,
				amount,
				currency: code,
				balanceTransaction: transaction.id
			});
			this.state.payouts[id] = payout;
			for (const txn of [...txns, transaction]) this.state.paidOutBy[txn.id] = id;
			this.webhooks.record('payout.created', payout);
			this.webhooks.record('payout.paid', payout);
			payouts.push(payout);
		}
		return payouts;
	}
}
