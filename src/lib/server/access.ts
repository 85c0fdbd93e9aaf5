import {
	can,
	rolesThatCan,
	ROLE_LABELS,
	type Grants,
	type Permission,
	type Role
} from './permissions';

/**
 * A part of the site open to the members holding one permission. Sections are the hooks' first
 * wall and the navigation's source; every load, action and endpoint still checks its own
 * permission with the guards.
 */
interface Section {
	prefix: string;
	permission: Permission;
	/** What the section is, for the refusal message. */
	name: string;
}

/** A path must be open in every section it is under, outermost first. */
const SECTIONS: Section[] = [
	{ prefix: '/app', permission: { job: ['read'] }, name: 'The store desk' },
	{ prefix: '/app/customers', permission: { customer: ['read'] }, name: 'Customers' },
	{ prefix: '/app/price-book', permission: { priceBook: ['read'] }, name: 'The price book' },
	{ prefix: '/app/payments', permission: { payment: ['reconcile'] }, name: 'Payments' },
	{ prefix: '/app/calculators', permission: { calculator: ['use'] }, name: 'The calculators' },
	{ prefix: '/app/schedule', permission: { job: ['schedule'] }, name: 'The schedule' },
	{ prefix: '/app/installers', permission: { installer: ['read'] }, name: 'Installers' },
	{ prefix: '/app/statements', permission: { statement: ['read'] }, name: 'Installer statements' },
	{ prefix: '/app/team', permission: { member: ['update'] }, name: 'The team' },
	{ prefix: '/app/settings', permission: { store: ['update'] }, name: 'Store settings' },
	{ prefix: '/field', permission: { assignedJob: ['read'] }, name: 'The installer screens' },
	{ prefix: '/field/calculators', permission: { calculator: ['use'] }, name: 'The calculators' },
	{ prefix: '/field/statements', permission: { installerPay: ['read'] }, name: 'Your pay' }
];

function under(pathname: string, prefix: string) {
	return pathname === prefix || pathname.startsWith(`${prefix}/`);
}

/** Paths that need a signed-in member of the active store. */
export function needsMember(pathname: string): boolean {
	return under(pathname, '/app') || under(pathname, '/field') || under(pathname, '/api/v1');
}

/** The sections a path is under, outermost first. */
export function sectionsFor(pathname: string): Section[] {
	return SECTIONS.filter((s) => under(pathname, s.prefix));
}

/**
 * Why a member may not open a path, in words for the 403 page (the most specific section that
 * refuses); null when every section the path is under lets them in.
 */
export function refusal(pathname: string, who: Role | Grants): string | null {
	const section = sectionsFor(pathname)
		.reverse()
		.find((s) => !can(who, s.permission));
	if (!section) return null;
	const role = typeof who === 'string' ? who : who.role;
	const allowed = rolesThatCan(section.permission)
		.map((r) => ROLE_LABELS[r])
		.join(', ');
	return `${section.name} is open to ${allowed} only; your role in this store is ${ROLE_LABELS[role]}.`;
}

/** Where a member lands after signing in or switching store: the desk, or their own jobs. */
export function homeFor(role: Role | null): string {
	if (!role) return '/stores';
	if (can(role, { job: ['read'] })) return '/app';
	return can(role, { assignedJob: ['read'] }) ? '/field' : '/stores';
}

export type NavIcon =
	| 'desk'
	| 'jobs'
	| 'customers'
	| 'priceBook'
	| 'payments'
	| 'team'
	| 'settings'
	| 'calculators'
	| 'field'
	| 'schedule'
	| 'installers'
	| 'statements'
	| 'profile'
	| 'pay';

export interface NavItem {
	href: string;
	label: string;
	icon: NavIcon;
}

/** Every navigation entry; each member sees the ones their permissions open. */
const NAV: NavItem[] = [
	{ href: '/app', label: 'Desk', icon: 'desk' },
	{ href: '/app/jobs', label: 'Jobs', icon: 'jobs' },
	{ href: '/app/customers', label: 'Customers', icon: 'customers' },
	{ href: '/app/price-book', label: 'Price book', icon: 'priceBook' },
	{ href: '/app/payments', label: 'Payments', icon: 'payments' },
	{ href: '/app/schedule', label: 'Schedule', icon: 'schedule' },
	{ href: '/app/installers', label: 'Installers', icon: 'installers' },
	{ href: '/app/statements', label: 'Statements', icon: 'statements' },
	{ href: '/app/calculators', label: 'Calculators', icon: 'calculators' },
	{ href: '/app/team', label: 'Team', icon: 'team' },
	{ href: '/app/settings', label: 'Store settings', icon: 'settings' },
	{ href: '/field', label: 'My jobs', icon: 'field' },
	{ href: '/field/statements', label: 'My pay', icon: 'pay' },
	{ href: '/field/profile', label: 'My profile', icon: 'profile' },
	{ href: '/field/calculators', label: 'Calculators', icon: 'calculators' }
];

/** The navigation a member sees, from the same permissions the guards check. */
export function navFor(who: Role | Grants): NavItem[] {
	return NAV.filter((item) => refusal(item.href, who) === null);
}
