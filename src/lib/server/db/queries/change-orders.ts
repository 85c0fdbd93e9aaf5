import { and, asc, desc, eq, inArray, isNull, max, ne, sql } from 'drizzle-orm';
import {
	changeOrder,
	fieldItem,
	fieldPhoto,
	fieldReport,
	installerProfile,
	payment,
	task
} from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { runShape } from '../named';

export type ChangeOrderRow = typeof changeOrder.$inferSelect;
export type NewChangeOrder = Omit<typeof changeOrder.$inferInsert, 'organizationId' | 'id'>;
export type FieldPhotoRow = typeof fieldPhoto.$inferSelect;

const mine = (tx: StoreTx) => eq(changeOrder.organizationId, tx.storeId);

/** A field report of the store; undefined when not the store's. */
export async function readReport(tx: StoreTx, reportId: string) {
	const [row] = await tx
		.select()
		.from(fieldReport)
		.where(and(eq(fieldReport.organizationId, tx.storeId), eq(fieldReport.id, reportId)));
	return row;
}

/** The live (not deleted) items of kind `found` of a report, oldest first. */
export async function liveFoundItems(tx: StoreTx, reportId: string) {
	return tx
		.select({
			clientId: fieldItem.clientId,
			roomId: fieldItem.roomId,
			ref: fieldItem.ref,
			refKey: fieldItem.refKey,
			qty: fieldItem.qty,
			unit: fieldItem.unit,
			note: fieldItem.note
		})
		.from(fieldItem)
		.where(
			and(
				eq(fieldItem.organizationId, tx.storeId),
				eq(fieldItem.reportId, reportId),
				eq(fieldItem.kind, 'found'),
				isNull(fieldItem.deletedAt)
			)
		)
		.orderBy(asc(fieldItem.recordedAt), asc(fieldItem.id));
}

/** The installer's own pay rates in this store (none when they have no profile). */
export async function payRatesOf(tx: StoreTx, userId: string) {
	const [row] = await tx
		.select({ payRates: installerProfile.payRates })
		.from(installerProfile)
		.where(
			and(eq(installerProfile.organizationId, tx.storeId), eq(installerProfile.userId, userId))
		);
	return row?.payRates ?? [];
}

/** A change order of the store; undefined when not the store's. */
export async function read(tx: StoreTx, id: string): Promise<ChangeOrderRow | undefined> {
	const [row] = await tx
		.select()
		.from(changeOrder)
		.where(and(mine(tx), eq(changeOrder.id, id)));
	return row;
}

/** A job's change order by its number (`CO-2` is 2); undefined when the job has none such. */
export async function readByNumber(tx: StoreTx, jobId: string, number: number) {
	const [row] = await tx
		.select()
		.from(changeOrder)
		.where(and(mine(tx), eq(changeOrder.jobId, jobId), eq(changeOrder.number, number)));
	return row;
}

/** A change order of the job, locked until the transaction ends. */
export async function lock(tx: StoreWriteTx, jobId: string, id: string) {
	const [row] = await tx
		.select()
		.from(changeOrder)
		.where(and(mine(tx), eq(changeOrder.jobId, jobId), eq(changeOrder.id, id)))
		.for('update');
	return row;
}

/** The job's change order still in the works (submitted or reviewed), locked. */
export async function lockOpen(tx: StoreWriteTx, jobId: string) {
	const [row] = await tx
		.select()
		.from(changeOrder)
		.where(
			and(
				mine(tx),
				eq(changeOrder.jobId, jobId),
				inArray(changeOrder.status, ['submitted', 'reviewed'])
			)
		)
		.for('update');
	return row;
}

/** A job's change orders, newest first. */
export async function listForJob(tx: StoreTx, jobId: string) {
	return runShape(
		tx,
		'changeOrders.listForJob',
		() =>
			tx
				.select()
				.from(changeOrder)
				.where(
					and(
						eq(changeOrder.organizationId, sql.placeholder('store')),
						eq(changeOrder.jobId, sql.placeholder('job'))
					)
				)
				.orderBy(desc(changeOrder.number)),
		{ store: tx.storeId, job: jobId }
	);
}

