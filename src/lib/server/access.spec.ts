import { describe, expect, it } from 'vitest';
import { homeFor, navFor, needsMember, refusal } from './access';
import { grantsOf } from './permissions';

describe('sections by role', () => {
	it('keeps store settings and the team to the owner', () => {
		expect(refusal('/app/settings', 'owner')).toBeNull();
		for (const role of ['manager', 'sales', 'installer'] as const) {
			expect(refusal('/app/settings', role)).toMatch(/Owner only/);
			expect(refusal('/app/team/anything', role)).toMatch(/Owner only/);
		}
	});

	it('keeps installers out of the staff desk and staff out of the installer screens', () => {
		expect(refusal('/app/customers', 'installer')).toMatch(/your role in this store is Installer/);
		expect(refusal('/field', 'sales')).toMatch(/Installer only/);
		expect(refusal('/field/jobs/x', 'installer')).toBeNull();
		expect(refusal('/app/price-book', 'sales')).toBeNull();
		expect(refusal('/app/price-book', 'installer')).toMatch(
			/price book is open to Owner, Manager, Sales/
		);
		expect(refusal('/app/payments', 'sales')).toMatch(/Payments is open to Owner, Manager only/);
		// A section inside another must pass both: installers use calculators, but not the desk's.
		expect(refusal('/app/calculators', 'installer')).toMatch(/store desk/);
		expect(refusal('/field/calculators', 'installer')).toBeNull();
	});

	it('does not take a prefix for a section (/application is not /app)', () => {
		expect(needsMember('/application')).toBe(false);
		expect(needsMember('/app')).toBe(true);
		expect(needsMember('/api/v1/customers')).toBe(true);
		expect(needsMember('/api/auth/sign-in/email')).toBe(false);
	});

	it('gives each role its own navigation, built from the same rules', () => {
		const hrefs = (role: Parameters<typeof navFor>[0]) => navFor(role).map((i) => i.href);
		const desk = ['/app', '/app/jobs', '/app/customers'];
		const crew = ['/app/schedule', '/app/installers', '/app/statements'];
		expect(hrefs('owner')).toEqual([
			...desk,
			'/app/price-book',
			'/app/payments',
			...crew,
			'/app/calculators',
			'/app/team',
			'/app/settings'
		]);
		expect(hrefs('manager')).toEqual([
			...desk,
			'/app/price-book',
			'/app/payments',
			...crew,
			'/app/calculators'
		]);
		expect(hrefs('sales')).toEqual([...desk, '/app/price-book', '/app/calculators']);
		expect(hrefs('installer')).toEqual([
			'/field',
			'/field/statements',
			'/field/profile',
			'/field/calculators'
		]);
	});

	it('lands installers on their own screens', () => {
		expect(homeFor('installer')).toBe('/field');
		expect(homeFor('sales')).toBe('/app');
		expect(homeFor(null)).toBe('/stores');
	});

	it("reads the member's grants, not only the role", () => {
		const seeing = grantsOf('sales', { salesSeeCosts: true, salesJobs: 'own' });
		expect(navFor(seeing)).toEqual(navFor('sales'));
		expect(refusal('/app/settings', seeing)).toMatch(/your role in this store is Sales/);
	});
});
