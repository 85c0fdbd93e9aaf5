import { sql } from 'drizzle-orm';
import {
	boolean,
	check,
	foreignKey,
	index,
	integer,
	jsonb,
	pgEnum,
	pgPolicy,
	pgTable,
	primaryKey,
	text,
	timestamp,
	unique
} from 'drizzle-orm/pg-core';
import type { EstimateInput, EstimateResult, StoreSettings } from '../../estimating';
import { JOB_STATUSES } from '../../jobs/status';
import type { MeasureDraft } from '../../measure/draft';
import { organization, user } from './auth.schema';

/**
 * Row-level security, the second wall beneath the queries' own `organization_id` filter: a row is
 * visible and writable only inside a transaction that set `app.store_id` to its store
 * (see `inStore` in ./tenant.ts). Outside one, a query sees nothing.
 */
const storeIsolation = pgPolicy('store_isolation', {
	as: 'permissive',
	for: 'all',
	using: sql`organization_id = current_setting('app.store_id', true)`,
	withCheck: sql`organization_id = current_setting('app.store_id', true)`
});

const id = () =>
	text('id')
		.primaryKey()
		.$defaultFn(() => crypto.randomUUID());

const storeId = () =>
	text('organization_id')
		.notNull()
		.references(() => organization.id, { onDelete: 'cascade' });

const timestamps = {
	createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
	updatedAt: timestamp('updated_at', { withTimezone: true })
		.defaultNow()
		.$onUpdate(() => new Date())
		.notNull()
};

export const jobStatus = pgEnum('job_status', JOB_STATUSES);

/** A store's own details, shown on customer-facing pages and documents. */
export const storeProfile = pgTable(
	'store_profile',
	{
		organizationId: text('organization_id')
			.primaryKey()
			.references(() => organization.id, { onDelete: 'cascade' }),
		address: text('address').notNull().default(''),
		town: text('town').notNull().default(''),
		phone: text('phone').notNull().default(''),
		email: text('email').notNull().default(''),
		/** Storage key of the logo shown on customer pages and PDFs. */
		logoKey: text('logo_key'),
		...timestamps
	},
	() => [storeIsolation]
).enableRLS();

/**
 * The store's trade settings: the estimating engine's `StoreSettings` as a whole (validated with
 * `settingsSchema`), plus how long a quote stays open.
 */
export const storeSettings = pgTable(
	'store_settings',
	{
		organizationId: text('organization_id')
			.primaryKey()
			.references(() => organization.id, { onDelete: 'cascade' }),
		settings: jsonb('settings').$type<StoreSettings>().notNull(),
		currency: text('currency').notNull().default('USD'),
		quoteValidDays: integer('quote_valid_days').notNull().default(30),
		/**
		 * The store's own Stripe account (`acct_…`), connected to the platform: charges, refunds and
		 * payouts live there, so one store's money is never in another's reports.
		 */
		stripeAccountId: text('stripe_account_id').unique(),
		...timestamps
	},
	() => [
		storeIsolation,
		// Stripe names a connected account, never our store, on events such as payouts: a
		// transaction that set `app.stripe_account` to the account of a verified event may find
		// the one settings row of that account (and so its store), and nothing else.
		pgPolicy('stripe_account_lookup', {
			as: 'permissive',
			for: 'select',
			using: sql`stripe_account_id = current_setting('app.stripe_account', true)`
		})
	]
).enableRLS();

export const priceSection = pgEnum('price_section', ['floor', 'prep', 'removal', 'supply']);

/**
 * One line of the price book. `data` is the engine's shape for its section (floor product,
 * prep service, removal price or supply), validated with the engine's schema on every write;
 * `code` is the key the engine prices by (the floor's id, the prep kind, the existing floor kind,
 * the supply kind). Quotes copy what they used, so changing a line never changes a sent quote.
 */
