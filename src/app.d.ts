import type { auth } from '$lib/server/auth';
import type { Grants, Role } from '$lib/server/permissions';

type AuthSession = NonNullable<Awaited<ReturnType<typeof auth.api.getSession>>>;

declare global {
	namespace App {
		interface Error {
			message: string;
			/** A reference to find the log line of an unexpected error. */
			code?: string;
			/** Field-level problems of a rejected API body: the path of each bad field. */
			issues?: { path: string; message: string }[];
		}
		interface Locals {
			/** This request's id: on every log line and in the `X-Request-Id` answer header. */
			requestId: string;
			user: AuthSession['user'] | null;
			session: AuthSession['session'] | null;
			/** The active store (a better-auth organization) the user is a member of. */
			store: {
				id: string;
				name: string;
				slug: string;
				logo: string | null;
				/** The store's IANA time zone: every date is shown in it. */
				timeZone: string;
			} | null;
			/** The user's role in the active store. */
			role: Role | null;
			/** What the role may do in the active store, with the owner's choices; never sent out. */
			grants: Grants | null;
			/** Set by hooks when a page is refused, so the section layout renders the 403 page. */
			denied: { status: 403; message: string } | null;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
