import { getRequestEvent } from '$app/server';
import { error, redirect } from '@sveltejs/kit';
import { navFor, refusal } from './access';
import { jobScope } from './object-access';
import { can, ROLE_LABELS, type Permission } from './permissions';

// Every server load, action and endpoint calls one of these first (src/lib/server/guards.spec.ts
// walks the routes and fails when one does not). They read the permission statements in
// ./permissions only: no role names here.

function isApi(pathname: string) {
	return pathname.startsWith('/api/');
}

/**
 * The signed-in user, or: a redirect to sign-in for pages, 401 for the API. For pages of a user
 * who may not belong to a store yet (choosing or starting one, accepting an invitation).
 */
export function requireUser() {
	const { locals, url } = getRequestEvent();
	if (!locals.user || !locals.session) {
		if (isApi(url.pathname)) error(401, 'Sign in first');
		redirect(303, `/sign-in?redirectTo=${encodeURIComponent(url.pathname + url.search)}`);
	}
	return { user: locals.user, session: locals.session };
}

/**
 * A member of the active store: who they are, the store, their role, what they may do
 * (`grants`, for `can`) and which jobs they see (`scope`, for the job queries). Without a store,
 * off to /stores (403 for the API); in a section their permissions do not open, 403.
 */
export function requireMember() {
	const { user, session } = requireUser();
	const { locals, url } = getRequestEvent();
	if (!locals.store || !locals.role || !locals.grants) {
		if (isApi(url.pathname))
			error(403, 'Choose a store first: you are not a member of an active store');
		redirect(303, '/stores');
	}
	if (locals.denied) error(locals.denied.status, locals.denied.message);
	const { store, role, grants } = locals;
	const message = refusal(url.pathname, grants);
	if (message) error(403, message);
	return { user, session, store, role, grants, scope: jobScope(grants, user.id) };
}

export type Member = ReturnType<typeof requireMember>;

/**
 * A member granted the permission (or, when alternatives are given, any one of them), or 403.
 * Another store's row is still the query's or `requireObjects`' 404.
 */
export function requirePermission(permission: Permission, ...orElse: Permission[]): Member {
	const member = requireMember();
	if (![permission, ...orElse].some((p) => can(member.grants, p))) {
		error(403, 'Your role in this store does not allow this');
	}
	return member;
}

/** The member's shell: guard first, then their navigation and where they are. */
export function requireShell() {
	const { role, grants, store } = requireMember();
	return { nav: navFor(grants), roleLabel: ROLE_LABELS[role], storeName: store.name };
}
