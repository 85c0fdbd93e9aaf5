import { refKey } from '$lib/estimating/pricing';
import * as bookings from '$lib/server/db/queries/bookings';
import * as installers from '$lib/server/db/queries/installers';
import * as settings from '$lib/server/db/queries/settings';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { payItems } from '$lib/server/installers/profile';
import { can } from '$lib/server/permissions';
import { addDays, today } from '$lib/schedule/days';
import type { PageServerLoad } from './$types';

/**
 * The installer's own profile in the active store, and their coming bookings. Only their own
 * rates are shown (never another installer's, never a price): what the price book pays is
 * named, not figured, since it is the store's.
 */
export const load: PageServerLoad = async () => {
	const { store, user, grants } = requirePermission({ assignedJob: ['read'] });
	const seesPay = can(grants, { installerPay: ['read'] });
	const from = today(store.timeZone);
	return readInStore(store.id, async (tx) => {
		const me = await installers.read(tx, user.id);
		const profile = me?.profile ?? null;
		const { currency } = await settings.termsOf(tx);
		const names = new Map((await payItems(tx, currency)).map((i) => [i.key, i]));
		const coming = await bookings.listLive(tx, {
			from,
			to: addDays(from, 120),
			installerId: user.id
		});
		return {
			currency,
			profile: profile && {
				crewSize: profile.crewSize,
				floorKinds: profile.floorKinds,
				sqFtPerDay: profile.sqFtPerDay,
				daysOff: profile.daysOff,
				phone: profile.phone,
				notes: profile.notes,
				rates: seesPay
					? profile.payRates.map((r) => {
							const item = names.get(refKey(r.ref));
							return {
								key: refKey(r.ref),
								name: item?.name ?? refKey(r.ref),
								basis: item?.basis ?? null,
								payCents: r.payCents
							};
						})
					: []
			},
			away: await installers.listTimeOff(tx, { from, installerId: user.id }),
			bookings: coming.map((b) => ({
				id: b.id,
				jobId: b.jobId,
				jobNumber: b.jobNumber,
				title: b.jobTitle,
				startsOn: b.startsOn,
				days: b.days,
				arrivesAt: b.arrivesAt?.slice(0, 5) ?? ''
			}))
		};
	});
};
