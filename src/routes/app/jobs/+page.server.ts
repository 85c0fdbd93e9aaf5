import { list, listPlans } from '$lib/server/db/queries/jobs';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { jobListSchema } from '$lib/schemas/job';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const { store, user, scope } = requirePermission({ job: ['read'] });
	const parsed = jobListSchema.safeParse(Object.fromEntries(url.searchParams));
	const query = parsed.success ? parsed.data : jobListSchema.parse({});
	const mine = url.searchParams.get('mine') === '1';
	const asked = { ...query, salespersonId: mine ? user.id : undefined };
	const { rows, total, totalCapped } = await readInStore(store.id, (tx) => list(tx, asked, scope), {
		plans: listPlans(asked, scope)
	});
	return { rows, total, totalCapped, query, mine };
};
