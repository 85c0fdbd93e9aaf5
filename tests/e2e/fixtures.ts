// The browser tests' `test` and `expect`, and signing in without the sign-in form.
//
//   import { expect, test } from './fixtures';
//   test.use({ signedInAs: 'sales' });          // `page`, `context` and `request` are Priya's
//   await signInAs(context, store.people[1]);    // a login a factory made, into this context
//   const rosa = await requestAs(playwright, 'installer');   // an API client of its own
//   const other = await pageAs(browser, 'jonah');             // a second person's browser page
//   const customer = await newPage(browser);                  // signed out, e.g. the customer
//
// The demo logins (support/auth.ts, DEMO_LOGINS) are signed in once per run by the setup
// project (global.setup.ts) and shared by every test: a test may read as them, never sign them
// out, switch their store or change the demo stores' data. A test that writes makes its own
// store and people (./factories.ts); their sessions are made in this process, once per worker.
// Only tests about signing in use the form (`signIn` in ./helpers.ts).
//
// Every page a test opens (its own `page`, and those of `newPage`/`pageAs`) is watched for
// Content-Security-Policy violations: the DOM's `securitypolicyviolation` event and Chromium's
// console report. Any violation fails the test when it ends.
import {
	test as base,
	expect,
	type Browser,
	type BrowserContext,
	type BrowserContextOptions,
	type Page,
	type PlaywrightWorkerArgs
} from '@playwright/test';
import { pool } from '../../src/lib/server/db';
import type { Person } from './factories';
import {
	demoState,
	demoStatePath,
	newSession,
	ORIGIN,
	type DemoLogin,
	type SignedIn
} from './support/auth';

export { expect };
export type { DemoLogin };

/** Someone to act as: a demo login's short name, or a person a factory made. */
export type Who = DemoLogin | Person;

const sessions = new Map<string, Promise<SignedIn>>();
/** Contexts `pageAs` opened during the current test, closed when it ends. */
const opened = new Set<BrowserContext>();

/** The saved sign-in of a demo login, or a session of a made person (one per worker). */
export function stateOf(who: Who): Promise<SignedIn> {
	if (typeof who === 'string') return Promise.resolve(demoState(who));
	let made = sessions.get(who.email);
	if (!made) {
		made = newSession(who);
		sessions.set(who.email, made);
	}
	return made;
}

/** CSP violations seen by the current test's pages. */
const violations: string[] = [];

function watchPage(page: Page) {
	page.on('console', (message) => {
		const text = message.text();
		if (/Content Security Policy|CSP violation/i.test(text))
			violations.push(`${page.url()}: ${text}`);
	});
	page.on('pageerror', (error) => {
		if (/Content Security Policy/i.test(error.message))
			violations.push(`${page.url()}: ${error.message}`);
	});
}

/** Watches every page of a context for CSP violations (the DOM event is logged to the console). */
export async function watchCsp(context: BrowserContext) {
	await context.addInitScript(() => {
		document.addEventListener('securitypolicyviolation', (e) => {
			console.error(
				`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'} at ${e.sourceFile}:${e.lineNumber}`
			);
		});
	});
	context.on('page', watchPage);
	for (const page of context.pages()) watchPage(page);
}

/** Signs a browser context in (its pages and `context.request` share the session). */
export async function signInAs(context: BrowserContext, who: Who) {
	await context.addCookies((await stateOf(who)).cookies);
}

/** A page in a context of its own (the customer, a second tab set), closed when the test ends. */
export async function newPage(browser: Browser, options: BrowserContextOptions = {}) {
	const context = await browser.newContext(options);
	opened.add(context);
	await watchCsp(context);
	return context.newPage();
}

/** A page in a context of its own, signed in: a second person at the same time. */
export async function pageAs(browser: Browser, who: Who, options: BrowserContextOptions = {}) {
	return newPage(browser, { ...options, storageState: await stateOf(who) });
}

/** An API client signed in as someone, for the JSON API and form posts. */
export async function requestAs(playwright: PlaywrightWorkerArgs['playwright'], who: Who) {
	return playwright.request.newContext({ baseURL: ORIGIN, storageState: await stateOf(who) });
}

export const test = base.extend<
	{ signedInAs: DemoLogin | undefined; closeOpened: void; cspViolations: string[] },
	{ database: void }
>({
	/** `test.use({ signedInAs: 'manager' })`: the test's browser starts signed in as that login. */
	signedInAs: [undefined, { option: true }],
	storageState: async ({ signedInAs, storageState }, use) => {
		await use(signedInAs ? demoStatePath(signedInAs) : storageState);
	},
	/** Fails the test on any CSP violation in any page it opened (`context` is the test's own). */
	cspViolations: [
		async ({ context }, use) => {
			violations.length = 0;
			await watchCsp(context);
			await use(violations);
			expect(violations, 'Content-Security-Policy violations').toEqual([]);
		},
		{ auto: true }
	],
	closeOpened: [
		// eslint-disable-next-line no-empty-pattern
		async ({}, use) => {
			await use();
			await Promise.all([...opened].map((context) => context.close()));
			opened.clear();
		},
		{ auto: true }
	],
	/** The factories' database pool, closed when the worker ends. */
	database: [
		// eslint-disable-next-line no-empty-pattern
		async ({}, use) => {
			await use();
			await pool.end();
		},
		{ scope: 'worker', auto: true }
	]
});
