// The installer's field report, its items and photos, the booking an installer sees, and the
// job's completion. SQL only: the rules (who, when, how two phones merge) are in
// $lib/server/field/.
import { and, asc, desc, eq, gte, isNull, sql } from 'drizzle-orm';
import {
	booking,
	customer,
	fieldItem,
	fieldPhoto,
	fieldReport,
	job,
	jobCompletion,
	jobEvent,
	site
} from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { runShape } from '../named';
import { addDays } from '../../../schedule/days';
import { MAX_BOOKING_DAYS } from '../../../schemas/crew';

export type FieldReport = typeof fieldReport.$inferSelect;
export type FieldItem = typeof fieldItem.$inferSelect;
export type FieldPhoto = typeof fieldPhoto.$inferSelect;
export type NewFieldItem = Omit<typeof fieldItem.$inferInsert, 'organizationId' | 'id'>;
export type NewFieldPhoto = Omit<typeof fieldPhoto.$inferInsert, 'organizationId' | 'id'>;

/**
 * An installer's live bookings ending on or after `fromDay` ('YYYY-MM-DD'), soonest first.
 *
 * Written so that no estimate can make it read the installer's whole history. PostgreSQL estimates
 * a date range from the whole table, every store's bookings: in the big store of the scale seed it
 * took the installer's live bookings from today on for 1,954 (there were 152 of 22,224), and either
 * hashed all 22,224 of the installer's jobs or walked all their bookings by first day, 24-28 ms
 * (bench/README.md). So a booking's job is read by its key, one booking at a time (a lateral
 * subquery, which its `limit 1`, the one job a key finds, keeps from being merged into the join),
 * and the first day is bounded too: a booking lasts at most MAX_BOOKING_DAYS, so one ending on or
 * after `fromDay` started at most that many days less one before it.
 */
export async function listBookingsFor(tx: StoreTx, installerId: string, fromDay: string) {
	// Only what is still the installer's: the job's own installer is who sees it.
	const theirs = tx
		.select({
			id: job.id,
			organizationId: job.organizationId,
			number: job.number,
			title: job.title,
			status: job.status,
			customerId: job.customerId,
			siteId: job.siteId
		})
		.from(job)
		.where(
			and(
				eq(job.id, booking.jobId),
				eq(job.organizationId, booking.organizationId),
				eq(job.installerId, installerId)
			)
		)
		.limit(1)
		.as('theirs');
	return tx
		.select({
			bookingId: booking.id,
			jobId: theirs.id,
			number: theirs.number,
			title: theirs.title,
			status: theirs.status,
			customerName: customer.name,
			address: site.address,
			town: site.town,
			startsOn: booking.startsOn,
			endsOn: booking.endsOn,
			days: booking.days,
			arrivesAt: booking.arrivesAt
		})
		.from(booking)
		.innerJoinLateral(theirs, sql`true`)
		.innerJoin(
			customer,
			and(eq(customer.id, theirs.customerId), eq(customer.organizationId, theirs.organizationId))
		)
		.leftJoin(site, and(eq(site.id, theirs.siteId), eq(site.organizationId, theirs.organizationId)))
		.where(
			and(
				eq(booking.organizationId, tx.storeId),
				eq(booking.installerId, installerId),
				isNull(booking.cancelledAt),
				gte(booking.endsOn, fromDay),
				gte(booking.startsOn, addDays(fromDay, 1 - MAX_BOOKING_DAYS))
			)
		)
		.orderBy(asc(booking.startsOn), asc(theirs.number))
		.limit(200);
}

/** The job's live booking. */
export async function readBooking(tx: StoreTx, jobId: string) {
	const [row] = await tx
		.select({
			startsOn: booking.startsOn,
			endsOn: booking.endsOn,
			days: booking.days,
			arrivesAt: booking.arrivesAt,
			notes: booking.notes
		})
		.from(booking)
		.where(
			and(
				eq(booking.organizationId, tx.storeId),
				eq(booking.jobId, jobId),
				isNull(booking.cancelledAt)
			)
		);
	return row;
}