/** The change orders a customer may see: those the store sent (never one still in review). */
export async function listSent(tx: StoreTx, jobId: string) {
	return tx
		.select()
		.from(changeOrder)
		.where(
			and(
				mine(tx),
				eq(changeOrder.jobId, jobId),
				ne(changeOrder.status, 'submitted'),
				sql`${changeOrder.sentAt} is not null`
			)
		)
		.orderBy(asc(changeOrder.number));
}

/** The next change-order number of a job. */
export async function nextNumber(tx: StoreWriteTx, jobId: string): Promise<number> {
	const [row] = await tx
		.select({ n: max(changeOrder.number) })
		.from(changeOrder)
		.where(and(mine(tx), eq(changeOrder.jobId, jobId)));
	return (row?.n ?? 0) + 1;
}

export async function insert(tx: StoreWriteTx, values: NewChangeOrder): Promise<ChangeOrderRow> {
	const [row] = await tx
		.insert(changeOrder)
		.values({ ...values, organizationId: tx.storeId })
		.returning();
	return row;
}

export async function update(
	tx: StoreWriteTx,
	id: string,
	values: Partial<Omit<NewChangeOrder, 'jobId'>>
): Promise<ChangeOrderRow | undefined> {
	const [row] = await tx
		.update(changeOrder)
		.set({ ...values, updatedAt: new Date() })
		.where(and(mine(tx), eq(changeOrder.id, id)))
		.returning();
	return row;
}

/** The payments made (or being made) on a change order, oldest first. */
export async function paymentsOf(tx: StoreTx, changeOrderId: string) {
	return tx
		.select()
		.from(payment)
		.where(and(eq(payment.organizationId, tx.storeId), eq(payment.changeOrderId, changeOrderId)))
		.orderBy(asc(payment.createdAt));
}

/** The live photos of a job's report (purpose `report`), oldest first. */
export async function reportPhotos(tx: StoreTx, jobId: string) {
	return livePhotos(tx, jobId, 'report');
}

/** The live completion photos of a job. */
export async function completionPhotos(tx: StoreTx, jobId: string) {
	return livePhotos(tx, jobId, 'completion');
}

async function livePhotos(tx: StoreTx, jobId: string, purpose: 'report' | 'completion') {
	return tx
		.select()
		.from(fieldPhoto)
		.where(
			and(
				eq(fieldPhoto.organizationId, tx.storeId),
				eq(fieldPhoto.jobId, jobId),
				eq(fieldPhoto.purpose, purpose),
				isNull(fieldPhoto.deletedAt)
			)
		)
		.orderBy(asc(fieldPhoto.createdAt), asc(fieldPhoto.id));
}

/**
 * What the installer may see of a job's change orders: the number, where it stands and their own
 * pay difference. Never a price, a tax or a total.
 */
export async function decisionsForInstaller(tx: StoreTx, jobId: string) {
	return tx
		.select({
			number: changeOrder.number,
			status: changeOrder.status,
			payDeltaCents: changeOrder.payDeltaCents,
			currency: changeOrder.currency,
			decidedAt: changeOrder.decidedAt
		})
		.from(changeOrder)
		.where(and(mine(tx), eq(changeOrder.jobId, jobId)))
		.orderBy(asc(changeOrder.number));
}

/** Whether an e-mail of the purpose was already queued for the job (in any state). */
export async function mailQueued(tx: StoreTx, jobId: string, purpose: string): Promise<boolean> {
	const [row] = await tx
		.select({ id: task.id })
		.from(task)
		.where(
			and(
				eq(task.organizationId, tx.storeId),
				eq(task.jobId, jobId),
				eq(task.kind, 'mail'),
				sql`${task.payload}->>'purpose' = ${purpose}`
			)
		)
		.limit(1);
	return Boolean(row);
}

/** Removes a change order never sent to the customer (the database keeps every other one). */
export async function remove(tx: StoreWriteTx, id: string): Promise<boolean> {
	const rows = await tx
		.delete(changeOrder)
		.where(and(mine(tx), eq(changeOrder.id, id), eq(changeOrder.status, 'submitted')))
		.returning({ id: changeOrder.id });
	return rows.length > 0;
}
