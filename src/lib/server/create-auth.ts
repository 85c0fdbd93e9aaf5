import { betterAuth, type BetterAuthPlugin } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';
import type { NodePgDatabase } from 'drizzle-orm/node-postgres';
import * as schema from './db/schema';
import { invitationMail, passwordResetMail, type Mail } from './mail/templates';
import { ac, isRole, ROLE_LABELS, roles } from './permissions';

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
}

/**
 * Builds the auth without any SvelteKit import, so scripts (seed) and integration tests can use
 * it without a request.
 */
export function createAuth(deps: AuthDeps) {
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
		rateLimit: {
			enabled: true,
			storage: 'memory',
			window: 60,
			max: 120
		},
		plugins: [
			organization({
				ac,
				roles,
				creatorRole: 'owner',
				allowUserToCreateOrganization: true,
				invitationExpiresIn: 60 * 60 * 24 * INVITATION_DAYS,
				membershipLimit: 200,
				schema: {
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
							expiresAt: new Date(invitation.expiresAt)
						}),
						organization.id
					);
				}
			}),
			...(deps.plugins ?? [])
		]
	});
}

export type Auth = ReturnType<typeof createAuth>;
