import { countByStatus, list } from '$lib/server/db/queries/jobs';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, user, role } = requirePermission({ job: ['read'] });
	const viewer = { userId: user.id, role };
	return readInStore(store.id, async (tx) => {
		const counts = await countByStatus(tx, viewer);
		const recent = await list(
			tx,
			{ sort: 'updated', dir: 'desc', page: 1, pageSize: 8, q: null },
			viewer
		);
		return { counts, recent: recent.rows };
	});
};
