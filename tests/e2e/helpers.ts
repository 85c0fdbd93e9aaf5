// Steps through the app's own pages that several browser tests share. Signing in without the
// form, and the test's own data: ./fixtures.ts and ./factories.ts.
import { expect, type Page } from '@playwright/test';
import { DEMO_LOGINS, DEMO_PASSWORD } from './support/auth';

/** The demo login of a role (the first one of it), for the tests that sign in by the form. */
export function demoEmail(role: 'owner' | 'manager' | 'sales' | 'installer') {
	return DEMO_LOGINS[role];
}

/** A unique address for a person a test creates. */
export function freshEmail(prefix: string) {
	return `${prefix}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@test.example`;
}

/** Signs in through the sign-in form: only for tests about signing in (see ./fixtures.ts). */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).not.toHaveURL(/\/sign-in/);
}

/** The newest outbox message to an address, and its first link. */
export async function lastMailLink(page: Page, to: string) {
	await page.goto('/dev/outbox');
	const message = page
		.getByRole('listitem')
		.filter({ hasText: `To ${to}` })
		.first();
	await expect(message).toBeVisible();
	return (await message.getByRole('link').first().getAttribute('href'))!;
}

/**
 * Waits until the page is live: its scripts have run and it has hydrated (the root layout marks
 * `<html>` with `data-hydrated`). A click before then is the page as the server sent it.
 */
export async function untilLive(page: Page) {
	await expect(page.locator('html')).toHaveAttribute('data-hydrated', '');
}

/** Checks that the page is not live yet: what the test did so far was done without scripts. */
export async function notLiveYet(page: Page) {
	await expect(page.locator('html')).not.toHaveAttribute('data-hydrated');
}
