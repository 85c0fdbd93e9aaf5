import { ROLE_LABELS, type Role } from './permissions';

/** A part of the site that only some roles of the active store may open. */
interface Section {
	prefix: string;
	roles: readonly Role[];
	/** What the section is, for the refusal message. */
	name: string;
}

const STAFF: Role[] = ['owner', 'manager', 'sales'];

/** Most specific first; the first match decides. */
const SECTIONS: Section[] = [
	{ prefix: '/app/settings', roles: ['owner'], name: 'Store settings' },
	{ prefix: '/app/team', roles: ['owner'], name: 'The team' },
	{ prefix: '/app/price-book', roles: ['owner', 'manager'], name: 'The price book' },
	{ prefix: '/app/payments', roles: ['owner', 'manager'], name: 'Payments' },
	{ prefix: '/app', roles: STAFF, name: 'The store desk' },
	{ prefix: '/field', roles: ['installer'], name: 'The installer screens' }
];

function under(pathname: string, prefix: string) {
	return pathname === prefix || pathname.startsWith(`${prefix}/`);
}

/** Paths that need a signed-in member of the active store. */
export function needsMember(pathname: string): boolean {
	return under(pathname, '/app') || under(pathname, '/field') || under(pathname, '/api/v1');
}

export function sectionFor(pathname: string): Section | undefined {
	return SECTIONS.find((s) => under(pathname, s.prefix));
}

/** Why a role may not open a section, in words for the 403 page; null when it may. */
export function refusal(pathname: string, role: Role): string | null {
	const section = sectionFor(pathname);
	if (!section || section.roles.includes(role)) return null;
	const allowed = section.roles.map((r) => ROLE_LABELS[r]).join(', ');
	return `${section.name} is open to ${allowed} only; your role in this store is ${ROLE_LABELS[role]}.`;
}

/** Where each role lands after signing in or switching store. */
export function homeFor(role: Role | null): string {
	if (!role) return '/stores';
	return role === 'installer' ? '/field' : '/app';
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
	| 'field';

export interface NavItem {
	href: string;
	label: string;
	icon: NavIcon;
}

/** Every navigation entry; each role sees the ones its sections allow. */
const NAV: NavItem[] = [
	{ href: '/app', label: 'Desk', icon: 'desk' },
	{ href: '/app/jobs', label: 'Jobs', icon: 'jobs' },
	{ href: '/app/customers', label: 'Customers', icon: 'customers' },
	{ href: '/app/price-book', label: 'Price book', icon: 'priceBook' },
	{ href: '/app/payments', label: 'Payments', icon: 'payments' },
	{ href: '/app/calculators', label: 'Calculators', icon: 'calculators' },
	{ href: '/app/team', label: 'Team', icon: 'team' },
	{ href: '/app/settings', label: 'Store settings', icon: 'settings' },
	{ href: '/field', label: 'My jobs', icon: 'field' },
	{ href: '/field/calculators', label: 'Calculators', icon: 'calculators' }
];

/** The navigation a role sees, from the same rules the guards apply. */
export function navFor(role: Role): NavItem[] {
	return NAV.filter((item) => refusal(item.href, role) === null);
}
