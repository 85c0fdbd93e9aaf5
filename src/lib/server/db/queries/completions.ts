import { and, eq, sql } from 'drizzle-orm';
import { jobCompletion } from '../schema';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { runShape } from '../named';

export type Completion = typeof jobCompletion.$inferSelect;

/** A job's completion (the installer marked it complete); undefined when not yet. */
export async function read(tx: StoreTx, jobId: string): Promise<Completion | undefined> {
	const [row] = await runShape(
		tx,
		'completions.read',
		() =>
			tx
				.select()
				.from(jobCompletion)
				.where(
					and(
						eq(jobCompletion.organizationId, sql.placeholder('store')),
						eq(jobCompletion.jobId, sql.placeholder('job'))
					)
				),
		{ store: tx.storeId, job: jobId }
	);
	return row;
}

/** A job's completion, locked until the transaction ends. */
export async function lock(tx: StoreWriteTx, jobId: string): Promise<Completion | undefined> {
	const [row] = await tx
		.select()
		.from(jobCompletion)
		.where(and(eq(jobCompletion.organizationId, tx.storeId), eq(jobCompletion.jobId, jobId)))
		.for('update');
	return row;
}

/** The customer's sign-off, written once (the database keeps a signed completion as it is). */
export async function sign(
	tx: StoreWriteTx,
	id: string,
	signature: { name: string; ip: string | null; userAgent: string | null; at: Date }
): Promise<Completion | undefined> {
	const [row] = await tx
		.update(jobCompletion)
		.set({
			signedAt: signature.at,
			signedName: signature.name,
			signedIp: signature.ip,
			signedUserAgent: signature.userAgent,
			updatedAt: new Date()
		})
		.where(and(eq(jobCompletion.organizationId, tx.storeId), eq(jobCompletion.id, id)))
		.returning();
	return row;
}
