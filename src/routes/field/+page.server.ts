import { list } from '$lib/server/db/queries/jobs';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, scope } = requirePermission({ assignedJob: ['read'] });
	const { rows } = await list(
		store.id,
		{ sort: 'updated', dir: 'desc', page: 1, pageSize: 100, q: null },
		scope
	);
	const open = rows.filter((j) => j.status !== 'closed' && j.status !== 'cancelled');
	return { open, done: rows.filter((j) => !open.includes(j)) };
};
