import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import { homeFor } from '$lib/server/access';
import { readInvitation } from '$lib/server/db/queries/stores';
import { requireUser } from '$lib/server/guards';
import { isRole, ROLE_LABELS } from '$lib/server/permissions';
import { timeZoneOr } from '$lib/time-zone';
import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

type InvitationState = 'open' | 'expired' | 'accepted' | 'cancelled' | 'rejected';

function stateOf(invite: { status: string; expiresAt: Date }): InvitationState {
	if (invite.status === 'pending') return invite.expiresAt < new Date() ? 'expired' : 'open';
	if (invite.status === 'accepted' || invite.status === 'rejected') return invite.status;
	return 'cancelled';
}

/**
 * Anyone with the link sees which store it is for, and nothing more: who invited, the role, the
 * address it went to and its state are shown only to the invitee, signed in with that address.
 */
export const load: PageServerLoad = async ({ params, locals }) => {
	const invite = await readInvitation(params.id);
	if (!invite) error(404, 'This invitation does not exist. Check the link in your e-mail.');
	const signedInAs = locals.user?.email ?? null;
	if (signedInAs?.toLowerCase() !== invite.email.toLowerCase()) {
		return {
			invite: { id: invite.id, storeName: invite.storeName },
			signedInAs,
			isRecipient: false as const
		};
	}
	return {
		invite: {
			id: invite.id,
			storeName: invite.storeName,
			inviterName: invite.inviterName,
			roleLabel: isRole(invite.role) ? ROLE_LABELS[invite.role] : (invite.role ?? ''),
			email: invite.email,
			expiresAt: invite.expiresAt.toISOString(),
			timeZone: timeZoneOr(invite.storeTimeZone),
			state: stateOf(invite)
		},
		signedInAs,
		isRecipient: true as const
	};
};

export const actions: Actions = {
	accept: async ({ params, request }) => {
		requireUser();
		let role: string | undefined;
		try {
			const accepted = await auth.api.acceptInvitation({
				headers: request.headers,
				body: { invitationId: params.id }
			});
			role = accepted?.member.role;
			await auth.api.setActiveOrganization({
				headers: request.headers,
				body: { organizationId: accepted?.member.organizationId }
			});
		} catch (e) {
			return fail(400, { message: authFailure(e).message });
		}
		redirect(303, homeFor(isRole(role) ? role : null));
	},
	decline: async ({ params, request }) => {
		requireUser();
		try {
			await auth.api.rejectInvitation({
				headers: request.headers,
				body: { invitationId: params.id }
			});
		} catch (e) {
			return fail(400, { message: authFailure(e).message });
		}
		redirect(303, '/stores');
	}
};
