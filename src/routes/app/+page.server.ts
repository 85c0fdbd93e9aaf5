import { countByStatus, list } from '$lib/server/db/queries/jobs';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, scope } = requirePermission({ job: ['read'] });
	const [counts, recent] = await Promise.all([
		countByStatus(store.id, scope),
		list(store.id, { sort: 'updated', dir: 'desc', page: 1, pageSize: 8, q: null }, scope)
	]);
	return { counts, recent: recent.rows };
};
