import { building } from '$app/environment';
import { config, checkConfig } from '$lib/server/config';
import { auth } from '$lib/server/auth';
import { homeFor, needsMember, refusal } from '$lib/server/access';
import { pool } from '$lib/server/db';
import { defaultMembership, readMembership } from '$lib/server/db/queries/stores';
import { handleAuthAnswers, handleClientAddress } from '$lib/server/hooks/auth-answers';
import { handleDevRoutes } from '$lib/server/hooks/dev';
import { handleHeaders } from '$lib/server/hooks/headers';
import { handleInput } from '$lib/server/hooks/input';
import { handleRequestId } from '$lib/server/hooks/request-id';
import { handleServerName } from '$lib/server/hooks/server-name';
import { handleUnavailable } from '$lib/server/hooks/unavailable';
import { log, safePath } from '$lib/server/log';
import { can, grantsOf } from '$lib/server/permissions';
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
		if (config.fakeMail) log.info('Local fakes on: e-mail goes to /dev/outbox');
		if (config.fakeStripe) log.info('Local fakes on: Stripe test payments, see /dev/stripe');
	}
	// After the fakes, so that nothing the worker sends can reach a real provider by mistake.
	if (!building) await startTasks();
};

/** The session onto locals, and better-auth's own routes under /api/auth. */
const handleAuth: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.session = null;
	event.locals.store = null;
	event.locals.role = null;
	event.locals.grants = null;
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
			try {
				await auth.api.setActiveOrganization({
					headers: event.request.headers,
					body: { organizationId: membership.store.id }
				});
			} catch (e) {
				// The session ended between reading it and choosing its store (signed out in another
				// tab at the same moment; better-auth then throws, not always an APIError): this
				// request goes on as nobody's, never as a 500. Any other failure is a real one.
				const still = await auth.api.getSession({ headers: event.request.headers });
				if (still) throw e;
				log.warn({ err: e }, 'Session ended before its store was chosen');
				event.locals.user = null;
				event.locals.session = null;
				return resolve(event);
			}
		}
	}
	if (membership) {
		event.locals.store = membership.store;
		event.locals.role = membership.role;
		event.locals.grants = grantsOf(membership.role, membership.access);
	}
	return resolve(event);
};

/**
 * The first wall: /app, /field and /api/v1 need a member of the active store, and each section
 * refuses members without its permission. Pages redirect to sign-in; the API answers JSON 401/403.
 * Loads, actions and endpoints check again with the guards in $lib/server/guards.
 */
const handleGuard: Handle = async ({ event, resolve }) => {
	const { pathname, search } = event.url;
	if (!needsMember(pathname)) return resolve(event);
	const { user, role, grants } = event.locals;
	const api = pathname.startsWith('/api/');

	if (!user) {
		if (api) return json({ message: 'Sign in first' }, { status: 401 });
		redirect(303, `/sign-in?redirectTo=${encodeURIComponent(pathname + search)}`);
	}
	if (!role || !grants) {
		if (api) return json({ message: 'Choose a store first' }, { status: 403 });
		redirect(303, '/stores');
	}
	if (api) return resolve(event);

	// A member without the desk (an installer) opening its front page is sent to their own.
	if (pathname === '/app' && !can(grants, { job: ['read'] })) redirect(303, homeFor(role));
	const message = refusal(pathname, grants);
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
	// Once the last request is answered and the worker has let its running tasks end, the
	// database connections go back at once (a rolling deploy returns them to a managed
	// PostgreSQL), rather than after the pool's idle timeout.
	process.once('sveltekit:shutdown', async () => {
		await worker.stop();
		await pool.end();
	});
}

export const handle = sequence(
	handleServerName(config.serverName),
	handleRequestId,
	handleHeaders(config.origin),
	handleUnavailable,
	handleDevRoutes(() => config.fakes),
	handleInput,
	handleClientAddress,
	handleAuthAnswers,
	handleAuth,
	handleStore,
	handleGuard
);

/** Unexpected errors: logged with the request id, which the error page shows as the reference. */
export const handleError: HandleServerError = ({ error: e, event, status, message }) => {
	if (status === 404) return { message: 'Not found' };
	const code = event.locals.requestId ?? crypto.randomUUID();
	log.error(
		{ err: e, status, method: event.request.method, path: safePath(event.url) },
		'unexpected error'
	);
	return { message: status >= 500 ? 'Something went wrong on our side' : message, code };
};
