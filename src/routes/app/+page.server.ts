import { countByStatus, list } from '$lib/server/db/queries/jobs';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, user, role } = requirePermission({ job: ['read'] });
	const viewer = { userId: user.id, role };
	const [counts, recent] = await Promise.all([
		countByStatus(store.id, viewer),
		list(store.id, { sort: 'updated', dir: 'desc', page: 1, pageSize: 8, q: null }, viewer)
	]);
	return { counts, recent: recent.rows };
};