export const priceItem = pgTable(
	'price_item',
	{
		id: id(),
		organizationId: storeId(),
		section: priceSection('section').notNull(),
		code: text('code').notNull(),
		name: text('name').notNull(),
		active: boolean('active').notNull().default(true),
		data: jsonb('data').$type<Record<string, unknown>>().notNull(),
		...timestamps
	},
	(t) => [
		index('price_item_organization_section_idx').on(t.organizationId, t.section),
		unique('price_item_code_uq').on(t.organizationId, t.section, t.code),
		storeIsolation
	]
).enableRLS();

export const customer = pgTable(
	'customer',
	{
		id: id(),
		organizationId: storeId(),
		name: text('name').notNull(),
		email: text('email'),
		phone: text('phone'),
		notes: text('notes').notNull().default(''),
		...timestamps
	},
	(t) => [
		index('customer_organization_id_idx').on(t.organizationId),
		index('customer_organization_name_idx').on(t.organizationId, t.name),
		// Lets child rows reference (id, store) so a row can never point into another store.
		unique('customer_id_organization_uq').on(t.id, t.organizationId),
		storeIsolation
	]
).enableRLS();

/** Where a customer wants floors: a customer may have several. */
export const site = pgTable(
	'site',
	{
		id: id(),
		organizationId: storeId(),
		customerId: text('customer_id').notNull(),
		label: text('label').notNull().default(''),
		address: text('address').notNull(),
		town: text('town').notNull().default(''),
		postcode: text('postcode').notNull().default(''),
		builtYear: integer('built_year'),
		subfloor: text('subfloor').notNull().default(''),
		notes: text('notes').notNull().default(''),
		...timestamps
	},
	(t) => [
		index('site_organization_customer_idx').on(t.organizationId, t.customerId),
		unique('site_id_organization_uq').on(t.id, t.organizationId),
		foreignKey({
			name: 'site_customer_same_store_fk',
			columns: [t.customerId, t.organizationId],
			foreignColumns: [customer.id, customer.organizationId]
		}).onDelete('cascade'),
		storeIsolation
	]
).enableRLS();

export const job = pgTable(
	'job',
	{
		id: id(),
		organizationId: storeId(),
		/** Shown to people as J-1001; unique per store. */
		number: integer('number').notNull(),
		customerId: text('customer_id').notNull(),
		siteId: text('site_id'),
		title: text('title').notNull(),
		status: jobStatus('status').notNull().default('draft'),
		salespersonId: text('salesperson_id').references(() => user.id, { onDelete: 'set null' }),
		installerId: text('installer_id').references(() => user.id, { onDelete: 'set null' }),
		notes: text('notes').notNull().default(''),
		statusChangedAt: timestamp('status_changed_at', { withTimezone: true }).defaultNow().notNull(),
		...timestamps
	},
	(t) => [
		index('job_organization_id_idx').on(t.organizationId),
		index('job_organization_status_idx').on(t.organizationId, t.status),
		index('job_organization_installer_idx').on(t.organizationId, t.installerId),
		index('job_customer_idx').on(t.customerId),
		unique('job_organization_number_uq').on(t.organizationId, t.number),
		unique('job_id_organization_uq').on(t.id, t.organizationId),
		foreignKey({
			name: 'job_customer_same_store_fk',
			columns: [t.customerId, t.organizationId],
			foreignColumns: [customer.id, customer.organizationId]
		}).onDelete('restrict'),
		foreignKey({
			name: 'job_site_same_store_fk',
			columns: [t.siteId, t.organizationId],
			foreignColumns: [site.id, site.organizationId]
		}).onDelete('restrict'),
		storeIsolation
	]
).enableRLS();

