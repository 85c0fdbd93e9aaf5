import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import { homeFor } from '$lib/server/access';
import {
	listMemberships,
	listOpenInvitations,
	readMembership
} from '$lib/server/db/queries/stores';
import { parseForm, refuse } from '$lib/server/forms';
import { requireUser } from '$lib/server/guards';
import { ROLE_LABELS, isRole } from '$lib/server/permissions';
import { storeSlug } from '$lib/server/slug';
import { createStoreSchema } from '$lib/schemas/store';
import { error, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const { user } = requireUser();
	const [memberships, invitations] = await Promise.all([
		listMemberships(user.id),
		listOpenInvitations(user.email)
	]);
	return {
		activeStoreId: locals.store?.id ?? null,
		// Someone who only installs for stores is not offered to start one (a new sign-up is).
		offerNewStore: memberships.length === 0 || memberships.some((m) => m.role !== 'installer'),
		memberships: memberships.map((m) => ({ store: m.store, roleLabel: ROLE_LABELS[m.role] })),
		invitations: invitations.map((i) => ({
			...i,
			roleLabel: isRole(i.role) ? ROLE_LABELS[i.role] : (i.role ?? '')
		}))
	};
};

export const actions: Actions = {
	switch: async ({ request }) => {
		const { user } = requireUser();
		const form = await request.formData();
		const storeId = String(form.get('storeId') ?? '');
		const membership = await readMembership(user.id, storeId);
		if (!membership) error(404, 'Not found');
		await auth.api.setActiveOrganization({
			headers: request.headers,
			body: { organizationId: storeId }
		});
		redirect(303, homeFor(membership.role));
	},
	create: async ({ request }) => {
		requireUser();
		const parsed = await parseForm(request, createStoreSchema);
		if (!parsed.ok) return parsed.failure;
		try {
			await auth.api.createOrganization({
				headers: request.headers,
				body: {
					name: parsed.data.name,
					slug: storeSlug(parsed.data.name),
					timeZone: parsed.data.timeZone
				}
			});
		} catch (e) {
			const failure = authFailure(e);
			return refuse(parsed.form, { name: [failure.message] });
		}
		redirect(303, '/app');
	}
};
