import { defineConfig, devices } from '@playwright/test';

// Runs against the production build (`node build`); `npm test` builds it first and passes the
// test database and secrets in the environment. Debian's Chromium, never a downloaded browser.
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
	globalSetup: './tests/e2e/global-setup.ts',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	reporter: [['list']],
	timeout: 60_000,
	expect: { timeout: 10_000 },
	use: { baseURL, trace: 'retain-on-failure', screenshot: 'only-on-failure' },
	projects: [
		{
			name: 'desktop',
			testIgnore: '**/*.phone.e2e.ts',
			use: { ...devices['Desktop Chrome'], launchOptions }
		},
		{
			name: 'phone',
			testMatch: '**/*.phone.e2e.ts',
			use: { ...devices['Pixel 7'], launchOptions }
		}
	],
	webServer: {
		command: 'node build',
		url: `${baseURL}/`,
		reuseExistingServer: false,
		timeout: 60_000,
		stdout: 'ignore',
		stderr: 'pipe'
	}
});