/** What happened to a job and who did it: every status change, kept for good. */
export const jobEvent = pgTable(
	'job_event',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		kind: text('kind', { enum: ['created', 'status', 'assigned', 'note'] }).notNull(),
		fromStatus: jobStatus('from_status'),
		toStatus: jobStatus('to_status'),
		actorId: text('actor_id').references(() => user.id, { onDelete: 'set null' }),
		note: text('note').notNull().default(''),
		createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull()
	},
	(t) => [
		index('job_event_job_idx').on(t.organizationId, t.jobId),
		foreignKey({
			name: 'job_event_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('cascade'),
		storeIsolation
	]
).enableRLS();

/**
 * The site measure of a job, as the salesperson typed it (`draft`: lengths as text, see
 * $lib/measure). `version` rises with every save: a save that names an older version is told
 * the measure changed, and nothing is overwritten.
 */
export const measure = pgTable(
	'measure',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		version: integer('version').notNull().default(1),
		draft: jsonb('draft').$type<MeasureDraft>().notNull(),
		updatedBy: text('updated_by').references(() => user.id, { onDelete: 'set null' }),
		...timestamps
	},
	(t) => [
		unique('measure_job_uq').on(t.organizationId, t.jobId),
		foreignKey({
			name: 'measure_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('cascade'),
		storeIsolation
	]
).enableRLS();

export const QUOTE_STATUSES = [
	'draft',
	'sent',
	'accepted',
	'changes_requested',
	'superseded'
] as const;
export const quoteStatus = pgEnum('quote_status', QUOTE_STATUSES);

/**
 * A version of a job's quote. `input` is the whole `EstimateInput` it was built from (the
 * measure, the store settings and a copy of every price used) and `result` the engine's answer,
 * so every figure the customer sees is reproducible. Once sent, a quote is frozen (a trigger
 * refuses changes to what it says); an edit makes the next version.
 */
export const quote = pgTable(
	'quote',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		version: integer('version').notNull(),
		status: quoteStatus('status').notNull().default('draft'),
		input: jsonb('input').$type<EstimateInput>().notNull(),
		result: jsonb('result').$type<EstimateResult>().notNull(),
		currency: text('currency').notNull(),
		subtotalCents: integer('subtotal_cents').notNull(),
		taxCents: integer('tax_cents').notNull(),
		totalCents: integer('total_cents').notNull(),
		depositCents: integer('deposit_cents').notNull(),
		validUntil: timestamp('valid_until', { withTimezone: true }),
		sentAt: timestamp('sent_at', { withTimezone: true }),
		sentTo: text('sent_to'),
		acceptedAt: timestamp('accepted_at', { withTimezone: true }),
		acceptedName: text('accepted_name'),
		acceptedIp: text('accepted_ip'),
		acceptedUserAgent: text('accepted_user_agent'),
		changeNote: text('change_note'),
		changeRequestedAt: timestamp('change_requested_at', { withTimezone: true }),
		createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
		...timestamps
	},
	(t) => [
		unique('quote_job_version_uq').on(t.organizationId, t.jobId, t.version),
		unique('quote_id_organization_uq').on(t.id, t.organizationId),
		foreignKey({
			name: 'quote_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('cascade'),
		storeIsolation
	]
).enableRLS();

export const paymentPurpose = pgEnum('payment_purpose', ['deposit', 'balance', 'change_order']);
export const paymentMethod = pgEnum('payment_method', [
	'card',
	'cash',
	'cheque',
	'card_terminal',
	'bank_transfer'
]);
export const paymentStatus = pgEnum('payment_status', [
	'pending',
	'succeeded',
	'failed',
	'refunded'
]);

/**
 * One payment of a job: by card through Stripe Checkout, or taken in the store. Amounts are
 * integers in the currency's smallest unit; `refunded_cents` never exceeds `amount_cents`.
 */
export const payment = pgTable(
	'payment',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		quoteId: text('quote_id'),
		purpose: paymentPurpose('purpose').notNull(),
		method: paymentMethod('method').notNull(),
		status: paymentStatus('status').notNull().default('pending'),
		currency: text('currency').notNull(),
		amountCents: integer('amount_cents').notNull(),
		refundedCents: integer('refunded_cents').notNull().default(0),
		feeCents: integer('fee_cents'),
		/** Cheque number, terminal slip, transfer reference: what the store wrote down. */
		reference: text('reference').notNull().default(''),
		failureMessage: text('failure_message'),
		stripeCheckoutSessionId: text('stripe_checkout_session_id').unique(),
		stripePaymentIntentId: text('stripe_payment_intent_id').unique(),
		stripeChargeId: text('stripe_charge_id').unique(),
		stripeBalanceTransactionId: text('stripe_balance_transaction_id'),
		checkoutUrl: text('checkout_url'),
		checkoutExpiresAt: timestamp('checkout_expires_at', { withTimezone: true }),
		recordedBy: text('recorded_by').references(() => user.id, { onDelete: 'set null' }),
		succeededAt: timestamp('succeeded_at', { withTimezone: true }),
		...timestamps
	},
	(t) => [
		index('payment_job_idx').on(t.organizationId, t.jobId),
		index('payment_created_idx').on(t.organizationId, t.createdAt),
		unique('payment_id_organization_uq').on(t.id, t.organizationId),
		foreignKey({
			name: 'payment_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('restrict'),
		foreignKey({
			name: 'payment_quote_same_store_fk',
			columns: [t.quoteId, t.organizationId],
			foreignColumns: [quote.id, quote.organizationId]
		}).onDelete('restrict'),
		check('payment_amount_positive', sql`${t.amountCents} > 0`),
		check(
			'payment_refund_within',
			sql`${t.refundedCents} >= 0 and ${t.refundedCents} <= ${t.amountCents}`
		),
		storeIsolation
	]
).enableRLS();

export const refundReason = pgEnum('refund_reason', ['cancellation', 'overcharge', 'other']);
export const refundStatus = pgEnum('refund_status', ['pending', 'succeeded', 'failed']);

/** Money given back on a payment, in part or whole, with its reason. */
export const refund = pgTable(
	'refund',
	{
		id: id(),
		organizationId: storeId(),
		paymentId: text('payment_id').notNull(),
		amountCents: integer('amount_cents').notNull(),
		reason: refundReason('reason').notNull(),
		note: text('note').notNull().default(''),
		status: refundStatus('status').notNull().default('pending'),
		stripeRefundId: text('stripe_refund_id').unique(),
		createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
		...timestamps
	},
	(t) => [
		index('refund_payment_idx').on(t.organizationId, t.paymentId),
		foreignKey({
			name: 'refund_payment_same_store_fk',
			columns: [t.paymentId, t.organizationId],
			foreignColumns: [payment.id, payment.organizationId]
		}).onDelete('restrict'),
		check('refund_amount_positive', sql`${t.amountCents} > 0`),
		storeIsolation
	]
).enableRLS();

/** Each Stripe event handled, once: a redelivered event finds its id here and changes nothing. */
export const stripeEvent = pgTable(
	'stripe_event',
	{
		id: text('id').primaryKey(),
		organizationId: storeId(),
		type: text('type').notNull(),
		objectId: text('object_id'),
		stripeCreated: timestamp('stripe_created', { withTimezone: true }).notNull(),
		receivedAt: timestamp('received_at', { withTimezone: true }).defaultNow().notNull(),
		outcome: text('outcome').notNull().default('')
	},
	(t) => [index('stripe_event_organization_idx').on(t.organizationId, t.receivedAt), storeIsolation]
).enableRLS();

export const taskState = pgEnum('task_state', ['queued', 'done', 'failed', 'dropped']);

/**
 * A side effect of the store (an e-mail) as the store sees it: written in the same transaction
 * as the change that causes it, beside the queue's own row (pg-boss, schema `pgboss`) that
 * delivers and retries it. `failed` is where the retries ended: a manager sees it and resends.
 */
export const task = pgTable(
	'task',
	{
		id: id(),
		organizationId: storeId(),
		kind: text('kind').notNull(),
		payload: jsonb('payload').$type<Record<string, unknown>>().notNull(),
		/** What it is, in words, for the people of the store ("Quote to greta@…"). */
		summary: text('summary').notNull().default(''),
		/** The job it is about, when there is one, to link to. */
		jobId: text('job_id'),
		state: taskState('state').notNull().default('queued'),
		/** How many times it was sent again after failing: tells a new round from the one before. */
		round: integer('round').notNull().default(0),
		attempts: integer('attempts').notNull().default(0),
		lastError: text('last_error'),
		createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
		finishedAt: timestamp('finished_at', { withTimezone: true }),
		...timestamps
	},
	(t) => [
		index('task_organization_state_idx').on(t.organizationId, t.state, t.createdAt),
		foreignKey({
			name: 'task_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('cascade'),
		storeIsolation
	]
).enableRLS();

/**
 * The store's Stripe activity as Stripe last told it, for the reconciliation page: charges,
 * refunds and payouts of the store's own Stripe account, kept up to date by webhooks and by a
 * sync in the background (or when a manager asks). The page reads these, never Stripe itself.
 */
export const stripeCharge = pgTable(
	'stripe_charge',
	{
		organizationId: storeId(),
		id: text('id').notNull(),
		paymentIntentId: text('payment_intent_id'),
		status: text('status').notNull(),
		currency: text('currency').notNull(),
		amountCents: integer('amount_cents').notNull(),
		/** Stripe's fee on the charge, from its balance transaction (null until Stripe has one). */
		feeCents: integer('fee_cents'),
		/** Our payment and job, when the charge carries them in its metadata. */
		paymentId: text('payment_id'),
		jobId: text('job_id'),
		stripeCreated: timestamp('stripe_created', { withTimezone: true }).notNull(),
		syncedAt: timestamp('synced_at', { withTimezone: true }).defaultNow().notNull()
	},
	(t) => [
		primaryKey({ columns: [t.organizationId, t.id] }),
		index('stripe_charge_created_idx').on(t.organizationId, t.stripeCreated),
		storeIsolation
	]
).enableRLS();

export const stripeRefund = pgTable(
	'stripe_refund',
	{
		organizationId: storeId(),
		id: text('id').notNull(),
		chargeId: text('charge_id'),
		paymentIntentId: text('payment_intent_id'),
		status: text('status').notNull(),
		currency: text('currency').notNull(),
		amountCents: integer('amount_cents').notNull(),
		stripeCreated: timestamp('stripe_created', { withTimezone: true }).notNull(),
		syncedAt: timestamp('synced_at', { withTimezone: true }).defaultNow().notNull()
	},
	(t) => [
		primaryKey({ columns: [t.organizationId, t.id] }),
		index('stripe_refund_created_idx').on(t.organizationId, t.stripeCreated),
		storeIsolation
	]
).enableRLS();

/** A payout to the store's bank, with what it netted (from its balance transactions). */
export const stripePayout = pgTable(
	'stripe_payout',
	{
		organizationId: storeId(),
		id: text('id').notNull(),
		status: text('status').notNull(),
		currency: text('currency').notNull(),
		/** What reached the bank. */
		amountCents: integer('amount_cents').notNull(),
		grossCents: integer('gross_cents').notNull().default(0),
		feeCents: integer('fee_cents').notNull().default(0),
		refundCents: integer('refund_cents').notNull().default(0),
		transactions: integer('transactions').notNull().default(0),
		arrivalDate: timestamp('arrival_date', { withTimezone: true }).notNull(),
		stripeCreated: timestamp('stripe_created', { withTimezone: true }).notNull(),
		syncedAt: timestamp('synced_at', { withTimezone: true }).defaultNow().notNull()
	},
	(t) => [
		primaryKey({ columns: [t.organizationId, t.id] }),
		index('stripe_payout_created_idx').on(t.organizationId, t.stripeCreated),
		storeIsolation
	]
).enableRLS();

/** How far the store's Stripe activity has been brought into the tables above. */
export const stripeSync = pgTable(
	'stripe_sync',
	{
		organizationId: text('organization_id')
			.primaryKey()
			.references(() => organization.id, { onDelete: 'cascade' }),
		/** Everything Stripe created before this is in the tables (webhooks add what comes after). */
		syncedUntil: timestamp('synced_until', { withTimezone: true }),
		lastRunAt: timestamp('last_run_at', { withTimezone: true }),
		lastError: text('last_error'),
		lastErrorAt: timestamp('last_error_at', { withTimezone: true })
	},
	() => [storeIsolation]
).enableRLS();

export * from './auth.schema';
