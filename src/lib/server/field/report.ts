// The installer's report of a job: check in, record what was found (merged item by item when
// two phones work one job), submit it for the store's review, and mark the job complete.
import { changeOrderFromReport, type FromReportResult } from '../change-orders/from-report';
import { requestBalance } from '../sign-off/balance';
import { canCheckIn, canComplete, canReport, SITE_MOVES } from '$lib/jobs/status';
import type { FieldItemInput } from '$lib/schemas/field';
import * as field from '../db/queries/field';
import * as jobs from '../db/queries/jobs';
import type { StoreWriteTx } from '../db/tenant';
import { moveByHand } from '../jobs/move';
import { reportChoices } from './work-order';

export type CheckInResult =
	| { ok: true; report: field.FieldReport; first: boolean }
	| { ok: false; reason: 'not_found' | 'not_now'; message?: string };

/**
 * Checks the installer in on the job. The first check-in makes the report and starts the job
 * (`SITE_MOVES.checkIn`); later days' check-ins are events on the job.
 */
export async function checkIn(
	tx: StoreWriteTx,
	jobId: string,
	userId: string
): Promise<CheckInResult> {
	const status = await jobs.lockStatus(tx, jobId);
	if (!status) return { ok: false, reason: 'not_found' };
	if (!canCheckIn(status)) return { ok: false, reason: 'not_now' };
	const existing = await field.readReport(tx, jobId);
	if (existing) {
		await field.addEvent(tx, jobId, 'check_in', userId, 'Checked in');
		return { ok: true, report: existing, first: false };
	}
	if (status === SITE_MOVES.checkIn.from) {
		const moved = await moveByHand(tx, jobId, SITE_MOVES.checkIn.to, userId, 'Checked in on site');
		if (!moved.ok) return { ok: false, reason: 'not_now', message: moved.reason };
	}
	const report =
		(await field.createReport(tx, jobId, userId)) ?? (await field.readReport(tx, jobId));
	if (!report) return { ok: false, reason: 'not_now' };
	await field.addEvent(tx, jobId, 'check_in', userId, 'Checked in');
	return { ok: true, report, first: true };
}

/** What the phone hears back about one item it sent. */
export type ItemAnswer =
	| { clientId: string; status: 'stored' | 'updated' | 'unchanged'; item: PhoneItem }
	/** Another phone changed (or already recorded) it: the stored item, to merge by hand. */
	| { clientId: string; status: 'conflict'; item: PhoneItem; message: string }
	| { clientId: string; status: 'refused'; message: string };

/** An item as the phone keeps it (no ids of the server's, no who). */
export interface PhoneItem {
	clientId: string;
	kind: 'found' | 'reading' | 'note';
	roomId: string | null;
	refKey: string | null;
	qty: number | null;
	unit: string | null;
	readingKind: string | null;
	reading: unknown;
	note: string;
	version: number;
	deleted: boolean;
	recordedAt: string;
}

export function phoneItem(row: field.FieldItem): PhoneItem {
	return {
		clientId: row.clientId,
		kind: row.kind,
		roomId: row.roomId,
		refKey: row.refKey,
		qty: row.qty,
		unit: row.unit,
		readingKind: row.readingKind,
		reading: row.reading,
		note: row.note,
		version: row.version,
		deleted: row.deletedAt !== null,
		recordedAt: row.recordedAt.toISOString()
	};
}

/** Whether the stored item already says what the phone sent (a resend of an applied edit). */
function same(row: field.FieldItem, input: FieldItemInput): boolean {
	if ((row.deletedAt !== null) !== input.deleted) return false;
	if (row.note !== input.note) return false;
	if (input.kind === 'found') return row.qty === input.qty;
	if (input.kind === 'reading')
		return JSON.stringify(row.reading) === JSON.stringify(input.reading);
	return true;
}

export type RecordResult =
	| { ok: true; answers: ItemAnswer[] }
	| { ok: false; reason: 'not_found' | 'no_report' | 'not_now' };

/**
 * Stores what a phone sends, item by item: a new client id is inserted once (a resend answers the
 * stored item); an edit applies only on top of the version it started from, and a stale one gets
 * the stored item back as a conflict, never an overwrite. A second phone's new found item for a
 * room and item already recorded is a conflict too: it merges with the first.
 */
export async function recordItems(
	tx: StoreWriteTx,
	jobId: string,
	userId: string,
	items: FieldItemInput[]
): Promise<RecordResult> {
	const status = await jobs.lockStatus(tx, jobId);
	if (!status) return { ok: false, reason: 'not_found' };
	const report = await field.readReport(tx, jobId);
	if (!report) return { ok: false, reason: 'no_report' };
	if (!canReport(status)) return { ok: false, reason: 'not_now' };
	await field.lockReport(tx, report.id);
	const choices = await reportChoices(tx, jobId);
	const answers: ItemAnswer[] = [];
	for (const input of items) {
		answers.push(await recordOne(tx, report, userId, input, choices));
	}
	return { ok: true, answers };
}

