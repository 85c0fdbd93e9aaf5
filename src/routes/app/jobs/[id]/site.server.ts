// The job page's "Site" section: where the job is, and moving it to another of the customer's sites.
import * as jobs from '$lib/server/db/queries/jobs';
import * as sites from '$lib/server/db/queries/sites';
import { requirePermission } from '$lib/server/guards';
import { can, type Grants } from '$lib/server/permissions';
import { jobSiteSchema } from '$lib/schemas/site';
import { error, fail, type RequestEvent } from '@sveltejs/kit';
import { formFields } from '$lib/input';

/** The job's site and the customer's sites to choose from. */
export async function loadJobSite(
	storeId: string,
	job: { id: string; customerId: string },
	grants: Grants
) {
	const [current, choices] = await Promise.all([
		sites.forJob(storeId, job.id),
		sites.listForCustomer(storeId, job.customerId)
	]);
	return { current: current ?? null, choices, canChange: can(grants, { job: ['update'] }) };
}

/** `?/site`: puts the job at one of its customer's sites, or none. */
export async function siteAction({ request, params }: RequestEvent<{ id: string }>) {
	const { store, scope } = requirePermission({ job: ['update'] });
	const job = await jobs.read(store.id, params.id, scope);
	if (!job) error(404, 'Not found');
	const parsed = jobSiteSchema.safeParse(formFields(await request.formData()));
	if (!parsed.success) return fail(400, { siteError: 'Choose a site' });
	const result = await sites.setJobSite(store.id, job.id, parsed.data.siteId);
	if (result !== 'saved') return fail(400, { siteError: 'Choose one of this customer’s sites.' });
	return { siteSaved: true };
}
