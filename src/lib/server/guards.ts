import { getRequestEvent } from '$app/server';
import { error, redirect } from '@sveltejs/kit';
import { navFor, refusal } from './access';
import { can, ROLE_LABELS, type Permission, type Role } from './permissions';

function isApi(pathname: string) {
	return pathname.startsWith('/api/');
}

/**
 * The signed-in user, or: a redirect to sign-in for pages, 401 for the API. Call at the top of
 * every server load, action and endpoint that needs a user.
 */
export function requireUser() {
	const { locals, url } = getRequestEvent();
	if (!locals.user || !locals.session) {
		if (isApi(url.pathname)) error(401, 'Sign in first');
		redirect(303, `/sign-in?redirectTo=${encodeURIComponent(url.pathname + url.search)}`);
	}
	return { user: locals.user, session: locals.session };
}

/** The user, the active store and their role in it; without a store, off to /stores (403 for the API). */
export function requireMember() {
	const { user, session } = requireUser();
	const { locals, url } = getRequestEvent();
	if (!locals.store || !locals.role) {
		if (isApi(url.pathname))
			error(403, 'Choose a store first: you are not a member of an active store');
		redirect(303, '/stores');
	}
	if (locals.denied) error(locals.denied.status, locals.denied.message);
	const message = refusal(url.pathname, locals.role);
	if (message) error(403, message);
	return { user, session, store: locals.store, role: locals.role };
}

export type Member = ReturnType<typeof requireMember>;

/** A member with one of the roles listed, or 403. */
export function requireRole(...roles: Role[]): Member {
	const member = requireMember();
	if (!roles.includes(member.role)) {
		error(403, 'Your role in this store does not allow this');
	}
	return member;
}

/** A member whose role grants the permission, or 403. */
export function requirePermission(permission: Permission): Member {
	const member = requireMember();
	if (!can(member.role, permission)) {
		error(403, 'Your role in this store does not allow this');
	}
	return member;
}

/** The member's shell: guard first, then their navigation and where they are. */
export function requireShell() {
	const { role, store } = requireMember();
	return { nav: navFor(role), roleLabel: ROLE_LABELS[role], storeName: store.name };
}
