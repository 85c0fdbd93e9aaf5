import { sql } from 'drizzle-orm';
import {
	foreignKey,
	index,
	integer,
	pgEnum,
	pgPolicy,
	pgTable,
	text,
	timestamp,
	unique
} from 'drizzle-orm/pg-core';
import { JOB_STATUSES } from '../../jobs/status';
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
		...timestamps
	},
	() => [storeIsolation]
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

export const job = pgTable(
	'job',
	{
		id: id(),
		organizationId: storeId(),
		/** Shown to people as J-1001; unique per store. */
		number: integer('number').notNull(),
		customerId: text('customer_id').notNull(),
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

export * from './auth.schema';
