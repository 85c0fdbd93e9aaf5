import { betterAuth, type BetterAuthPlugin } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { organization } from 'better-auth/plugins';
import type { NodePgDatabase } from 'drizzle-orm/node-postgres';
import * as schema from './db/schema';
import { invitationMail, passwordResetMail } from './mail/templates';
import type { SendMail } from './mail/send';
import { ac, isRole, ROLE_LABELS, roles } from './permissions';

export const PASSWORD_MIN_LENGTH = 10;
export const INVITATION_DAYS = 7;

export interface AuthDeps {
	db: NodePgDatabase<typeof schema>;
	/** The one origin the app is served on; sign-in answers only requests from it. */
	baseURL: string;
	secret: string;
	sendMail: SendMail;
	/** Framework glue such as `sveltekitCookies`, which must come last. */
	plugins?: BetterAuthPlugin[];
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
					expiresAt: new Date(invitation.expiresAt)
				})
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
				await deps.sendMail(passwordResetMail({ to: user.email, name: user.name, url }));
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
