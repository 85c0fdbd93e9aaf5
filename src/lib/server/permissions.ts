import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements } from 'better-auth/plugins/organization/access';

/**
 * What can be done in a store: the one vocabulary every guard, section, navigation entry and
 * page-data rule reads. The first keys are the organization plugin's own (it checks them on its
 * endpoints); the rest are Flushline's. A new feature adds its statement here, grants it to the
 * roles below, and guards its loads, actions and endpoints with `requirePermission`.
 */
export const statement = {
	...defaultStatements,
	store: ['read', 'update'],
	customer: ['create', 'read', 'update', 'delete'],
	/** Every job of the store (a store may narrow salespeople to their own: see object-access). */
	job: ['create', 'read', 'update', 'delete', 'assign', 'schedule'],
	/** Only the jobs assigned to the member. */
	assignedJob: ['read', 'report'],
	/** The price book's lines and their sell prices. */
	priceBook: ['read', 'update'],
	/** What the store pays: material costs, installer pay rates and totals, and margins. */
	cost: ['read'],
	/** What the card processor kept on each payment. */
	cardFee: ['read'],
	quote: ['create', 'read', 'send'],
	payment: ['read', 'record', 'refund', 'reconcile'],
	changeOrder: ['review', 'approve'],
	report: ['read'],
	/** The store's installers: their profiles, pay rates and days away. */
	installer: ['read', 'update'],
	/** Installer statements: making them, adding chargebacks, marking them paid. */
	statement: ['read', 'create', 'pay'],
	/** An installer's own pay on the jobs assigned to them. */
	installerPay: ['read'],
	/** The trade calculators (no prices in them). */
	calculator: ['use'],
	/** What the store sent (e-mail): seeing what did not go out, and sending it again. */
	outbox: ['read', 'resend']
} as const;

export const ac = createAccessControl(statement);

const manager = ac.newRole({
	store: ['read'],
	customer: ['create', 'read', 'update', 'delete'],
	job: ['create', 'read', 'update', 'delete', 'assign', 'schedule'],
	priceBook: ['read', 'update'],
	cost: ['read'],
	cardFee: ['read'],
	quote: ['create', 'read', 'send'],
	payment: ['read', 'record', 'refund', 'reconcile'],
	changeOrder: ['review', 'approve'],
	report: ['read'],
	installer: ['read', 'update'],
	statement: ['read', 'create', 'pay'],
	installerPay: ['read'],
	calculator: ['use'],
	outbox: ['read', 'resend'],
	ac: ['read']
});

const sales = ac.newRole({
	store: ['read'],
	customer: ['create', 'read', 'update'],
	job: ['create', 'read', 'update'],
	priceBook: ['read'],
	quote: ['create', 'read', 'send'],
	payment: ['read'],
	calculator: ['use'],
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
	/** Price book, schedule, change orders, payments and card fees, costs and margins, reports. */
	manager,
	/** Customers, site measures, quotes and deposits, at sell prices; never card fees. */
	sales,
	/** Only the jobs assigned to them; their own pay, never store prices, costs or margins. */
	installer: ac.newRole({
		assignedJob: ['read', 'report'],
		installerPay: ['read'],
		calculator: ['use'],
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
	return typeof value === 'string' && Object.hasOwn(roles, value);
}

/** Which jobs a store lets its salespeople work on. */
export const SALES_JOB_SCOPES = ['all', 'own'] as const;
export type SalesJobScope = (typeof SALES_JOB_SCOPES)[number];

/** What an owner chose for their store about who sees what (store settings, "Who sees what"). */
export interface StoreAccess {
	/** Salespeople also see costs, installer pay and margins (never card fees). */
	salesSeeCosts: boolean;
	/** `own`: salespeople see and work only the jobs they sell. */
	salesJobs: SalesJobScope;
}

/** A new store's choices: salespeople at sell prices, on every job. */
export const DEFAULT_STORE_ACCESS: StoreAccess = Object.freeze({
	salesSeeCosts: false,
	salesJobs: 'all'
});

type Statement = typeof statement;
export type Permission = { [K in keyof Statement]?: Statement[K][number][] };

type AcRole = (typeof roles)[Role];

/**
 * The permissions one member holds in one store: their role's statements, widened by what the
 * store's owner turned on. Built on the server (hooks) and never sent to the browser.
 */
export interface Grants {
	readonly role: Role;
	readonly access: StoreAccess;
	readonly statements: AcRole;
}

/** A salesperson in a store that shows them costs: the sales role plus `cost: read`. */
const salesSeeingCosts = ac.newRole({ ...sales.statements, cost: ['read'] });

/** The grants of a role in a store with these choices. */
export function grantsOf(role: Role, access: StoreAccess = DEFAULT_STORE_ACCESS): Grants {
	const statements = role === 'sales' && access.salesSeeCosts ? salesSeeingCosts : roles[role];
	return Object.freeze({ role, access, statements });
}

/**
 * Whether every action listed is granted. A bare role is asked with the store defaults (for
 * sections and their messages); a member is asked with their grants.
 */
export function can(who: Role | Grants, permission: Permission): boolean {
	const grants = typeof who === 'string' ? grantsOf(who) : who;
	return grants.statements.authorize(permission as never).success;
}

/** The roles whose (default) grants include the permission, in the order of `ROLES`. */
export function rolesThatCan(permission: Permission): Role[] {
	return ROLES.filter((r) => can(r, permission));
}
