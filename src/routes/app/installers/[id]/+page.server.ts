import * as installers from '$lib/server/db/queries/installers';
import * as settings from '$lib/server/db/queries/settings';
import { inStore } from '$lib/server/db/tenant';
import { parseForm, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { payItems, profileFromForm } from '$lib/server/installers/profile';
import { can } from '$lib/server/permissions';
import { moneyToInput } from '$lib/input';
import { refKey } from '$lib/estimating/pricing';
import { profileSchema, removeTimeOffSchema, timeOffSchema } from '$lib/schemas/crew';
import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const { store, grants } = requirePermission({ installer: ['read'] });
	const canUpdate = can(grants, { installer: ['update'] });
	const found = await inStore(store.id, async (tx) => {
		if (!(await installers.isInstaller(tx, params.id))) return null;
		if (canUpdate) await installers.ensureProfiles(tx, params.id);
		const { currency } = await settings.termsOf(tx);
		return {
			who: await installers.read(tx, params.id),
			items: await payItems(tx, currency),
			away: await installers.listTimeOff(tx, { installerId: params.id }),
			currency
		};
	});
	if (!found?.who) error(404, 'Not found');
	const { who, items, away, currency } = found;
	const profile = who.profile;
	const own = new Map((profile?.payRates ?? []).map((r) => [refKey(r.ref), r.payCents]));
	return {
		installer: { userId: who.userId, name: who.name, email: who.email },
		profile: {
			crewSize: profile?.crewSize ?? 1,
			floorKinds: profile?.floorKinds ?? [],
			sqFtPerDay: profile?.sqFtPerDay ?? {},
			daysOff: profile?.daysOff ?? [],
			phone: profile?.phone ?? '',
			notes: profile?.notes ?? ''
		},
		currency,
		rates: items.map((i) => ({
			key: i.key,
			name: i.name,
			basis: i.basis,
			bookPayCents: i.bookPayCents,
			own: moneyToInput(own.get(i.key), currency)
		})),
		away,
		canUpdate
	};
};

export const actions: Actions = {
	save: async ({ request, params }) => {
		const { store } = requirePermission({ installer: ['update'] });
		const parsed = await parseForm(request, profileSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await inStore(store.id, async (tx) => {
			if (!(await installers.isInstaller(tx, params.id))) return null;
			const { currency } = await settings.termsOf(tx);
			const read = profileFromForm(parsed.data, await payItems(tx, currency), currency);
			if (!read.ok) return read;
			await installers.save(tx, params.id, read.value);
			return read;
		});
		if (!result) error(404, 'Not found');
		if (!result.ok) return refuse(parsed.form, result.errors);
		return { saved: true };
	},
	away: async ({ request, params }) => {
		const { store, user } = requirePermission({ installer: ['update'] });
		const parsed = await parseForm(request, timeOffSchema);
		if (!parsed.ok) return fail(400, { away: true, ...parsed.failure.data });
		const made = await inStore(store.id, async (tx) => {
			if (!(await installers.isInstaller(tx, params.id))) return null;
			return installers.addTimeOff(tx, { installerId: params.id, ...parsed.data }, user.id);
		});
		if (!made) error(404, 'Not found');
		return { awaySaved: true };
	},
	removeAway: async ({ request, params }) => {
		const { store } = requirePermission({ installer: ['update'] });
		const parsed = await parseForm(request, removeTimeOffSchema);
		if (!parsed.ok) error(404, 'Not found');
		const gone = await inStore(store.id, (tx) =>
			installers.removeTimeOff(tx, params.id, parsed.data.timeOffId)
		);
		if (!gone) error(404, 'Not found');
		return { awayRemoved: true };
	}
};
