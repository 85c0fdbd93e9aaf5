import { describe, expect, it } from 'vitest';
import { can, roles } from './permissions';

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

	it('keeps installers to their assigned jobs and their pay', () => {
		expect(can('installer', { assignedJob: ['read', 'report'], installerPay: ['read'] })).toBe(
			true
		);
		expect(can('installer', { job: ['read'] })).toBe(false);
		expect(can('installer', { customer: ['read'] })).toBe(false);
		expect(can('installer', { priceBook: ['read'] })).toBe(false);
	});

	it('has exactly our four roles', () => {
		expect(Object.keys(roles).sort()).toEqual(['installer', 'manager', 'owner', 'sales']);
	});
});
