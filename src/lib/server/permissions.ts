import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements } from 'better-auth/plugins/organization/access';

/**
 * What can be done in a store. The first four keys are the organization plugin's own (it checks
 * them on its endpoints); the rest are Flushline's.
 */
export const statement = {
	...defaultStatements,
	store: ['read', 'update'],
	customer: ['create', 'read', 'update', 'delete'],
	job: ['create', 'read', 'update', 'delete', 'assign', 'schedule'],
	/** An installer reads only the jobs assigned to them; checked in the job queries. */
	assignedJob: ['read', 'report'],
	priceBook: ['read', 'update'],
	quote: ['create', 'read', 'send'],
	payment: ['read', 'record', 'refund', 'reconcile'],
	changeOrder: ['review', 'approve'],
	report: ['read'],
	installerPay: ['read'],
	/** What the store sent (e-mail): seeing what did not go out, and sending it again. */
	outbox: ['read', 'resend']
} as const;

export const ac = createAccessControl(statement);

const manager = ac.newRole({
	store: ['read'],
	customer: ['create', 'read', 'update', 'delete'],
	job: ['create', 'read', 'update', 'delete', 'assign', 'schedule'],
	priceBook: ['read', 'update'],
	quote: ['create', 'read', 'send'],
	payment: ['read', 'record', 'refund', 'reconcile'],
	changeOrder: ['review', 'approve'],
	report: ['read'],
	installerPay: ['read'],
	outbox: ['read', 'resend'],
	ac: ['read']
});

export const roles = {
	/** Everything a manager does, plus members, invitations and store settings. */
	owner: ac.newRole({
		...manager.statements,
		organization: ['update', 'delete'],
		member: ['create', 'update', 'delete'],
		invitation: ['create', 'cancel'],
		store: ['read', 'update'],
		ac: ['create', 'read', 'update', 'delete']
	}),
	/** Price book, schedule, change orders, payments, installer statements, reports. */
	manager,
	/** Customers, site measures, quotes and deposits. */
	sales: ac.newRole({
		store: ['read'],
		customer: ['create', 'read', 'update'],
		job: ['create', 'read', 'update'],
		priceBook: ['read'],
		quote: ['create', 'read', 'send'],
		payment: ['read'],
		ac: ['read']
	}),
	/** Only the jobs assigned to them; installer pay, never store prices or margins. */
	installer: ac.newRole({
		assignedJob: ['read', 'report'],
		installerPay: ['read'],
		ac: ['read']
	})
};

export type Role = keyof typeof roles;
export const ROLES = Object.keys(roles) as Role[];

export const ROLE_LABELS: Record<Role, string> = {
	owner: 'Owner',
	manager: 'Manager',
	sales: 'Sales',
	installer: 'Installer'
};

export function isRole(value: unknown): value is Role {
	return typeof value === 'string' && value in roles;
}

type Statement = typeof statement;
export type Permission = { [K in keyof Statement]?: Statement[K][number][] };

/** Whether a role grants every action listed. */
export function can(role: Role, permission: Permission): boolean {
	return roles[role].authorize(permission as never).success;
}
