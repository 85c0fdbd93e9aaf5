import { betterAuth, type BetterAuthPlugin } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { APIError, createAuthMiddleware } from 'better-auth/api';
import { organization } from 'better-auth/plugins';
import type { NodePgDatabase } from 'drizzle-orm/node-postgres';
import * as schema from './db/schema';
import { invitationMail, passwordResetMail, type Mail } from './mail/templates';
import { waitText, type AttemptKind, type AuthLimits } from './auth-limits';
import { ac, isRole, ROLE_LABELS, roles } from './permissions';
import { timeZoneOr } from '../time-zone';

export const PASSWORD_MIN_LENGTH = 10;
export const INVITATION_DAYS = 7;

export interface AuthDeps {
	db: NodePgDatabase<typeof schema>;
	/** The one origin the app is served on; sign-in answers only requests from it. */
	baseURL: string;
	secret: string;
	/**
	 * Hands an e-mail over for sending; an invitation names its store, a password reset none.
	 * The app queues it as a task (`queueAuthMail`), so it is retried and never lost.
	 */
	sendMail: (mail: Mail, storeId: string | null) => Promise<unknown>;
	/** Framework glue such as `sveltekitCookies`, which must come last. */
	plugins?: BetterAuthPlugin[];
	/** Limits on sign-in, sign-up, resets and invitations (auth-limits.ts); none without it. */
	limits?: AuthLimits;
}

/**
 * The request header carrying the client's address as the deployment's proxy gave it
 * (`event.getClientAddress()`, set by the `handleClientAddress` hook over any value the client
 * sent). better-auth reads it for sessions and our limits read it; nothing else is trusted.
 */
export const CLIENT_ADDRESS_HEADER = 'x-flushline-client-address';

/** The ways into an account that are limited, and the account each attempt names. */
const LIMITED: Record<
	string,
	{ kind: AttemptKind; account: (body: Record<string, unknown>) => unknown }
> = {
	'/sign-in/email': { kind: 'sign-in', account: (b) => b.email },
	'/sign-up/email': { kind: 'sign-up', account: (b) => b.email },
	'/request-password-reset': { kind: 'reset', account: (b) => b.email },
	'/reset-password': { kind: 'reset', account: (b) => b.token },
	'/organization/accept-invitation': { kind: 'invite', account: (b) => b.invitationId },
	'/change-password': { kind: 'password', account: () => undefined },
	'/verify-password': { kind: 'password', account: () => undefined }
};

function limitHooks(limits: AuthLimits) {
	return {
		before: createAuthMiddleware(async (ctx) => {
			const rule = Object.hasOwn(LIMITED, ctx.path) ? LIMITED[ctx.path] : undefined;
			if (!rule) return;
			const body = (ctx.body ?? {}) as Record<string, unknown>;
			const account = rule.account(body);
			const answer = await limits.attempt(rule.kind, {
				account: typeof account === 'string' && account ? account.slice(0, 320) : undefined,
				address: ctx.headers?.get(CLIENT_ADDRESS_HEADER) ?? undefined
			});
			if (!answer.ok) {
				throw new APIError(
					'TOO_MANY_REQUESTS',
					{
						code: 'TOO_MANY_ATTEMPTS',
						message: `Too many attempts. Wait ${waitText(answer.retryAfterSeconds)} and try again.`
					},
					{ 'Retry-After': String(answer.retryAfterSeconds) }
				);
			}
		}),
		after: createAuthMiddleware(async (ctx) => {
			if (ctx.path !== '/sign-in/email' || !ctx.context.newSession) return;
			const email = (ctx.body as { email?: unknown } | undefined)?.email;
			if (typeof email === 'string') await limits.succeeded('sign-in', email);
		})
	};
}

/**
 * Builds the auth without any SvelteKit import, so scripts (seed) and integration tests can use
 * it without a request.
 */
export function createAuth(deps: AuthDeps) {
	const stores = organization({
		ac,
		roles,
		creatorRole: 'owner',
		allowUserToCreateOrganization: true,
		invitationExpiresIn: 60 * 60 * 24 * INVITATION_DAYS,
		membershipLimit: 200,
		schema: {
			organization: {
				additionalFields: {
					// The store's IANA time zone: every date on its pages, e-mails and PDFs.
					timeZone: { type: 'string', required: false, defaultValue: 'UTC', input: true },
					// The owner's choices about who sees what (store settings, "Who sees what").
					// Kept on the store's own row so each request reads them with the membership;
					// written only by the settings action, never through the auth API.
					salesSeeCosts: {
						type: 'boolean',
						required: true,
						defaultValue: false,
						input: false
					},
					salesJobs: {
						type: 'string',
						required: true,
						defaultValue: 'all',
						input: false
					}
				}
			},
			member: {
				additionalFields: {
					// The plugin's default role is `member`, which is none of ours; the least
					// privileged of ours is the default.
					role: {
						type: 'string',
						required: true,
						sortable: true,
						defaultValue: 'installer'
					}
				}
			}
		},
		sendInvitationEmail: async ({ id, email, role, organization, inviter, invitation }) => {
			await deps.sendMail(
				invitationMail({
					to: email,
					storeName: organization.name,
					inviterName: inviter.user.name,
					roleLabel: isRole(role) ? ROLE_LABELS[role] : role,
					url: `${deps.baseURL}/invite/${id}`,
					expiresAt: new Date(invitation.expiresAt),
					timeZone: timeZoneOr((organization as { timeZone?: unknown }).timeZone)
				}),
				organization.id
			);
		}
	});
	return betterAuth({
		appName: 'Flushline',
		baseURL: deps.baseURL,
		secret: deps.secret,
		trustedOrigins: [deps.baseURL],
		telemetry: { enabled: false },
		database: drizzleAdapter(deps.db, { provider: 'pg', schema }),
		emailAndPassword: {
			enabled: true,
			autoSignIn: true,
			minPasswordLength: PASSWORD_MIN_LENGTH,
			maxPasswordLength: 128,
			resetPasswordTokenExpiresIn: 60 * 60,
			revokeSessionsOnPasswordReset: true,
			sendResetPassword: async ({ user, url }) => {
				await deps.sendMail(passwordResetMail({ to: user.email, name: user.name, url }), null);
			}
		},
		session: {
			expiresIn: 60 * 60 * 24 * 30,
			updateAge: 60 * 60 * 24
		},
		// Our limits (auth-limits.ts, stored in PostgreSQL) cover every way into an account, for the
		// HTTP routes and the form actions alike; better-auth's own would count in one process only.
		rateLimit: { enabled: false },
		hooks: deps.limits ? limitHooks(deps.limits) : undefined,
		advanced: {
			// `__Secure-` cookies, sent only over https, whenever the origin is https.
			useSecureCookies: deps.baseURL.startsWith('https://'),
			// The client's address only as the deployment's proxy gave it, never a header it chose.
			ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] }
		},
		// The organization plugin's endpoints check membership, not Flushline's permissions (any
		// member could list the store's members and their e-mail addresses), and nothing in the
		// browser needs them: the app calls them on the server (auth.api), behind its own guards.
		disabledPaths: Object.values(stores.endpoints)
			.map((e) => e.path)
			.filter(Boolean),
		plugins: [stores, ...(deps.plugins ?? [])]
	});
}

export type Auth = ReturnType<typeof createAuth>;
