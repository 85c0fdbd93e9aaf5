import { expect, type APIRequestContext, type Page } from '@playwright/test';
import demo from '../../scripts/demo-people.json' with { type: 'json' };

export const DEMO_PASSWORD = demo.password;

/** The demo login of a role (the first one of it). */
export function demoEmail(role: 'owner' | 'manager' | 'sales' | 'installer') {
	return demo.people.find((p) => p.role === role)!.email;
}

export const HOLLIN_OWNER = 'owner@hollinvale.example';

/** A unique address for a person a test creates. */
export function freshEmail(prefix: string) {
	return `${prefix}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@test.example`;
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
	await page.goto('/sign-in');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).not.toHaveURL(/\/sign-in/);
}

/** Signs an API context in by posting the sign-in form, as a browser without JavaScript does. */
export async function signInRequest(request: APIRequestContext, baseURL: string, email: string) {
	const response = await request.post('/sign-in', {
		form: { email, password: DEMO_PASSWORD, redirectTo: '' },
		headers: { origin: baseURL, accept: 'text/html' },
		maxRedirects: 0
	});
	expect(response.status()).toBe(303);
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
