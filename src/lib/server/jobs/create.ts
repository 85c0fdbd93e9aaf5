import * as customers from '../db/queries/customers';
import * as jobs from '../db/queries/jobs';
import type { StoreWriteTx } from '../db/tenant';
import { placeJob, siteFits, type SiteChoice } from './sites';

export type CreateJobResult =
	{ ok: true; job: jobs.Job } | { ok: false; reason: 'no_customer' | 'other_site' };

/**
 * A new draft job for a customer of the store, at the site chosen (a new site is made with it):
 * the job and its site are written together or not at all.
 */
export async function createJob(
	tx: StoreWriteTx,
	input: { customerId: string; title: string; notes?: string },
	where: SiteChoice,
	actorId: string
): Promise<CreateJobResult> {
	if (!(await customers.read(tx, input.customerId))) return { ok: false, reason: 'no_customer' };
	if (!(await siteFits(tx, input.customerId, where))) return { ok: false, reason: 'other_site' };
	const job = await jobs.create(tx, input, actorId);
	if (!job) return { ok: false, reason: 'no_customer' };
	await placeJob(tx, job, where);
	return { ok: true, job };
}
