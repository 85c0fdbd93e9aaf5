import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import { readProfile, saveProfile } from '$lib/server/db/queries/stores';
import { parseForm, refuse } from '$lib/server/forms';
import { requireRole } from '$lib/server/guards';
import { storeProfileSchema } from '$lib/schemas/store';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store } = requireRole('owner');
	return { profile: { ...(await readProfile(store.id)), name: store.name } };
};

export const actions: Actions = {
	default: async ({ request }) => {
		const { store } = requireRole('owner');
		const parsed = await parseForm(request, storeProfileSchema);
		if (!parsed.ok) return parsed.failure;
		const { name, ...profile } = parsed.data;
		if (name !== store.name) {
			try {
				await auth.api.updateOrganization({
					headers: request.headers,
					body: { organizationId: store.id, data: { name } }
				});
			} catch (e) {
				return refuse(parsed.form, { name: [authFailure(e).message] });
			}
		}
		await saveProfile(store.id, profile);
		return { saved: true };
	}
};
