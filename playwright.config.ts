import { defineConfig, devices } from '@playwright/test';

// Runs against the production build (`node build`); `npm test` builds it first and passes the
// test database and secrets in the environment. Debian's Chromium, never a downloaded browser.
// The setup project seeds the demo stores and saves each demo login's sign-in; every test then
// stands alone (its own store when it writes, see tests/e2e/factories.ts), so two workers run
// the tests of every file side by side.
const port = Number(process.env.PORT ?? 4173);
const baseURL = `http://127.0.0.1:${port}`;

const launchOptions = {
	executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
	args: [
		'--headless',
		'--no-sandbox',
		'--disable-gpu',
		'--disable-quic',
		'--no-first-run',
		'--disable-background-networking',
		'--disable-component-update',
		'--disable-sync'
	]
};

export default defineConfig({
	testDir: 'tests/e2e',
	testMatch: '**/*.e2e.ts',
	fullyParallel: true,
	workers: 2,
	retries: 0,
	reporter: [['list']],
	// A budget, never a check of speed (that is bench/): a shared 2-core machine under load runs
	// the longest flows (a whole measure, a quote taken to payment) past a minute.
	timeout: 120_000,
	expect: { timeout: 10_000 },
	use: { baseURL, trace: 'retain-on-failure', screenshot: 'only-on-failure' },
	projects: [
		// Debian's Chromium here too: the CSP watcher (tests/e2e/fixtures.ts) opens a context for every test.
		{ name: 'setup', testMatch: 'global.setup.ts', use: { launchOptions } },
		{
			name: 'desktop',
			testIgnore: '**/*.phone.e2e.ts',
			dependencies: ['setup'],
			use: { ...devices['Desktop Chrome'], launchOptions }
		},
		{
			name: 'phone',
			testMatch: '**/*.phone.e2e.ts',
			dependencies: ['setup'],
			use: { ...devices['Pixel 7'], launchOptions }
		}
	],
	webServer: {
		command: 'node build',
		url: `${baseURL}/`,
		reuseExistingServer: false,
		// A budget, never a check of speed (that is bench/): a shared 2-core machine under load runs
		// the longest flows (a whole measure, a quote taken to payment) past a minute.
		timeout: 120_000,
		stdout: 'ignore',
		stderr: 'pipe',
		// Idle connections kept for 10 minutes, longer than the whole run, not 5 s. The tests' API
		// calls (`page.request`, `requestAs`) keep their connections in Node's agent, which never
		// lets one go by itself, while node's server closes one 5 s (and its 1 s of grace) after its
		// last answer. A call that reuses one just then, with the test's process busy when the close
		// came, fails with ECONNRESET: shown by hand on node 20 (4 of 6 reuses at 5.99–6.01 s with
		// the client's event loop held for 40 ms; none with the longer timeout). One clone's
		// `measure.e2e.ts` failed so: its calls come before and after some seconds of typing.
		env: { KEEP_ALIVE_TIMEOUT: '600' }
	}
});
