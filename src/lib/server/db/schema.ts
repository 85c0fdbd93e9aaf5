import { sql } from 'drizzle-orm';
import {
	bigint,
	boolean,
	check,
	date,
	foreignKey,
	index,
	integer,
	jsonb,
	numeric,
	pgEnum,
	pgPolicy,
	pgTable,
	primaryKey,
	text,
	time,
	timestamp,
	unique,
	uniqueIndex,
	varchar
} from 'drizzle-orm/pg-core';
import type {
	Basis,
	CalciumChlorideTest,
	ChangeOrder,
	EstimateInput,
	EstimateResult,
	FlatnessMeasure,
	FloorKind,
	ItemRef,
	PriceBook,
	QuantityItem,
	Schedule,
	StoreSettings
} from '../../estimating';
import { CHANGE_ORDER_STATUSES } from '../../jobs/change-order-status';
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
		/** The store's own words on its customer papers; blank: the default wording (`$lib/papers`). */
		papersNextSteps: text('papers_next_steps').notNull().default(''),
		papersCancellation: text('papers_cancellation').notNull().default(''),
		papersTerms: text('papers_terms').notNull().default(''),
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

/** The states the desk lists by when jobs entered them (see `job`'s indexes). */
const DESK_SINCE_STATUSES = ['accepted', 'sold', 'completed'] as const;

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
		/**
		 * The customer's link version: signed into every link; staff revoking the link raises it, and
		 * a link of an older version then answers that it was replaced or withdrawn.
		 */
		linkVersion: integer('link_version').notNull().default(1),
		/**
		 * The customer's name, kept here so the job list sorts and searches by it on `job` alone. Set
		 * by the database, never by the app: a trigger fills it from the customer on every insert or
		 * change of the job's customer, and a trigger on `customer` carries a rename to its jobs
		 * (migration 0017).
		 */
		customerName: text('customer_name').notNull().default(''),
		/**
		 * The title and the customer's name in lower case, kept by the database: the list's search
		 * tests them with `like` and the searched text in lower case, which is what `ilike` does in a
		 * UTF-8 database, without lowering every row it tests again on every search (0.45 ms of a
		 * search's 1.45 in PostgreSQL on the scale seed's big store; migration 0027). Never read
		 * into a `Job` (`jobRecord`).
		 */
		titleLower: text('title_lower')
			.notNull()
			.generatedAlwaysAs(sql`lower(title)`),
		customerNameLower: text('customer_name_lower')
			.notNull()
			.generatedAlwaysAs(sql`lower(customer_name)`),
		/**
		 * The customer's phone, kept here beside the name so a page of the job list reads `job`
		 * alone, not one customer row per job. Kept by the same triggers as the name (migration
		 * 0024), never by the app.
		 */
		customerPhone: text('customer_phone'),
		/**
		 * Whether the job's measure has a room. Set by the database, never by the app: triggers on
		 * `measure` keep it (migration 0023), so the desk finds the drafts to measure and those to
		 * quote from an index of its own instead of reading every draft's measure.
		 */
		roomsMeasured: boolean('rooms_measured').notNull().default(false),
		/**
		 * When the job's latest quote version was sent (none: never). Set by the database, never by
		 * the app: a trigger on `quote` keeps it (migration 0023); the desk lists the quotes with the
		 * customer by it, longest waiting first.
		 */
		quoteSentAt: timestamp('quote_sent_at', { withTimezone: true }),
		statusChangedAt: timestamp('status_changed_at', { withTimezone: true }).defaultNow().notNull(),
		...timestamps
	},
	(t) => [
		index('job_organization_id_idx').on(t.organizationId),
		// The desk's kinds (the staff's front page), each a partial index in the order its lines
		// are listed, longest waiting first: the oldest few are its first entries, and its total is
		// counted from it alone. Partial, because the enum's `=` is never an index condition for
		// the app's role (see the job list's below); migration 0023.
		index('job_draft_unmeasured_since_idx')
			.on(t.organizationId, t.statusChangedAt, t.number)
			.where(sql`${t.status} = 'draft' and not ${t.roomsMeasured}`),
		index('job_draft_measured_since_idx')
			.on(t.organizationId, t.statusChangedAt, t.number)
			.where(sql`${t.status} = 'draft' and ${t.roomsMeasured}`),
		index('job_quoted_since_idx')
			.on(t.organizationId, sql`coalesce(${t.quoteSentAt}, ${t.statusChangedAt})`, t.number)
			.where(sql`${t.status} = 'quoted'`),
		...DESK_SINCE_STATUSES.map((s) =>
			index(`job_${s}_since_idx`)
				.on(t.organizationId, t.statusChangedAt, t.number)
				.where(sql`${t.status} = ${sql.raw(`'${s}'`)}`)
		),
		// An installer's jobs, by last change too (the installer's today page lists them so; an
		// installer of a large store has tens of thousands to sort otherwise).
		index('job_organization_installer_updated_idx').on(
			t.organizationId,
			t.installerId,
			t.updatedAt,
			t.number
		),
		// One member's own jobs by number (the list's default order): a salesperson who sees only
		// the jobs they sold, an installer those given to them. Without these a salesperson with
		// few jobs had the whole table read to find them, and an installer's tens of thousands were
		// sorted (migration 0025); in any other order their jobs are read through these and sorted.
		index('job_organization_salesperson_number_idx').on(
			t.organizationId,
			t.salespersonId,
			t.number
		),
		index('job_organization_installer_number_idx').on(t.organizationId, t.installerId, t.number),
		index('job_customer_idx').on(t.customerId),
		// The job list's shapes (bench/README.md): a store's jobs by last change, newest first, and
		// by customer (sorted by customer, or one customer's). Not by status: under row-level
		// security the enum's `=` (not leakproof) is never an index condition for the app's role.
		index('job_organization_updated_idx').on(t.organizationId, t.updatedAt, t.number),
		index('job_organization_customer_idx').on(t.organizationId, t.customerId, t.number),
		// One status's jobs by last change (or counted): the enum's `=` cannot be an index condition
		// for the app's role, but a partial index whose predicate the query's `status =` implies is
		// still chosen (migration 0017). Each job is in one of them: together, one index's size.
		...JOB_STATUSES.map((s) =>
			index(`job_${s}_updated_idx`)
				.on(t.organizationId, t.updatedAt, t.number)
				.where(sql`${t.status} = ${sql.raw(`'${s}'`)}`)
		),
		// Sorted by customer (name ascending, newest job first within a name): one index range.
		index('job_organization_customer_name_idx').on(
			t.organizationId,
			t.customerName,
			t.number.desc().nullsFirst()
		),
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

/**
 * Which of a store's customer names have a job whose title or name holds a trigram (pg_trgm's,
 * lower case, inside one word): the job list's search sorted by customer walks one trigram's names
 * in name order and tests only those names' jobs, so a page of a common word is found without
 * reading and sorting every match (migration 0019). Kept by triggers on `job`, never by the app;
 * a name or title changed away leaves its old rows behind, which only cost a look at jobs that no
 * longer match.
 */
export const jobNameTrigram = pgTable(
	'job_name_trigram',
	{
		organizationId: storeId(),
		trigram: text('trigram').notNull(),
		customerName: text('customer_name').notNull()
	},
	(t) => [primaryKey({ columns: [t.organizationId, t.trigram, t.customerName] }), storeIsolation]
).enableRLS();

/**
 * How many of a store's jobs are in each status, per salesperson ('' for none): kept by triggers
 * on `job` in the same transaction as the change, never by the app (migration 0020). The job list
 * reads its total here instead of counting a large store's index entries, and with the total it
 * reads a page past the middle from the far end of the order.
 */
export const jobTally = pgTable(
	'job_tally',
	{
		organizationId: storeId(),
		status: jobStatus('status').notNull(),
		salespersonId: text('salesperson_id').notNull().default(''),
		jobs: integer('jobs').notNull()
	},
	(t) => [primaryKey({ columns: [t.organizationId, t.status, t.salespersonId] }), storeIsolation]
).enableRLS();

/**
 * The last job number a store gave. Numbers are never given twice, even after a job is deleted:
 * the next job takes this plus one (the row lock serialises two people creating at once).
 */
export const jobNumberCounter = pgTable(
	'job_number_counter',
	{
		organizationId: text('organization_id')
			.primaryKey()
			.references(() => organization.id, { onDelete: 'cascade' }),
		lastNumber: integer('last_number').notNull()
	},
	(t) => [check('job_number_counter_positive', sql`${t.lastNumber} >= 1`), storeIsolation]
).enableRLS();

/** What happened to a job and who did it: every status change, kept for good. */
export const jobEvent = pgTable(
	'job_event',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		kind: text('kind', {
			enum: ['created', 'status', 'assigned', 'note', 'booking', 'check_in', 'change_order']
		}).notNull(),
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
	'superseded',
	// The store took it back (the job was cancelled): the customer can no longer answer it.
	'withdrawn'
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
		/**
		 * Why a paid Checkout Session naming this payment was not taken as paying it (its amount or
		 * currency differs); flagged on the reconciliation page. The payment stays unpaid.
		 */
		mismatch: text('mismatch'),
		stripeCheckoutSessionId: text('stripe_checkout_session_id').unique(),
		stripePaymentIntentId: text('stripe_payment_intent_id').unique(),
		stripeChargeId: text('stripe_charge_id').unique(),
		stripeBalanceTransactionId: text('stripe_balance_transaction_id'),
		/** The change order this pays (purpose `change_order` only); see `change_order`. */
		changeOrderId: text('change_order_id'),
		checkoutUrl: text('checkout_url'),
		checkoutExpiresAt: timestamp('checkout_expires_at', { withTimezone: true }),
		recordedBy: text('recorded_by').references(() => user.id, { onDelete: 'set null' }),
		succeededAt: timestamp('succeeded_at', { withTimezone: true }),
		...timestamps
	},
	(t) => [
		index('payment_job_idx').on(t.organizationId, t.jobId),
		index('payment_created_idx').on(t.organizationId, t.createdAt),
		// The desk's payments that don't reconcile, oldest first (migration 0023).
		index('payment_mismatch_idx')
			.on(t.organizationId, t.updatedAt)
			.where(sql`${t.mismatch} is not null`),
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
		// The change order of the same job; a payment of another job's change order cannot exist.
		foreignKey({
			name: 'payment_change_order_same_job_fk',
			columns: [t.changeOrderId, t.jobId, t.organizationId],
			foreignColumns: [changeOrder.id, changeOrder.jobId, changeOrder.organizationId]
		}).onDelete('restrict'),
		// One live payment per change order: a second checkout or an in-store payment is refused
		// until the first has failed (an expired or replaced checkout is marked failed first).
		uniqueIndex('payment_change_order_once_uq')
			.on(t.organizationId, t.changeOrderId)
			.where(sql`${t.changeOrderId} is not null and ${t.status} <> 'failed'`),
		check(
			'payment_change_order_purpose',
			sql`(${t.purpose} = 'change_order') = (${t.changeOrderId} is not null)`
		),
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

/**
 * Sign-in, sign-up, reset and invitation attempts, per account and per client address, shared by
 * every server (rate-limiter-flexible's `RateLimiterPostgres` layout: `key`, `points`, `expire`
 * in epoch milliseconds). Keys carry a hash of the account, never the address typed. Not store
 * data, so no `organization_id` and no row security.
 */
export const authLimit = pgTable('auth_limit', {
	key: varchar('key', { length: 255 }).primaryKey(),
	points: integer('points').notNull().default(0),
	expire: bigint('expire', { mode: 'number' })
});

// ---------------------------------------------------------------------------------------------
// The installer's half (issue 10): profiles, bookings, field reports and photos, change orders,
// completion and installer statements. DEVELOPERS.md ("The installer's half: tables") says what
// each row is, who writes it and what the database holds it to.
// ---------------------------------------------------------------------------------------------

/**
 * An installer's own pay for one item in one store, in cents per unit of the price-book line's
 * basis (`install:<floor>` per ft², `prep:hole_repair` each…); it replaces the line's `payCents`.
 */
export interface InstallerPayRate {
	ref: ItemRef;
	payCents: number;
}

/**
 * How one installer works for one store: a store has a profile for each member it books as an
 * installer (one login, one profile per store). The role itself stays in `member`.
 */
export const installerProfile = pgTable(
	'installer_profile',
	{
		id: id(),
		organizationId: storeId(),
		userId: text('user_id')
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		crewSize: integer('crew_size').notNull().default(1),
		/** Floor kinds this installer lays. */
		floorKinds: text('floor_kinds')
			.array()
			.$type<FloorKind[]>()
			.notNull()
			.default(sql`'{}'::text[]`),
		/** The crew's ft² per day by floor kind; a kind left out uses the store's setting. */
		sqFtPerDay: jsonb('sq_ft_per_day')
			.$type<Partial<Record<FloorKind, number>>>()
			.notNull()
			.default({}),
		/** Pay that replaces the price book's installer pay, item by item. */
		payRates: jsonb('pay_rates').$type<InstallerPayRate[]>().notNull().default([]),
		/** Weekdays never worked, ISO numbering (1 = Monday … 7 = Sunday). */
		daysOff: integer('days_off')
			.array()
			.$type<number[]>()
			.notNull()
			.default(sql`'{}'::integer[]`),
		phone: text('phone').notNull().default(''),
		notes: text('notes').notNull().default(''),
		...timestamps
	},
	(t) => [
		unique('installer_profile_user_uq').on(t.organizationId, t.userId),
		check('installer_profile_crew_size', sql`${t.crewSize} between 1 and 50`),
		check('installer_profile_days_off', sql`${t.daysOff} <@ array[1, 2, 3, 4, 5, 6, 7]`),
		storeIsolation
	]
).enableRLS();

/** Dates an installer is away (holiday, another site), both days included. */
export const installerTimeOff = pgTable(
	'installer_time_off',
	{
		id: id(),
		organizationId: storeId(),
		installerId: text('installer_id').notNull(),
		startsOn: date('starts_on').notNull(),
		endsOn: date('ends_on').notNull(),
		note: text('note').notNull().default(''),
		createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull()
	},
	(t) => [
		index('installer_time_off_installer_idx').on(t.organizationId, t.installerId, t.startsOn),
		foreignKey({
			name: 'installer_time_off_profile_fk',
			columns: [t.organizationId, t.installerId],
			foreignColumns: [installerProfile.organizationId, installerProfile.userId]
		}).onDelete('cascade'),
		check(
			'installer_time_off_dates',
			sql`${t.endsOn} >= ${t.startsOn} and ${t.endsOn} - ${t.startsOn} < 366`
		),
		storeIsolation
	]
).enableRLS();

/**
 * A job booked for an installer: consecutive calendar days from `starts_on` in the store's time
 * zone. `version` rises with every change of days or installer (the calendar file's SEQUENCE;
 * the id is its UID). Cancelled bookings are kept; a job has at most one live booking.
 */
export const booking = pgTable(
	'booking',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		installerId: text('installer_id').notNull(),
		startsOn: date('starts_on').notNull(),
		days: integer('days').notNull(),
		/** The last day booked, kept by the database. */
		endsOn: date('ends_on').generatedAlwaysAs(sql`starts_on + days - 1`),
		/** Arrival on each day, the store's local time; none means the store's day start. */
		arrivesAt: time('arrives_at'),
		/** The days the engine proposed, and why: its work steps, hours and cure waits. */
		proposedDays: integer('proposed_days').notNull(),
		proposal: jsonb('proposal').$type<Schedule>().notNull(),
		/** What the installer should know: access, parking, keys. */
		notes: text('notes').notNull().default(''),
		version: integer('version').notNull().default(1),
		bookedBy: text('booked_by').references(() => user.id, { onDelete: 'set null' }),
		cancelledAt: timestamp('cancelled_at', { withTimezone: true }),
		cancelledBy: text('cancelled_by').references(() => user.id, { onDelete: 'set null' }),
		...timestamps
	},
	(t) => [
		index('booking_installer_days_idx').on(t.organizationId, t.installerId, t.startsOn),
		// The installer's today page: their live bookings not yet over (bench/README.md).
		index('booking_installer_live_ends_idx')
			.on(t.organizationId, t.installerId, t.endsOn)
			.where(sql`${t.cancelledAt} is null`),
		index('booking_days_idx').on(t.organizationId, t.startsOn),
		unique('booking_id_organization_uq').on(t.id, t.organizationId),
		uniqueIndex('booking_job_live_uq')
			.on(t.organizationId, t.jobId)
			.where(sql`${t.cancelledAt} is null`),
		foreignKey({
			name: 'booking_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('cascade'),
		foreignKey({
			name: 'booking_installer_profile_fk',
			columns: [t.organizationId, t.installerId],
			foreignColumns: [installerProfile.organizationId, installerProfile.userId]
		}),
		check('booking_days', sql`${t.days} between 1 and 60`),
		check('booking_proposed_days', sql`${t.proposedDays} between 0 and 366`),
		check('booking_version', sql`${t.version} >= 1`),
		storeIsolation
	]
).enableRLS();

/**
 * The installer's report of a job: one per job, made at the first check-in. What was found,
 * read and noted are its items (`field_item`); photos are in `field_photo`.
 */
export const fieldReport = pgTable(
	'field_report',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		checkedInAt: timestamp('checked_in_at', { withTimezone: true }).notNull(),
		checkedInBy: text('checked_in_by').references(() => user.id, { onDelete: 'set null' }),
		/** When the installer last sent the report for the store's review. */
		submittedAt: timestamp('submitted_at', { withTimezone: true }),
		submittedBy: text('submitted_by').references(() => user.id, { onDelete: 'set null' }),
		...timestamps
	},
	(t) => [
		unique('field_report_job_uq').on(t.organizationId, t.jobId),
		unique('field_report_id_organization_uq').on(t.id, t.organizationId),
		foreignKey({
			name: 'field_report_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('cascade'),
		storeIsolation
	]
).enableRLS();

export const FIELD_ITEM_KINDS = ['found', 'reading', 'note'] as const;
export const fieldItemKind = pgEnum('field_item_kind', FIELD_ITEM_KINDS);

/** Readings as the engine's `ReadingsMeasure` has them, one reading per item. */
export const READING_KINDS = [
	'flatness',
	'rh',
	'calcium_chloride',
	'wood_mc_subfloor',
	'wood_mc_flooring'
] as const;
export const readingKind = pgEnum('reading_kind', READING_KINDS);

/** One reading: a straightedge gap, a dish test, or a percentage (RH probe, wood moisture). */
export type FieldReadingValue = FlatnessMeasure | CalciumChlorideTest | { pct: number };

/**
 * One thing the installer recorded on the phone: prep found (the quote's item and unit, the
 * whole amount found in that room), a reading, or a note. `client_id` is made on the phone, so
 * a resend is stored once; `version` rises with each edit so two phones merge item by item; a
 * deletion is kept as `deleted_at` so it merges too.
 */
export const fieldItem = pgTable(
	'field_item',
	{
		id: id(),
		organizationId: storeId(),
		reportId: text('report_id').notNull(),
		clientId: text('client_id').notNull(),
		kind: fieldItemKind('kind').notNull(),
		/** The measure's room id; none for the whole job (as the quote's job-wide lines). */
		roomId: text('room_id'),
		ref: jsonb('ref').$type<ItemRef>(),
		/** `refKey(ref)`, for grouping and the one-live-item rule. */
		refKey: text('ref_key'),
		qty: numeric('qty', { precision: 14, scale: 4, mode: 'number' }),
		unit: text('unit').$type<Basis>(),
		readingKind: readingKind('reading_kind'),
		reading: jsonb('reading').$type<FieldReadingValue>(),
		note: text('note').notNull().default(''),
		version: integer('version').notNull().default(1),
		recordedBy: text('recorded_by').references(() => user.id, { onDelete: 'set null' }),
		/** When it was recorded, by the phone's clock. */
		recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull(),
		deletedAt: timestamp('deleted_at', { withTimezone: true }),
		...timestamps
	},
	(t) => [
		index('field_item_report_idx').on(t.organizationId, t.reportId),
		unique('field_item_client_uq').on(t.organizationId, t.clientId),
		unique('field_item_id_organization_uq').on(t.id, t.organizationId),
		// One live amount found per room and item: a second phone's item for the same room and
		// item is refused, and merges with the first instead of adding to it.
		uniqueIndex('field_item_found_once_uq')
			.on(t.organizationId, t.reportId, sql`coalesce(${t.roomId}, '')`, t.refKey)
			.where(sql`${t.kind} = 'found' and ${t.deletedAt} is null`),
		foreignKey({
			name: 'field_item_report_same_store_fk',
			columns: [t.reportId, t.organizationId],
			foreignColumns: [fieldReport.id, fieldReport.organizationId]
		}).onDelete('cascade'),
		check('field_item_client_id', sql`char_length(${t.clientId}) between 8 and 64`),
		check(
			'field_item_found_shape',
			sql`${t.kind} <> 'found' or (${t.ref} is not null and ${t.refKey} is not null and ${t.unit} is not null and ${t.qty} is not null and ${t.qty} >= 0 and ${t.qty} <= 1000000)`
		),
		check(
			'field_item_reading_shape',
			sql`${t.kind} <> 'reading' or (${t.readingKind} is not null and ${t.reading} is not null)`
		),
		check('field_item_note_shape', sql`${t.kind} <> 'note' or ${t.note} <> ''`),
		check('field_item_version', sql`${t.version} >= 1`),
		storeIsolation
	]
).enableRLS();

export const PHOTO_PURPOSES = ['report', 'completion'] as const;
export const photoPurpose = pgEnum('photo_purpose', PHOTO_PURPOSES);

/** What the file store keeps: images re-encoded by the server, never the phone's original. */
export const PHOTO_MEDIA_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

/**
 * A photo from the site. The stored file is the server's re-encoding (orientation applied,
 * metadata and location removed) and its thumbnail; `client_id` is made on the phone, so a
 * resend is stored once. A report photo may belong to an item (by the item's client id).
 */
export const fieldPhoto = pgTable(
	'field_photo',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		clientId: text('client_id').notNull(),
		purpose: photoPurpose('purpose').notNull(),
		roomId: text('room_id'),
		itemClientId: text('item_client_id'),
		fileKey: text('file_key').notNull(),
		thumbKey: text('thumb_key').notNull(),
		mediaType: text('media_type', { enum: PHOTO_MEDIA_TYPES }).notNull(),
		byteSize: integer('byte_size').notNull(),
		width: integer('width').notNull(),
		height: integer('height').notNull(),
		caption: text('caption').notNull().default(''),
		/** When it was taken, by the phone; none when unknown. */
		takenAt: timestamp('taken_at', { withTimezone: true }),
		uploadedBy: text('uploaded_by').references(() => user.id, { onDelete: 'set null' }),
		deletedAt: timestamp('deleted_at', { withTimezone: true }),
		...timestamps
	},
	(t) => [
		index('field_photo_job_idx').on(t.organizationId, t.jobId),
		unique('field_photo_client_uq').on(t.organizationId, t.clientId),
		unique('field_photo_id_organization_uq').on(t.id, t.organizationId),
		foreignKey({
			name: 'field_photo_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('cascade'),
		foreignKey({
			name: 'field_photo_item_same_store_fk',
			columns: [t.organizationId, t.itemClientId],
			foreignColumns: [fieldItem.organizationId, fieldItem.clientId]
		}),
		check('field_photo_client_id', sql`char_length(${t.clientId}) between 8 and 64`),
		check(
			'field_photo_media_type',
			sql`${t.mediaType} in ('image/jpeg', 'image/png', 'image/webp')`
		),
		check('field_photo_byte_size', sql`${t.byteSize} between 1 and 20971520`),
		check(
			'field_photo_dimensions',
			sql`${t.width} between 1 and 20000 and ${t.height} between 1 and 20000`
		),
		check(
			'field_photo_completion_no_item',
			sql`${t.purpose} <> 'completion' or ${t.itemClientId} is null`
		),
		storeIsolation
	]
).enableRLS();

/** What the change-order engine was given, whole, so its figures can be worked out again. */
export interface ChangeOrderInput {
	sold: QuantityItem[];
	found: QuantityItem[];
	priceBook: PriceBook;
	settings: StoreSettings;
}

/** A manager's change to the engine's figures, with why (e.g. a goodwill credit). */
export interface ChangeOrderAdjustment {
	description: string;
	/** Added to the customer's amount before tax; negative for a credit. */
	amountCents: number;
	/** Added to the installer's pay. */
	payCents: number;
}

export const changeOrderStatus = pgEnum('change_order_status', CHANGE_ORDER_STATUSES);

/**
 * The difference between the prep sold and the prep found, priced by the engine from the store's
 * price book: made from the report, adjusted and sent by a manager, approved or declined by the
 * customer. Totals are after adjustments and may be negative (a credit). From `reviewed` on its
 * figures are frozen, and once decided the decision is too (trigger `change_order_guard`).
 */
export const changeOrder = pgTable(
	'change_order',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		reportId: text('report_id').notNull(),
		/** CO-1, CO-2…: per job. */
		number: integer('number').notNull(),
		status: changeOrderStatus('status').notNull().default('submitted'),
		input: jsonb('input').$type<ChangeOrderInput>().notNull(),
		result: jsonb('result').$type<ChangeOrder>().notNull(),
		adjustments: jsonb('adjustments').$type<ChangeOrderAdjustment[]>().notNull().default([]),
		currency: text('currency').notNull(),
		subtotalCents: integer('subtotal_cents').notNull(),
		taxCents: integer('tax_cents').notNull(),
		totalCents: integer('total_cents').notNull(),
		payDeltaCents: integer('pay_delta_cents').notNull(),
		createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
		reviewedAt: timestamp('reviewed_at', { withTimezone: true }),
		reviewedBy: text('reviewed_by').references(() => user.id, { onDelete: 'set null' }),
		sentAt: timestamp('sent_at', { withTimezone: true }),
		sentTo: text('sent_to'),
		/** A manager's reason for declining (required then); or the customer's, if given. */
		declineReason: text('decline_reason').notNull().default(''),
		declinedBy: text('declined_by').references(() => user.id, { onDelete: 'set null' }),
		/** The customer's decision, approve or decline, as for a quote's acceptance. */
		decidedAt: timestamp('decided_at', { withTimezone: true }),
		decidedName: text('decided_name'),
		decidedIp: text('decided_ip'),
		decidedUserAgent: text('decided_user_agent'),
		...timestamps
	},
	(t) => [
		index('change_order_job_idx').on(t.organizationId, t.jobId),
		// The desk's change orders to review, oldest sent first (migration 0023).
		index('change_order_submitted_idx')
			.on(t.organizationId, t.createdAt)
			.where(sql`${t.status} = 'submitted'`),
		unique('change_order_id_organization_uq').on(t.id, t.organizationId),
		unique('change_order_id_job_organization_uq').on(t.id, t.jobId, t.organizationId),
		unique('change_order_job_number_uq').on(t.organizationId, t.jobId, t.number),
		// One change order in the works per job: a report sent twice cannot make two.
		uniqueIndex('change_order_one_open_uq')
			.on(t.organizationId, t.jobId)
			.where(sql`${t.status} in ('submitted', 'reviewed')`),
		foreignKey({
			name: 'change_order_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('restrict'),
		foreignKey({
			name: 'change_order_report_same_store_fk',
			columns: [t.reportId, t.organizationId],
			foreignColumns: [fieldReport.id, fieldReport.organizationId]
		}).onDelete('restrict'),
		check('change_order_number', sql`${t.number} >= 1`),
		check('change_order_total', sql`${t.totalCents} = ${t.subtotalCents} + ${t.taxCents}`),
		check(
			'change_order_approved_by_customer',
			sql`${t.status} <> 'approved' or (${t.decidedAt} is not null and ${t.decidedName} <> '')`
		),
		check(
			'change_order_manager_decline_reason',
			sql`${t.declinedBy} is null or ${t.declineReason} <> ''`
		),
		storeIsolation
	]
).enableRLS();

/**
 * The job marked complete by the installer, with the customer's walk-through notes, and the
 * customer's sign-off through the link (typed name, time, address, browser, as for a quote).
 * Its photos are `field_photo` rows with purpose `completion`. Signed off, it is kept as is.
 */
export const jobCompletion = pgTable(
	'job_completion',
	{
		id: id(),
		organizationId: storeId(),
		jobId: text('job_id').notNull(),
		completedAt: timestamp('completed_at', { withTimezone: true }).notNull(),
		completedBy: text('completed_by').references(() => user.id, { onDelete: 'set null' }),
		walkthroughNotes: text('walkthrough_notes').notNull().default(''),
		signedAt: timestamp('signed_at', { withTimezone: true }),
		signedName: text('signed_name'),
		signedIp: text('signed_ip'),
		signedUserAgent: text('signed_user_agent'),
		...timestamps
	},
	(t) => [
		unique('job_completion_job_uq').on(t.organizationId, t.jobId),
		foreignKey({
			name: 'job_completion_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('cascade'),
		check(
			'job_completion_signed',
			sql`(${t.signedAt} is null and ${t.signedName} is null) or (${t.signedAt} is not null and ${t.signedName} <> '')`
		),
		storeIsolation
	]
).enableRLS();

export const STATEMENT_STATUSES = ['open', 'paid'] as const;
export const statementStatus = pgEnum('statement_status', STATEMENT_STATUSES);

/**
 * What a store owes one installer for one period. `total_cents` is the sum of its lines, kept by
 * the database. Paid, it is kept as it is: a correction is a line in a later period.
 */
export const installerStatement = pgTable(
	'installer_statement',
	{
		id: id(),
		organizationId: storeId(),
		installerId: text('installer_id').notNull(),
		periodStart: date('period_start').notNull(),
		periodEnd: date('period_end').notNull(),
		currency: text('currency').notNull(),
		status: statementStatus('status').notNull().default('open'),
		totalCents: integer('total_cents').notNull().default(0),
		paidAt: timestamp('paid_at', { withTimezone: true }),
		paidBy: text('paid_by').references(() => user.id, { onDelete: 'set null' }),
		/** The store's payment reference (transfer id, cheque number). */
		paidReference: text('paid_reference').notNull().default(''),
		...timestamps
	},
	(t) => [
		index('installer_statement_period_idx').on(t.organizationId, t.periodStart),
		unique('installer_statement_period_uq').on(t.organizationId, t.installerId, t.periodStart),
		unique('installer_statement_id_installer_organization_uq').on(
			t.id,
			t.installerId,
			t.organizationId
		),
		foreignKey({
			name: 'installer_statement_profile_fk',
			columns: [t.organizationId, t.installerId],
			foreignColumns: [installerProfile.organizationId, installerProfile.userId]
		}),
		check(
			'installer_statement_period',
			sql`${t.periodEnd} >= ${t.periodStart} and ${t.periodEnd} - ${t.periodStart} < 366`
		),
		check(
			'installer_statement_paid',
			sql`(${t.status} = 'open' and ${t.paidAt} is null) or (${t.status} = 'paid' and ${t.paidAt} is not null and ${t.paidReference} <> '')`
		),
		storeIsolation
	]
).enableRLS();

export const STATEMENT_LINE_KINDS = ['install', 'extra', 'chargeback', 'adjustment'] as const;
export const statementLineKind = pgEnum('statement_line_kind', STATEMENT_LINE_KINDS);

/**
 * One line of an installer statement, in cents: install pay for a job (once per installer and
 * job), the pay of an approved change order (once per change order), a chargeback (negative,
 * with a reason) or an adjustment (a correction of an earlier period, with a reason).
 */
export const installerStatementLine = pgTable(
	'installer_statement_line',
	{
		id: id(),
		organizationId: storeId(),
		statementId: text('statement_id').notNull(),
		installerId: text('installer_id').notNull(),
		kind: statementLineKind('kind').notNull(),
		jobId: text('job_id'),
		changeOrderId: text('change_order_id'),
		description: text('description').notNull().default(''),
		reason: text('reason').notNull().default(''),
		amountCents: integer('amount_cents').notNull(),
		createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull()
	},
	(t) => [
		index('installer_statement_line_statement_idx').on(t.organizationId, t.statementId),
		uniqueIndex('installer_statement_line_install_once_uq')
			.on(t.organizationId, t.installerId, t.jobId)
			.where(sql`${t.kind} = 'install'`),
		uniqueIndex('installer_statement_line_extra_once_uq')
			.on(t.organizationId, t.changeOrderId)
			.where(sql`${t.kind} = 'extra'`),
		foreignKey({
			name: 'installer_statement_line_statement_fk',
			columns: [t.statementId, t.installerId, t.organizationId],
			foreignColumns: [
				installerStatement.id,
				installerStatement.installerId,
				installerStatement.organizationId
			]
		}).onDelete('cascade'),
		foreignKey({
			name: 'installer_statement_line_job_same_store_fk',
			columns: [t.jobId, t.organizationId],
			foreignColumns: [job.id, job.organizationId]
		}).onDelete('restrict'),
		foreignKey({
			name: 'installer_statement_line_change_order_same_job_fk',
			columns: [t.changeOrderId, t.jobId, t.organizationId],
			foreignColumns: [changeOrder.id, changeOrder.jobId, changeOrder.organizationId]
		}).onDelete('restrict'),
		check(
			'installer_statement_line_amount',
			sql`${t.amountCents} between -100000000 and 100000000`
		),
		check(
			'installer_statement_line_install',
			sql`${t.kind} <> 'install' or (${t.jobId} is not null and ${t.amountCents} >= 0)`
		),
		check(
			'installer_statement_line_extra',
			sql`${t.kind} <> 'extra' or (${t.jobId} is not null and ${t.changeOrderId} is not null)`
		),
		check(
			'installer_statement_line_chargeback',
			sql`${t.kind} <> 'chargeback' or (${t.amountCents} < 0 and ${t.reason} <> '')`
		),
		check(
			'installer_statement_line_adjustment',
			sql`${t.kind} <> 'adjustment' or ${t.reason} <> ''`
		),
		storeIsolation
	]
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
