// The several-servers test runs on a database of its own in the test cluster, made afresh in its
// beforeAll (`prepareBalancedDatabase`). On the shared test database the two servers' workers
// first had to send every mail the integration suites had queued with no worker running (dozens,
// some with PDFs), so the test's own eight waited behind them. Imported first by
// balanced.spec.ts: the app's pool reads DATABASE_URL when its module loads (it connects on first
// use), so the addresses must name this database before anything imports it.
import { loadPostgres } from './serve';

export const BALANCED_DATABASE = 'flushline_balanced';

function retarget(url: string | undefined) {
	if (!url) return url;
	const u = new URL(url);
	u.pathname = `/${BALANCED_DATABASE}`;
	return u.toString();
}

const shared = { app: process.env.DATABASE_URL, owner: process.env.DATABASE_OWNER_URL };
process.env.DATABASE_URL = retarget(shared.app);
if (shared.owner) process.env.DATABASE_OWNER_URL = retarget(shared.owner);

/** Makes this file's database afresh (roles, migrations, grants) in the running test cluster. */
export async function prepareBalancedDatabase() {
	if (!shared.app) throw new Error('Run these through `npm test` (needs the test database)');
	const postgres = await loadPostgres();
	const port = Number(new URL(shared.app).port);
	const cluster = postgres.clusterAt('postgres-test', port, true);
	const urls = await postgres.prepareDatabase(cluster, {
		database: BALANCED_DATABASE,
		fresh: true
	});
	// The same addresses the app's modules already took from the environment.
	if (new URL(urls.appUrl).pathname !== new URL(process.env.DATABASE_URL!).pathname) {
		throw new Error(`The balanced database is ${urls.appUrl}, not ${process.env.DATABASE_URL}`);
	}
	if (!process.env.DATABASE_OWNER_URL) process.env.DATABASE_OWNER_URL = urls.ownerUrl;
}