/** The job's site (where the work is, and the notes on getting in). */
export async function readSite(tx: StoreTx, jobId: string) {
	const [row] = await tx
		.select({ address: site.address, town: site.town, postcode: site.postcode, notes: site.notes })
		.from(job)
		.innerJoin(site, and(eq(site.id, job.siteId), eq(site.organizationId, job.organizationId)))
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, jobId)));
	return row;
}

export async function readReport(tx: StoreTx, jobId: string): Promise<FieldReport | undefined> {
	const [row] = await runShape(
		tx,
		'field.readReport',
		() =>
			tx
				.select()
				.from(fieldReport)
				.where(
					and(
						eq(fieldReport.organizationId, sql.placeholder('store')),
						eq(fieldReport.jobId, sql.placeholder('job'))
					)
				),
		{ store: tx.storeId, job: jobId }
	);
	return row;
}

/** Makes the job's report at the first check-in; undefined when it already had one. */
export async function createReport(tx: StoreWriteTx, jobId: string, userId: string) {
	const [row] = await tx
		.insert(fieldReport)
		.values({ organizationId: tx.storeId, jobId, checkedInAt: new Date(), checkedInBy: userId })
		.onConflictDoNothing()
		.returning();
	return row;
}

export async function markSubmitted(tx: StoreWriteTx, reportId: string, userId: string) {
	const [row] = await tx
		.update(fieldReport)
		.set({ submittedAt: new Date(), submittedBy: userId })
		.where(and(eq(fieldReport.organizationId, tx.storeId), eq(fieldReport.id, reportId)))
		.returning();
	return row;
}

export async function addEvent(
	tx: StoreWriteTx,
	jobId: string,
	kind: 'check_in' | 'note',
	actorId: string,
	note = ''
) {
	await tx.insert(jobEvent).values({ organizationId: tx.storeId, jobId, kind, actorId, note });
}

/** Every item of a report, deleted ones too (they merge as well), oldest first. */
export async function listItems(tx: StoreTx, reportId: string): Promise<FieldItem[]> {
	return runShape(
		tx,
		'field.listItems',
		() =>
			tx
				.select()
				.from(fieldItem)
				.where(
					and(
						eq(fieldItem.organizationId, sql.placeholder('store')),
						eq(fieldItem.reportId, sql.placeholder('report'))
					)
				)
				.orderBy(asc(fieldItem.recordedAt), asc(fieldItem.createdAt)),
		{ store: tx.storeId, report: reportId }
	);
}

export async function readItemByClientId(
	tx: StoreTx,
	clientId: string
): Promise<FieldItem | undefined> {
	const [row] = await tx
		.select()
		.from(fieldItem)
		.where(and(eq(fieldItem.organizationId, tx.storeId), eq(fieldItem.clientId, clientId)));
	return row;
}

/** The live found item of a report for a room and item, if any. */
export async function readLiveFound(
	tx: StoreTx,
	reportId: string,
	roomId: string | null,
	refKey: string
): Promise<FieldItem | undefined> {
	const [row] = await tx
		.select()
		.from(fieldItem)
		.where(
			and(
				eq(fieldItem.organizationId, tx.storeId),
				eq(fieldItem.reportId, reportId),
				eq(fieldItem.kind, 'found'),
				sql`coalesce(${fieldItem.roomId}, '') = ${roomId ?? ''}`,
				eq(fieldItem.refKey, refKey),
				isNull(fieldItem.deletedAt)
			)
		);
	return row;
}

/**
 * Inserts an item unless its client id is already stored (a resend); undefined then. A second
 * live found item for the same room and item is refused by `field_item_found_once_uq`, which
 * the caller checks first with `readLiveFound` under the report's lock.
 */
export async function insertItem(tx: StoreWriteTx, values: NewFieldItem) {
	const [row] = await tx
		.insert(fieldItem)
		.values({ ...values, organizationId: tx.storeId })
		.onConflictDoNothing({ target: [fieldItem.organizationId, fieldItem.clientId] })
		.returning();
	return row;
}

