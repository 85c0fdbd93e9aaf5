import { isOpen } from '$lib/jobs/status';
import { list } from '$lib/server/db/queries/jobs';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, scope } = requirePermission({ assignedJob: ['read'] });
	const { rows } = await readInStore(store.id, (tx) =>
		list(tx, { sort: 'updated', dir: 'desc', page: 1, pageSize: 100, q: null }, scope)
	);
	const open = rows.filter((j) => isOpen(j.status));
	return { open, done: rows.filter((j) => !open.includes(j)) };
};
