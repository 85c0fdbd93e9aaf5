import { and, asc, desc, eq, isNull, sql } from 'drizzle-orm';
import {
	changeOrder,
	installerStatement,
	installerStatementLine,
	job,
	jobCompletion,
	user
} from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';

export type Statement = typeof installerStatement.$inferSelect;
export type StatementLine = typeof installerStatementLine.$inferSelect;

/** Statements of the store (or of one installer), newest period first. */
export async function list(tx: StoreTx, filter: { installerId?: string } = {}) {
	return tx
		.select({
			id: installerStatement.id,
			installerId: installerStatement.installerId,
			installerName: user.name,
			periodStart: installerStatement.periodStart,
			periodEnd: installerStatement.periodEnd,
			currency: installerStatement.currency,
			status: installerStatement.status,
			totalCents: installerStatement.totalCents,
			paidAt: installerStatement.paidAt,
			paidReference: installerStatement.paidReference
		})
		.from(installerStatement)
		.innerJoin(user, eq(user.id, installerStatement.installerId))
		.where(
			and(
				eq(installerStatement.organizationId, tx.storeId),
				filter.installerId ? eq(installerStatement.installerId, filter.installerId) : undefined
			)
		)
		.orderBy(desc(installerStatement.periodStart), asc(user.name))
		.limit(500);
}

/** One statement of the store (of this installer, when given); undefined otherwise. */
export async function read(tx: StoreTx, id: string, installerId?: string) {
	const [row] = await tx
		.select({ statement: installerStatement, installerName: user.name })
		.from(installerStatement)
		.innerJoin(user, eq(user.id, installerStatement.installerId))
		.where(
			and(
				eq(installerStatement.organizationId, tx.storeId),
				eq(installerStatement.id, id),
				installerId ? eq(installerStatement.installerId, installerId) : undefined
			)
		);
	return row;
}

/** A statement's lines with their job's number and title: install pay, extras, then the rest. */
export async function lines(tx: StoreTx, statementId: string) {
	return tx
		.select({
			id: installerStatementLine.id,
			kind: installerStatementLine.kind,
			jobId: installerStatementLine.jobId,
			jobNumber: job.number,
			jobTitle: job.title,
			changeOrderId: installerStatementLine.changeOrderId,
			description: installerStatementLine.description,
			reason: installerStatementLine.reason,
			amountCents: installerStatementLine.amountCents,
			createdAt: installerStatementLine.createdAt
		})
		.from(installerStatementLine)
		.leftJoin(
			job,
			and(
				eq(job.id, installerStatementLine.jobId),
				eq(job.organizationId, installerStatementLine.organizationId)
			)
		)
		.where(
			and(
				eq(installerStatementLine.organizationId, tx.storeId),
				eq(installerStatementLine.statementId, statementId)
			)
		)
		.orderBy(
			asc(installerStatementLine.kind),
			asc(installerStatementLine.createdAt),
			asc(job.number)
		);
}

export async function insert(
	tx: StoreWriteTx,
	input: { installerId: string; periodStart: string; periodEnd: string; currency: string }
) {
	// Two managers (or two taps) making the same statement at once: the second is told it exists.
	const [row] = await tx
		.insert(installerStatement)
		.values({ organizationId: tx.storeId, ...input })
		.onConflictDoNothing({
			target: [
				installerStatement.organizationId,
				installerStatement.installerId,
				installerStatement.periodStart
			]
		})
		.returning();
	return row as typeof row | undefined;
}

export async function insertLine(
	tx: StoreWriteTx,
	input: {
		statementId: string;
		installerId: string;
		kind: StatementLine['kind'];
		jobId?: string | null;
		changeOrderId?: string | null;
		description: string;
		reason?: string;
		amountCents: number;
	},
	actorId: string
) {
	const [row] = await tx
		.insert(installerStatementLine)
		.values({ organizationId: tx.storeId, ...input, createdBy: actorId })
		.returning();
	return row;
}

/** A statement locked for a change; undefined when not the store's. */
export async function lock(tx: StoreWriteTx, id: string) {
	const [row] = await tx
		.select()
		.from(installerStatement)
		.where(and(eq(installerStatement.organizationId, tx.storeId), eq(installerStatement.id, id)))
		.for('update');
	return row;
}

export async function markPaid(tx: StoreWriteTx, id: string, reference: string, actorId: string) {
	const now = new Date();
	const [row] = await tx
		.update(installerStatement)
		.set({ status: 'paid', paidAt: now, paidBy: actorId, paidReference: reference, updatedAt: now })
		.where(and(eq(installerStatement.organizationId, tx.storeId), eq(installerStatement.id, id)))
		.returning();
	return row;
}

/**
 * The installer's jobs completed in the period (the completion's day in the store's time zone)
 * that no statement has paid yet.
 */
export async function completedUnpaid(
	tx: StoreTx,
	installerId: string,
	period: { start: string; end: string },
	timeZone: string
) {
	const day = sql`(${jobCompletion.completedAt} at time zone ${timeZone})::date`;
	return tx
		.select({ jobId: job.id, number: job.number, title: job.title })
		.from(jobCompletion)
		.innerJoin(
			job,
			and(eq(job.id, jobCompletion.jobId), eq(job.organizationId, jobCompletion.organizationId))
		)
		.leftJoin(
			installerStatementLine,
			and(
				eq(installerStatementLine.organizationId, job.organizationId),
				eq(installerStatementLine.jobId, job.id),
				eq(installerStatementLine.installerId, installerId),
				eq(installerStatementLine.kind, 'install')
			)
		)
		.where(
			and(
				eq(jobCompletion.organizationId, tx.storeId),
				eq(job.installerId, installerId),
				sql`${day} between ${period.start}::date and ${period.end}::date`,
				isNull(installerStatementLine.id)
			)
		)
		.orderBy(asc(jobCompletion.completedAt))
		.limit(1000);
}

/**
 * Change orders the customer approved in the period (their decision's day in the store's time
 * zone) on the installer's jobs, not yet on a statement.
 */
export async function approvedExtrasUnpaid(
	tx: StoreTx,
	installerId: string,
	period: { start: string; end: string },
	timeZone: string
) {
	const day = sql`(${changeOrder.decidedAt} at time zone ${timeZone})::date`;
	return tx
		.select({
			changeOrderId: changeOrder.id,
			number: changeOrder.number,
			jobId: job.id,
			jobNumber: job.number,
			payDeltaCents: changeOrder.payDeltaCents
		})
		.from(changeOrder)
		.innerJoin(
			job,
			and(eq(job.id, changeOrder.jobId), eq(job.organizationId, changeOrder.organizationId))
		)
		.leftJoin(
			installerStatementLine,
			and(
				eq(installerStatementLine.organizationId, changeOrder.organizationId),
				eq(installerStatementLine.changeOrderId, changeOrder.id),
				eq(installerStatementLine.kind, 'extra')
			)
		)
		.where(
			and(
				eq(changeOrder.organizationId, tx.storeId),
				eq(changeOrder.status, 'approved'),
				eq(job.installerId, installerId),
				sql`${day} between ${period.start}::date and ${period.end}::date`,
				isNull(installerStatementLine.id)
			)
		)
		.orderBy(asc(changeOrder.decidedAt))
		.limit(1000);
}
