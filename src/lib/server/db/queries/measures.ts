import { and, eq, sql } from 'drizzle-orm';
import type { MeasureDraft } from '../../../measure/draft';
import { job, measure, user } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { runShape } from '../named';

export interface StoredMeasure {
	draft: MeasureDraft;
	version: number;
	updatedAt: Date;
	updatedByName: string | null;
}

export type SaveResult =
	| { ok: true; version: number; updatedAt: Date }
	| { ok: false; reason: 'not_found' }
	| { ok: false; reason: 'conflict'; current: StoredMeasure };

const storedColumns = {
	draft: measure.draft,
	version: measure.version,
	updatedAt: measure.updatedAt,
	updatedByName: user.name
};

/** The job's measure, or undefined when nothing was measured yet (or the job is not the store's). */
export async function read(tx: StoreTx, jobId: string): Promise<StoredMeasure | undefined> {
	const [row] = await runShape(
		tx,
		'measures.read',
		() =>
			tx
				.select(storedColumns)
				.from(measure)
				.leftJoin(user, eq(user.id, measure.updatedBy))
				.where(
					and(
						eq(measure.organizationId, sql.placeholder('store')),
						eq(measure.jobId, sql.placeholder('job'))
					)
				),
		{ store: tx.storeId, job: jobId }
	);
	return row;
}

/**
 * Saves the measure when `baseVersion` is the version the editor started from (0: nothing
 * saved yet). Otherwise someone else saved in between: nothing is written and their version
 * comes back, so the editor can show both.
 */
export async function save(
	tx: StoreWriteTx,
	jobId: string,
	draft: MeasureDraft,
	baseVersion: number,
	userId: string
): Promise<SaveResult> {
	const storeId = tx.storeId;
	const [owner] = await tx
		.select({ id: job.id })
		.from(job)
		.where(and(eq(job.organizationId, storeId), eq(job.id, jobId)))
		.for('update');
	if (!owner) return { ok: false, reason: 'not_found' };
	const [current] = await tx
		.select(storedColumns)
		.from(measure)
		.leftJoin(user, eq(user.id, measure.updatedBy))
		.where(and(eq(measure.organizationId, storeId), eq(measure.jobId, jobId)));
	const now = new Date();
	if (!current) {
		if (baseVersion !== 0) return { ok: false, reason: 'not_found' };
		await tx
			.insert(measure)
			.values({ organizationId: storeId, jobId, draft, version: 1, updatedBy: userId });
		return { ok: true, version: 1, updatedAt: now };
	}
	if (current.version !== baseVersion) return { ok: false, reason: 'conflict', current };
	const version = current.version + 1;
	await tx
		.update(measure)
		.set({ draft, version, updatedBy: userId, updatedAt: now })
		.where(and(eq(measure.organizationId, storeId), eq(measure.jobId, jobId)));
	return { ok: true, version, updatedAt: now };
}
