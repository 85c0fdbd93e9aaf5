import * as installers from '$lib/server/db/queries/installers';
import { inStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import type { PageServerLoad } from './$types';

// Profiles are made here, on a manager's first open (and by booking or statements when they
// first need one): an installer who joined has a profile with the store's defaults from then on.
export const load: PageServerLoad = async () => {
	const { store, grants } = requirePermission({ installer: ['read'] });
	const canUpdate = can(grants, { installer: ['update'] });
	const rows = await inStore(store.id, async (tx) => {
		if (canUpdate) await installers.ensureProfiles(tx);
		return installers.list(tx);
	});
	return {
		installers: rows.map((r) => ({
			userId: r.userId,
			name: r.name,
			email: r.email,
			crewSize: r.profile?.crewSize ?? 1,
			floorKinds: r.profile?.floorKinds ?? [],
			daysOff: r.profile?.daysOff ?? [],
			ownRates: r.profile?.payRates.length ?? 0
		}))
	};
};
