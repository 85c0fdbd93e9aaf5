import { describe, expect, it } from 'vitest';
import { can, grantsOf, isRole, roles, rolesThatCan, statement } from './permissions';

describe('role permissions', () => {
	it('lets only the owner manage members, invitations and the store', () => {
		expect(can('owner', { member: ['create', 'update', 'delete'], invitation: ['create'] })).toBe(
			true
		);
		for (const role of ['manager', 'sales', 'installer'] as const) {
			expect(can(role, { invitation: ['create'] })).toBe(false);
			expect(can(role, { store: ['update'] })).toBe(false);
		}
	});

	it('gives the manager the price book, payments and change orders, but not sales', () => {
		expect(
			can('manager', { priceBook: ['update'], payment: ['refund'], changeOrder: ['approve'] })
		).toBe(true);
		expect(can('sales', { priceBook: ['update'] })).toBe(false);
		expect(can('sales', { payment: ['refund'] })).toBe(false);
		expect(can('sales', { customer: ['create', 'read', 'update'], quote: ['send'] })).toBe(true);
	});

	it('lets salespeople read sell prices, and costs only where the store turns it on', () => {
		expect(can('sales', { priceBook: ['read'] })).toBe(true);
		expect(can('sales', { cost: ['read'] })).toBe(false);
		expect(can('sales', { cardFee: ['read'] })).toBe(false);
		const seeing = grantsOf('sales', { salesSeeCosts: true, salesJobs: 'all' });
		expect(can(seeing, { cost: ['read'] })).toBe(true);
		// Card fees never, and nothing else widens.
		expect(can(seeing, { cardFee: ['read'] })).toBe(false);
		expect(can(seeing, { priceBook: ['update'] })).toBe(false);
		expect(can(seeing, { payment: ['refund'] })).toBe(false);
		// The store's choice widens salespeople only.
		const installer = grantsOf('installer', { salesSeeCosts: true, salesJobs: 'all' });
		expect(can(installer, { cost: ['read'] })).toBe(false);
	});

	it('shows costs and card fees to owners and managers', () => {
		expect(rolesThatCan({ cost: ['read'] })).toEqual(['owner', 'manager']);
		expect(rolesThatCan({ cardFee: ['read'] })).toEqual(['owner', 'manager']);
	});

	it('keeps installers to their assigned jobs and their pay', () => {
		expect(can('installer', { assignedJob: ['read', 'report'], installerPay: ['read'] })).toBe(
			true
		);
		expect(can('installer', { job: ['read'] })).toBe(false);
		expect(can('installer', { customer: ['read'] })).toBe(false);
		expect(can('installer', { priceBook: ['read'] })).toBe(false);
		expect(can('installer', { cost: ['read'] })).toBe(false);
	});

	it('lets every role use the calculators', () => {
		expect(rolesThatCan({ calculator: ['use'] })).toEqual([
			'owner',
			'manager',
			'sales',
			'installer'
		]);
	});

	it('grants only actions its statements name', () => {
		for (const [role, r] of Object.entries(roles)) {
			for (const [key, actions] of Object.entries(r.statements)) {
				const known: readonly string[] = statement[key as keyof typeof statement] ?? [];
				for (const a of actions as string[]) expect(known, `${role} ${key}:${a}`).toContain(a);
			}
		}
	});

	it('has exactly our four roles, and no inherited name passes for one', () => {
		expect(Object.keys(roles).sort()).toEqual(['installer', 'manager', 'owner', 'sales']);
		for (const name of ['constructor', 'toString', '__proto__', 'hasOwnProperty', 'member']) {
			expect(isRole(name), name).toBe(false);
		}
	});
});