/** Writes an edit on top of `version` and raises it; undefined when the version moved on. */
export async function updateItem(
	tx: StoreWriteTx,
	id: string,
	version: number,
	values: Partial<
		Pick<FieldItem, 'qty' | 'reading' | 'readingKind' | 'note' | 'deletedAt' | 'recordedAt'>
	>
) {
	const [row] = await tx
		.update(fieldItem)
		.set({ ...values, version: sql`${fieldItem.version} + 1`, updatedAt: new Date() })
		.where(
			and(
				eq(fieldItem.organizationId, tx.storeId),
				eq(fieldItem.id, id),
				eq(fieldItem.version, version)
			)
		)
		.returning();
	return row;
}

/** Locks the report row, so two phones' sends on one job take turns. */
export async function lockReport(tx: StoreWriteTx, reportId: string) {
	await tx
		.select({ id: fieldReport.id })
		.from(fieldReport)
		.where(and(eq(fieldReport.organizationId, tx.storeId), eq(fieldReport.id, reportId)))
		.for('update');
}

export async function readPhotoByClientId(tx: StoreTx, clientId: string) {
	const [row] = await tx
		.select()
		.from(fieldPhoto)
		.where(and(eq(fieldPhoto.organizationId, tx.storeId), eq(fieldPhoto.clientId, clientId)));
	return row;
}

export async function insertPhoto(tx: StoreWriteTx, values: NewFieldPhoto) {
	const [row] = await tx
		.insert(fieldPhoto)
		.values({ ...values, organizationId: tx.storeId })
		.onConflictDoNothing({ target: [fieldPhoto.organizationId, fieldPhoto.clientId] })
		.returning();
	return row;
}

/** A live photo of a job. */
export async function readPhoto(tx: StoreTx, jobId: string, photoId: string) {
	const [row] = await tx
		.select()
		.from(fieldPhoto)
		.where(
			and(
				eq(fieldPhoto.organizationId, tx.storeId),
				eq(fieldPhoto.jobId, jobId),
				eq(fieldPhoto.id, photoId),
				isNull(fieldPhoto.deletedAt)
			)
		);
	return row;
}

/** A live photo of the store by id, whatever its job. */
export async function readPhotoById(tx: StoreTx, photoId: string) {
	const [row] = await tx
		.select()
		.from(fieldPhoto)
		.where(
			and(
				eq(fieldPhoto.organizationId, tx.storeId),
				eq(fieldPhoto.id, photoId),
				isNull(fieldPhoto.deletedAt)
			)
		);
	return row;
}

/** A job's live photos, newest first. */
export async function listPhotos(tx: StoreTx, jobId: string) {
	return runShape(
		tx,
		'field.listPhotos',
		() =>
			tx
				.select({
					id: fieldPhoto.id,
					clientId: fieldPhoto.clientId,
					purpose: fieldPhoto.purpose,
					roomId: fieldPhoto.roomId,
					itemClientId: fieldPhoto.itemClientId,
					caption: fieldPhoto.caption,
					width: fieldPhoto.width,
					height: fieldPhoto.height,
					takenAt: fieldPhoto.takenAt,
					createdAt: fieldPhoto.createdAt
				})
				.from(fieldPhoto)
				.where(
					and(
						eq(fieldPhoto.organizationId, sql.placeholder('store')),
						eq(fieldPhoto.jobId, sql.placeholder('job')),
						isNull(fieldPhoto.deletedAt)
					)
				)
				.orderBy(desc(fieldPhoto.createdAt))
				.limit(500),
		{ store: tx.storeId, job: jobId }
	);
}

export async function readCompletion(tx: StoreTx, jobId: string) {
	const [row] = await tx
		.select()
		.from(jobCompletion)
		.where(and(eq(jobCompletion.organizationId, tx.storeId), eq(jobCompletion.jobId, jobId)));
	return row;
}

export async function insertCompletion(
	tx: StoreWriteTx,
	jobId: string,
	userId: string,
	walkthroughNotes: string
) {
	const [row] = await tx
		.insert(jobCompletion)
		.values({
			organizationId: tx.storeId,
			jobId,
			completedAt: new Date(),
			completedBy: userId,
			walkthroughNotes
		})
		.onConflictDoNothing()
		.returning();
	return row;
}
