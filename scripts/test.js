// `npm test`: every check, from a fresh clone. Installs what is missing, makes a fresh test
// database in the project's own test cluster, then: format and lint, svelte-check, vitest (unit
// and integration against the real database), a production build, and Playwright in Debian's
// Chromium against that build. Stops at the first failure with a non-zero exit code.
import { randomBytes } from 'node:crypto';
import { rmSync } from 'node:fs';
import path from 'node:path';
import { ensureChromium, ensureHaproxy, ensurePackages, root, run, step } from './lib/system.js';

const pgPort = Number(process.env.FLUSHLINE_TEST_PG_PORT ?? 54321);
const appPort = Number(process.env.FLUSHLINE_TEST_PORT ?? 4173);

async function main() {
	ensurePackages();
	const { clusterAt, prepareDatabase, startCluster, stopCluster } =
		await import('./lib/postgres.js');

	step('Formatting and lint');
	run('npx', ['prettier', '--check', '--log-level', 'warn', '.']);
	run('npx', ['eslint', '.']);
	step('svelte-check');
	run('npx', ['svelte-kit', 'sync']);
	run('npx', [
		'svelte-check',
		'--tsconfig',
		'./tsconfig.json',
		'--fail-on-warnings',
		'--output',
		'human'
	]);

	const cluster = clusterAt('postgres-test', pgPort, true);
	const { startedHere } = startCluster(cluster);
	try {
		const { appUrl, ownerUrl } = await prepareDatabase(cluster, {
			database: 'flushline_test',
			fresh: true
		});
		const dataDir = path.join(root, '.data', 'test-app');
		rmSync(dataDir, { recursive: true, force: true });
		const origin = `http://127.0.0.1:${appPort}`;
		const env = {
			...process.env,
			DATABASE_URL: appUrl,
			DATABASE_OWNER_URL: ownerUrl,
			BETTER_AUTH_SECRET: randomBytes(32).toString('base64url'),
			FLUSHLINE_DATA_DIR: dataDir,
			ORIGIN: origin,
			PORT: String(appPort),
			HOST: '127.0.0.1',
			// Logo uploads are up to 2 MB; adapter-node refuses bodies over 512 kB by default.
			BODY_SIZE_LIMIT: '3M',
			// The fakes, on purpose, and answering even where real keys are set in the shell.
			FLUSHLINE_FAKES: '1',
			RESEND_API_KEY: '',
			STRIPE_SECRET_KEY: '',
			// Sign-in limits stay on; every browser test signs in from 127.0.0.1, so that address
			// gets room for the whole run. The per-account limit is the production default.
			FLUSHLINE_AUTH_LIMIT_ADDRESS: '5000'
		};

		step('vitest: unit and integration');
		run('npx', ['vitest', 'run', '--project', 'unit', '--project', 'integration'], { env });
		step('Production build');
		run('npx', ['vite', 'build', '--logLevel', 'warn'], { env });
		// Two of the built servers behind Debian's HAProxy (tests/server/balanced.spec.ts).
		const haproxy = ensureHaproxy();
		step('vitest: the built server (fakes, limits, headers, input at the edge, logs, two servers)');
		run('npx', ['vitest', 'run', '--project', 'server'], {
			env: { ...env, HAPROXY_PATH: haproxy }
		});
		const chromium = ensureChromium();
		step('Playwright end-to-end tests in Chromium');
		run('npx', ['playwright', 'test'], { env: { ...env, CHROMIUM_PATH: chromium } });
	} finally {
		if (startedHere) stopCluster(cluster);
	}
	step('All checks passed');
}

main().catch((e) => {
	console.error(`\n\x1b[31mnpm test failed:\x1b[0m ${e.message}`);
	process.exit(1);
});
