import { building } from '$app/environment';
import { config, checkConfig } from '$lib/server/config';
import { auth } from '$lib/server/auth';
import { homeFor, needsMember, refusal } from '$lib/server/access';
import { defaultMembership, readMembership } from '$lib/server/db/queries/stores';
import {
	error,
	json,
	redirect,
	type Handle,
	type HandleServerError,
	type ServerInit
} from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { svelteKitHandler } from 'better-auth/svelte-kit';

export const init: ServerInit = async () => {
	checkConfig();
	if (!building) await startTasks();
	if (config.fakeMail || config.fakeStripe) {
		const { startFakes } = await import('$mocks/node');
		startFakes({
			dataDir: config.dataDir,
			mail: config.fakeMail,
			stripe: config.fakeStripe
				? {
						origin: config.origin,
						webhookUrl: config.stripeFakeWebhookUrl,
						webhookSecret: config.stripeWebhookSecret
					}
				: undefined
		});
		if (config.fakeMail) console.log('Local fakes on: e-mail goes to /dev/outbox');
		if (config.fakeStripe) console.log('Local fakes on: Stripe test payments, see /dev/stripe');
	}
};

/** The session onto locals, and better-auth's own routes under /api/auth. */
const handleAuth: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.session = null;
	event.locals.store = null;
	event.locals.role = null;
	event.locals.denied = null;
	if (!event.url.pathname.startsWith('/api/auth/')) {
		const found = await auth.api.getSession({ headers: event.request.headers });
		if (found) {
			event.locals.user = found.user;
			event.locals.session = found.session;
		}
	}
	return svelteKitHandler({ event, resolve, auth, building });
};

/**
 * The active store and the member's role onto locals. A session without an active store (a new
 * sign-in), or whose store no longer has the user, starts where the user last worked.
 */
const handleStore: Handle = async ({ event, resolve }) => {
	const { user, session } = event.locals;
	if (!user || !session) return resolve(event);
	let membership = session.activeOrganizationId
		? await readMembership(user.id, session.activeOrganizationId)
		: null;
	if (!membership) {
		membership = await defaultMembership(user.id);
		if (membership) {
			await auth.api.setActiveOrganization({
				headers: event.request.headers,
				body: { organizationId: membership.store.id }
			});
		}
	}
	if (membership) {
		event.locals.store = membership.store;
		event.locals.role = membership.role;
	}
	return resolve(event);
};

/**
 * The first wall: /app, /field and /api/v1 need a member of the active store, and role-only
 * sections refuse other roles. Pages redirect to sign-in; the API answers JSON 401/403.
 * Loads, actions and endpoints check again with the guards in $lib/server/guards.
 */
const handleGuard: Handle = async ({ event, resolve }) => {
	const { pathname, search } = event.url;
	if (!needsMember(pathname)) return resolve(event);
	const { user, role } = event.locals;
	const api = pathname.startsWith('/api/');

	if (!user) {
		if (api) return json({ message: 'Sign in first' }, { status: 401 });
		redirect(303, `/sign-in?redirectTo=${encodeURIComponent(pathname + search)}`);
	}
	if (!role) {
		if (api) return json({ message: 'Choose a store first' }, { status: 403 });
		redirect(303, '/stores');
	}
	if (api) return resolve(event);

	// An installer opening the staff desk's front page is sent to their own.
	if (role === 'installer' && pathname === '/app') redirect(303, homeFor(role));
	const message = refusal(pathname, role);
	if (message) {
		// A full page renders the 403 inside our layout (the section layout's guard throws it);
		// form posts and client-side data requests are refused here and now.
		if (event.request.method === 'GET' && !event.isDataRequest) {
			event.locals.denied = { status: 403, message };
		} else {
			error(403, message);
		}
	}
	return resolve(event);
};

/**
 * The task worker runs with the server: it sends what the app queued (e-mail), retries what
 * failed, and picks up what a server stopped mid-send left behind. A stop lets running tasks end.
 */
async function startTasks() {
	const [{ startTaskWorker }, { mailer }, { stripe }] = await Promise.all([
		import('$lib/server/tasks/worker'),
		import('$lib/server/mail'),
		import('$lib/server/stripe')
	]);
	const worker = await startTaskWorker({ sendMail: mailer, stripe, schedule: true });
	process.once('sveltekit:shutdown', () => worker.stop());
}

export const handle = sequence(handleAuth, handleStore, handleGuard);

export const handleError: HandleServerError = ({ error: e, event, status, message }) => {
	if (status === 404) return { message: 'Not found' };
	const code = crypto.randomUUID().slice(0, 8);
	console.error(`[${code}] ${event.request.method} ${event.url.pathname}`, e);
	return { message: status >= 500 ? 'Something went wrong on our side' : message, code };
};
