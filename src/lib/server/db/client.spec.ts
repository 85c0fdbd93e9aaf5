// DATABASE_POOL_MAX: one server's share of a managed PostgreSQL's connections (README,
// "Deploying on several servers").
import { describe, expect, it } from 'vitest';
import { DEFAULT_POOL_SIZE, poolSize } from './client';

describe('poolSize', () => {
	it('is the default when unset or empty', () => {
		expect(poolSize(undefined)).toBe(DEFAULT_POOL_SIZE);
		expect(poolSize('')).toBe(DEFAULT_POOL_SIZE);
	});

	it('takes a whole number from 1 to 200', () => {
		expect(poolSize('1')).toBe(1);
		expect(poolSize('25')).toBe(25);
		expect(poolSize('200')).toBe(200);
	});

	it('refuses anything else, naming the setting', () => {
		for (const bad of ['0', '201', '-3', '2.5', '1e2', ' 5', 'ten']) {
			expect(() => poolSize(bad), bad).toThrow(/DATABASE_POOL_MAX must be a whole number/);
		}
	});
});
