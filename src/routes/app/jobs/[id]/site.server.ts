// The job page's "Site" section: where the job is, and moving it to another of the customer's sites.
import * as jobs from '$lib/server/db/queries/jobs';
import * as sites from '$lib/server/db/queries/sites';
import { inStore, type StoreTx } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { can, type Grants } from '$lib/server/permissions';
import { jobSiteSchema } from '$lib/schemas/site';
import { error, fail, type RequestEvent } from '@sveltejs/kit';
import { formFields } from '$lib/input';

/** The job's site and the customer's sites to choose from. */
export async function loadJobSite(
	tx: StoreTx,
	job: { id: string; customerId: string },
	grants: Grants
) {
	const current = await sites.forJob(tx, job.id);
	const choices = await sites.listForCustomer(tx, job.customerId);
	return { current: current ?? null, choices, canChange: can(grants, { job: ['update'] }) };
}

/** `?/site`: puts the job at one of its customer's sites, or none. */
export async function siteAction({ request, params }: RequestEvent<{ id: string }>) {
	const { store, scope } = requirePermission({ job: ['update'] });
	const parsed = jobSiteSchema.safeParse(formFields(await request.formData()));
	const result = await inStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		if (!job) return 'no_job' as const;
		if (!parsed.success) return 'invalid' as const;
		return sites.setJobSite(tx, job.id, parsed.data.siteId);
	});
	if (result === 'no_job') error(404, 'Not found');
	if (result === 'invalid') return fail(400, { siteError: 'Choose a site' });
	if (result !== 'saved') return fail(400, { siteError: 'Choose one of this customer’s sites.' });
	return { siteSaved: true };
}
