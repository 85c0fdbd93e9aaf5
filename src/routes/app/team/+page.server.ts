import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import { listInvitations, listMembers } from '$lib/server/db/queries/stores';
import { readInStore } from '$lib/server/db/tenant';
import { parseForm, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { isRole, ROLE_LABELS, ROLES } from '$lib/server/permissions';
import { inviteSchema, memberRoleSchema } from '$lib/schemas/store';
import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, user } = requirePermission({ member: ['update'] });
	const { members, invitations } = await readInStore(store.id, async (tx) => ({
		members: await listMembers(tx),
		invitations: await listInvitations(tx)
	}));
	const now = Date.now();
	return {
		me: user.id,
		members: members.map((m) => ({
			...m,
			roleLabel: isRole(m.role) ? ROLE_LABELS[m.role] : m.role
		})),
		invitations: invitations.map((i) => ({
			...i,
			roleLabel: isRole(i.role) ? ROLE_LABELS[i.role] : (i.role ?? ''),
			expired: i.expiresAt.getTime() < now
		})),
		roles: ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))
	};
};

/** A member or invitation id must belong to this store, or it is 404 (never another store's). */
async function ownMember(storeId: string, memberId: string) {
	const members = await readInStore(storeId, listMembers);
	if (!members.some((m) => m.memberId === memberId)) error(404, 'Not found');
}

export const actions: Actions = {
	invite: async ({ request }) => {
		const { store } = requirePermission({ invitation: ['create'] });
		const parsed = await parseForm(request, inviteSchema);
		if (!parsed.ok) return parsed.failure;
		try {
			await auth.api.createInvitation({
				headers: request.headers,
				body: { email: parsed.data.email, role: parsed.data.role, organizationId: store.id }
			});
		} catch (e) {
			const failure = authFailure(e);
			return refuse(parsed.form, { [failure.field ?? 'email']: [failure.message] });
		}
		return { invited: parsed.data.email };
	},
	cancel: async ({ request }) => {
		const { store } = requirePermission({ invitation: ['cancel'] });
		const id = String((await request.formData()).get('invitationId') ?? '');
		const open = await readInStore(store.id, listInvitations);
		if (!open.some((i) => i.id === id)) error(404, 'Not found');
		await auth.api.cancelInvitation({ headers: request.headers, body: { invitationId: id } });
		return { cancelled: true };
	},
	role: async ({ request }) => {
		const { store } = requirePermission({ member: ['update'] });
		const parsed = await parseForm(request, memberRoleSchema);
		if (!parsed.ok) return fail(400, { memberError: 'Choose a role' });
		await ownMember(store.id, parsed.data.memberId);
		try {
			await auth.api.updateMemberRole({
				headers: request.headers,
				body: { memberId: parsed.data.memberId, role: parsed.data.role, organizationId: store.id }
			});
		} catch (e) {
			return fail(400, { memberError: authFailure(e).message });
		}
		return { roleSaved: true };
	},
	remove: async ({ request }) => {
		const { store } = requirePermission({ member: ['delete'] });
		const memberId = String((await request.formData()).get('memberId') ?? '');
		await ownMember(store.id, memberId);
		try {
			await auth.api.removeMember({
				headers: request.headers,
				body: { memberIdOrEmail: memberId, organizationId: store.id }
			});
		} catch (e) {
			return fail(400, { memberError: authFailure(e).message });
		}
		return { removed: true };
	}
};