async function recordOne(
	tx: StoreWriteTx,
	report: field.FieldReport,
	userId: string,
	input: FieldItemInput,
	choices: Awaited<ReturnType<typeof reportChoices>>
): Promise<ItemAnswer> {
	const { clientId } = input;
	const stored = await field.readItemByClientId(tx, clientId);
	if (stored && stored.reportId !== report.id) {
		return { clientId, status: 'refused', message: 'That id belongs to another report.' };
	}
	if (input.roomId !== null && !choices.roomIds.has(input.roomId)) {
		return { clientId, status: 'refused', message: 'That room is not on this job.' };
	}
	const recordedAt = new Date(input.recordedAt);
	if (stored) {
		if (stored.kind !== input.kind || stored.roomId !== input.roomId) {
			return { clientId, status: 'refused', message: 'An item keeps its kind and room.' };
		}
		if (same(stored, input)) return { clientId, status: 'unchanged', item: phoneItem(stored) };
		if (input.baseVersion === undefined || input.baseVersion !== stored.version) {
			return {
				clientId,
				status: 'conflict',
				item: phoneItem(stored),
				message: 'Changed on another phone since you started: choose which to keep.'
			};
		}
		const updated = await field.updateItem(tx, stored.id, stored.version, {
			qty: input.kind === 'found' ? input.qty : stored.qty,
			reading: input.kind === 'reading' ? input.reading : stored.reading,
			note: input.note,
			deletedAt: input.deleted ? (stored.deletedAt ?? new Date()) : null,
			recordedAt
		});
		if (!updated) {
			const now = (await field.readItemByClientId(tx, clientId))!;
			return {
				clientId,
				status: 'conflict',
				item: phoneItem(now),
				message: 'Changed on another phone since you started: choose which to keep.'
			};
		}
		return { clientId, status: 'updated', item: phoneItem(updated) };
	}
	if (input.baseVersion !== undefined) {
		return { clientId, status: 'refused', message: 'That item is not on the server.' };
	}
	const base = {
		reportId: report.id,
		clientId,
		roomId: input.roomId,
		note: input.note,
		recordedBy: userId,
		recordedAt,
		deletedAt: input.deleted ? new Date() : null
	};
	let row: field.FieldItem | undefined;
	if (input.kind === 'found') {
		const choice = choices.items.get(input.refKey);
		if (!choice) return { clientId, status: 'refused', message: 'That item is not in the quote.' };
		if (!input.deleted) {
			const live = await field.readLiveFound(tx, report.id, input.roomId, input.refKey);
			if (live) {
				return {
					clientId,
					status: 'conflict',
					item: phoneItem(live),
					message: 'Already recorded on another phone: choose which amount to keep.'
				};
			}
		}
		row = await field.insertItem(tx, {
			...base,
			kind: 'found',
			ref: choice.ref,
			refKey: input.refKey,
			qty: input.qty,
			unit: choice.unit
		});
	} else if (input.kind === 'reading') {
		row = await field.insertItem(tx, {
			...base,
			kind: 'reading',
			readingKind: input.readingKind,
			reading: input.reading
		});
	} else {
		row = await field.insertItem(tx, { ...base, kind: 'note' });
	}
	// A concurrent send of the same id got there first: answer what is stored.
	row ??= await field.readItemByClientId(tx, clientId);
	return { clientId, status: 'stored', item: phoneItem(row!) };
}

/** What the installer is told of the change order their report made (never its prices). */
export type ChangeNote = 'to_review' | 'nothing_differs' | 'with_customer' | 'priced_by_hand';

function changeNote(result: FromReportResult): ChangeNote {
	if (result.ok)
		return result.outcome === 'created' || result.outcome === 'updated'
			? 'to_review'
			: 'nothing_differs';
	return result.reason === 'with_customer' ? 'with_customer' : 'priced_by_hand';
}

export type SubmitResult =
	| { ok: true; report: field.FieldReport; change: ChangeNote }
	| { ok: false; reason: 'not_found' | 'no_report' | 'not_now' };

/**
 * Sends the report for the store's review (`submitted_at`). Sending again (a flaky network, or
 * more found later) updates the same report: there is one per job.
 */
export async function submitReport(
	tx: StoreWriteTx,
	jobId: string,
	userId: string
): Promise<SubmitResult> {
	const status = await jobs.lockStatus(tx, jobId);
	if (!status) return { ok: false, reason: 'not_found' };
	const report = await field.readReport(tx, jobId);
	if (!report) return { ok: false, reason: 'no_report' };
	if (!canReport(status)) return { ok: false, reason: 'not_now' };
	const submitted = await field.markSubmitted(tx, report.id, userId);
	// What was found against what was sold, priced into the job's open change order for the
	// store's review, in the same transaction as the submission.
	const change = await changeOrderFromReport(tx, report.id, userId);
	return { ok: true, report: submitted ?? report, change: changeNote(change) };
}

export type CompleteResult =
	| { ok: true; completion: NonNullable<Awaited<ReturnType<typeof field.readCompletion>>> }
	| { ok: false; reason: 'not_found' | 'not_now' | 'no_photo' };

/**
 * Marks the job complete with the customer's walk-through notes: the `job_completion` row and
 * the move `SITE_MOVES.complete`. At least one completion photo must be stored first.
 */
export async function completeJob(
	tx: StoreWriteTx,
	jobId: string,
	userId: string,
	walkthroughNotes: string
): Promise<CompleteResult> {
	const status = await jobs.lockStatus(tx, jobId);
	if (!status) return { ok: false, reason: 'not_found' };
	if (!canComplete(status)) {
		const done = await field.readCompletion(tx, jobId);
		// Sent twice: the first one stands.
		if (done) return { ok: true, completion: done };
		return { ok: false, reason: 'not_now' };
	}
	const photos = await field.listPhotos(tx, jobId);
	if (!photos.some((p) => p.purpose === 'completion')) return { ok: false, reason: 'no_photo' };
	const row = await field.insertCompletion(tx, jobId, userId, walkthroughNotes);
	if (!row) return { ok: false, reason: 'not_now' };
	const moved = await moveByHand(tx, jobId, SITE_MOVES.complete.to, userId, 'Marked complete');
	if (!moved.ok) return { ok: false, reason: 'not_now' };
	// The customer is asked for the balance (quote + approved change orders − payments) by
	// e-mail, queued in this transaction; nothing due, nothing sent.
	await requestBalance(tx, jobId, userId);
	return { ok: true, completion: row };
}
