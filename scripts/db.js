// For working on the code: start the project's PostgreSQL on its own and print the environment
// to use it, e.g. to run one vitest file against the test database.
//   node scripts/db.js          the demo cluster and database (kept)
//   node scripts/db.js test     the test cluster, with a fresh test database
//   node scripts/db.js bench    the benchmark cluster and database (kept; filled by npm run seed:scale)
//   node scripts/db.js stop     stop the clusters
import { ensurePackages } from './lib/system.js';

ensurePackages();
const { clusterAt, prepareDatabase, startCluster, stopCluster } = await import('./lib/postgres.js');
const demo = clusterAt('postgres', Number(process.env.FLUSHLINE_PG_PORT ?? 54320));
const test = clusterAt('postgres-test', Number(process.env.FLUSHLINE_TEST_PG_PORT ?? 54321), true);
const bench = clusterAt('postgres-bench', Number(process.env.FLUSHLINE_BENCH_PG_PORT ?? 54322));

const which = process.argv[2] ?? 'demo';
if (which === 'stop') {
	stopCluster(demo);
	stopCluster(test);
	stopCluster(bench);
} else {
	const isTest = which === 'test';
	const cluster = isTest ? test : which === 'bench' ? bench : demo;
	startCluster(cluster);
	const { appUrl, ownerUrl } = await prepareDatabase(cluster, {
		database: isTest ? 'flushline_test' : which === 'bench' ? 'flushline_bench' : 'flushline',
		fresh: isTest
	});
	console.log(`export DATABASE_URL=${appUrl}\nexport DATABASE_OWNER_URL=${ownerUrl}`);
	// Tests run on the local fakes, switched on on purpose as `npm test` does.
	if (isTest) console.log('export FLUSHLINE_FAKES=1');
}
