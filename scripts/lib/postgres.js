// The project's own PostgreSQL: a cluster in a git-ignored folder of the project, on 127.0.0.1,
// started and stopped by `npm start` and `npm test`. Debian's own cluster (port 5432) is left alone.
import { chmodSync, existsSync, mkdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import { aptInstall, capture, isRoot, root, run, runAsPostgres, step } from './system.js';

const BIN_CANDIDATES = [process.env.PG_BIN, '/usr/lib/postgresql/15/bin'].filter(Boolean);

/** Role that owns the schema and runs migrations. */
export const OWNER_ROLE = 'flushline_owner';
/** Role the application connects as: neither superuser nor table owner, so row-level security applies. */
export const APP_ROLE = 'flushline_app';
/**
 * Role that owns the job search function (migration 0016) and nothing else: it cannot log in, and
 * its only rows are the store's search columns through a read policy of its own, so the function
 * can use the trigram indexes that row-level security keeps from the app's role (bench/README.md).
 */
export const SEARCH_ROLE = 'flushline_search';

/** @returns {string} the folder holding initdb, pg_ctl and postgres */
export function ensurePostgresBinaries() {
	const found = BIN_CANDIDATES.find((dir) => existsSync(path.join(dir, 'pg_ctl')));
	if (found) return found;
	aptInstall(['postgresql-15']);
	const installed = BIN_CANDIDATES.find((dir) => existsSync(path.join(dir, 'pg_ctl')));
	if (!installed)
		throw new Error('postgresql-15 installed, but /usr/lib/postgresql/15/bin/pg_ctl is missing');
	return installed;
}

function ensurePostgresUser() {
	if (!isRoot) return;
	if (capture('id', ['-u', 'postgres']) !== null) return;
	step('Creating the postgres system user');
	run('useradd', [
		'--system',
		'--home-dir',
		'/var/lib/postgresql',
		'--shell',
		'/bin/bash',
		'postgres'
	]);
}

/** Every parent folder must be traversable by the postgres user, or the server cannot reach its data. */
function checkTraversable(dir) {
	if (!isRoot) return;
	const ok = capture('runuser', ['-u', 'postgres', '--', 'test', '-x', dir]);
	if (ok === null) {
		throw new Error(
			`The postgres user cannot enter ${dir}. Give every parent folder o+x (chmod o+x) or clone the project elsewhere.`
		);
	}
}

/**
 * @typedef {object} Cluster
 * @property {string} dataDir
 * @property {string} socketDir
 * @property {string} logFile
 * @property {number} port
 * @property {boolean} [fast] fsync off: for the throw-away test cluster only
 */

/**
 * A cluster description for a folder under `.data/`.
 * @param {string} name
 * @param {number} port
 * @param {boolean} [fast]
 * @returns {Cluster}
 */
export function clusterAt(name, port, fast = false) {
	const base = path.join(root, '.data');
	return {
		dataDir: path.join(base, name),
		socketDir: path.join(base, 'run'),
		logFile: path.join(base, `${name}.log`),
		port,
		fast
	};
}

function pgCtl(bin, cluster, args, options = {}) {
	return runAsPostgres(path.join(bin, 'pg_ctl'), ['-D', cluster.dataDir, ...args], options);
}

function isRunning(bin, cluster) {
	const command = isRoot ? 'runuser' : path.join(bin, 'pg_ctl');
	const args = isRoot
		? ['-u', 'postgres', '--', path.join(bin, 'pg_ctl'), 'status', '-D', cluster.dataDir]
		: ['status', '-D', cluster.dataDir];
	return capture(command, args) !== null;
}

/**
 * A crash leaves postmaster.pid behind. PostgreSQL itself ignores a pid file whose process is
 * gone, but a recycled pid (another program now holds it) blocks the start: remove the file when
 * the process it names is not a postgres server.
 */
function clearStalePidFile(cluster) {
	const pidFile = path.join(cluster.dataDir, 'postmaster.pid');
	if (!existsSync(pidFile)) return;
	const pid = Number(readFileSync(pidFile, 'utf8').split('\n')[0]);
	let alive;
	try {
		alive = readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('postgres');
	} catch {
		alive = false;
	}
	if (!alive) {
		step(`Removing a stale postmaster.pid (pid ${pid} is not a running PostgreSQL server)`);
		rmSync(pidFile);
	}
}

/**
 * Creates the cluster when missing and starts it when stopped.
 * @param {Cluster} cluster
 * @returns {{ bin: string, startedHere: boolean }}
 */
export function startCluster(cluster) {
	const bin = ensurePostgresBinaries();
	ensurePostgresUser();
	mkdirSync(cluster.socketDir, { recursive: true });
	mkdirSync(path.dirname(cluster.dataDir), { recursive: true });
	if (isRoot) {
		run('chown', ['postgres:postgres', path.dirname(cluster.dataDir), cluster.socketDir]);
	}
	chmodSync(cluster.socketDir, 0o775);
	checkTraversable(cluster.socketDir);

	if (!existsSync(path.join(cluster.dataDir, 'PG_VERSION'))) {
		step(`Creating a PostgreSQL cluster in ${path.relative(root, cluster.dataDir)}`);
		rmSync(cluster.dataDir, { recursive: true, force: true });
		mkdirSync(cluster.dataDir, { recursive: true });
		if (isRoot) run('chown', ['-R', 'postgres:postgres', cluster.dataDir]);
		runAsPostgres(
			path.join(bin, 'initdb'),
			['-D', cluster.dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8'],
			{ quiet: true }
		);
	} else if (isRoot) {
		run('chown', ['-R', 'postgres:postgres', cluster.dataDir]);
	}

	if (isRunning(bin, cluster)) return { bin, startedHere: false };
	clearStalePidFile(cluster);

	const settings = [
		`-c listen_addresses=127.0.0.1`,
		`-p ${cluster.port}`,
		`-k ${cluster.socketDir}`,
		...(cluster.fast
			? ['-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off']
			: [])
	].join(' ');
	step(`Starting PostgreSQL on 127.0.0.1:${cluster.port}`);
	if (isRoot) {
		run('touch', [cluster.logFile]);
		run('chown', ['postgres', cluster.logFile]);
	}
	for (let attempt = 1; ; attempt++) {
		const logged = existsSync(cluster.logFile) ? statSync(cluster.logFile).size : 0;
		try {
			pgCtl(bin, cluster, ['-l', cluster.logFile, '-w', '-t', '60', '-o', settings, 'start'], {
				quiet: true
			});
			return { bin, startedHere: true };
		} catch (e) {
			if (!portWasTaken(cluster.logFile, logged)) throw e;
			if (attempt >= PORT_TRIES) {
				throw new Error(
					`PostgreSQL could not listen on 127.0.0.1:${cluster.port}: another program holds that port. Stop it, or give this cluster another port (README, "Environment").`,
					{ cause: e }
				);
			}
			step(
				`127.0.0.1:${cluster.port} is taken for now; trying again (${attempt} of ${PORT_TRIES})`
			);
			Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 1_000 * attempt);
		}
	}
}

/**
 * How often to start a cluster whose port is taken. The project's ports (54320 and up) lie in
 * Linux's range for outgoing connections' own ports (`/proc/sys/net/ipv4/ip_local_port_range`,
 * 32768–60999 by default): while a cluster is stopped, as when a test restarts it, any outgoing
 * connection on the machine may be given its port for a moment, and PostgreSQL then cannot bind
 * it ("Address already in use"). Such a connection is most often a short one (a request, a test's
 * query), so the start is tried again after 1, 2, 3 and 4 s before it gives up.
 */
const PORT_TRIES = 5;

/** Whether what the cluster logged since `from` says its port was in use. */
function portWasTaken(logFile, from) {
	if (!existsSync(logFile)) return false;
	return readFileSync(logFile).subarray(from).includes('Address already in use');
}

/**
 * Stops the cluster (fast shutdown: sessions end, committed data stays).
 * @param {Cluster} cluster
 */
export function stopCluster(cluster) {
	const bin = ensurePostgresBinaries();
	if (!isRunning(bin, cluster)) return;
	pgCtl(bin, cluster, ['-m', 'fast', '-w', 'stop'], { quiet: true });
}

/**
 * @param {Cluster} cluster
 * @param {string} user
 * @param {string} database
 */
export function databaseUrl(cluster, user, database) {
	return `postgres://${user}@127.0.0.1:${cluster.port}/${database}`;
}

/**
 * Creates the roles and the database (when missing, or afresh), applies the migrations from
 * `drizzle/` as the owner, and grants the application role what it needs: rows of the app's
 * tables and of the task queue's (schema `pgboss`), never the right to change either schema.
 * @param {Cluster} cluster
 * @param {{ database: string, fresh?: boolean }} options
 * @returns {Promise<{ ownerUrl: string, appUrl: string }>}
 */
export async function prepareDatabase(cluster, { database, fresh = false }) {
	const { default: pg } = await import('pg');
	const admin = new pg.Client({ connectionString: databaseUrl(cluster, 'postgres', 'postgres') });
	await admin.connect();
	try {
		for (const role of [OWNER_ROLE, APP_ROLE]) {
			const exists = await admin.query('select 1 from pg_roles where rolname = $1', [role]);
			if (exists.rowCount === 0) {
				await admin.query(
					`create role ${role} login nosuperuser nocreatedb nocreaterole noreplication nobypassrls`
				);
			}
		}
		const search = await admin.query('select 1 from pg_roles where rolname = $1', [SEARCH_ROLE]);
		if (search.rowCount === 0) {
			await admin.query(
				`create role ${SEARCH_ROLE} nologin nosuperuser nocreatedb nocreaterole noreplication nobypassrls`
			);
		}
		// The owner makes the function and hands it over: that needs membership of the role.
		await admin.query(`grant ${SEARCH_ROLE} to ${OWNER_ROLE}`);
		if (fresh) {
			await admin.query(`drop database if exists ${database} with (force)`);
		}
		const db = await admin.query('select 1 from pg_database where datname = $1', [database]);
		if (db.rowCount === 0) {
			step(`Creating database ${database}`);
			await admin.query(`create database ${database} owner ${OWNER_ROLE}`);
		}
	} finally {
		await admin.end();
	}

	const ownerUrl = databaseUrl(cluster, OWNER_ROLE, database);
	const appUrl = databaseUrl(cluster, APP_ROLE, database);
	await migrate(ownerUrl);

	const owner = new pg.Client({ connectionString: ownerUrl });
	await owner.connect();
	try {
		await owner.query(`
			grant usage on schema public to ${APP_ROLE};
			grant select, insert, update, delete on all tables in schema public to ${APP_ROLE};
			grant usage, select on all sequences in schema public to ${APP_ROLE};
			alter default privileges for role ${OWNER_ROLE} in schema public
				grant select, insert, update, delete on tables to ${APP_ROLE};
			alter default privileges for role ${OWNER_ROLE} in schema public
				grant usage, select on sequences to ${APP_ROLE};
			grant usage on schema pgboss to ${APP_ROLE};
			grant select, insert, update, delete on all tables in schema pgboss to ${APP_ROLE};
			alter default privileges for role ${OWNER_ROLE} in schema pgboss
				grant select, insert, update, delete on tables to ${APP_ROLE};
		`);
	} finally {
		await owner.end();
	}
	return { ownerUrl, appUrl };
}

/**
 * The advisory lock migrations hold (any fixed number of ours): two deploy steps, or two
 * servers' start scripts, that migrate the same database at once take turns, and the second
 * finds every migration applied and does nothing (drizzle's migrator alone would run them
 * twice and fail on the second copy of each table).
 */
export const MIGRATION_LOCK = 7_231_013;

/**
 * Applies the SQL migrations in `drizzle/` with drizzle-orm's migrator, holding the migration
 * lock on a connection of its own for the whole run.
 * @param {string} url
 */
export async function migrate(url) {
	const { default: pg } = await import('pg');
	const { drizzle } = await import('drizzle-orm/node-postgres');
	const { migrate: apply } = await import('drizzle-orm/node-postgres/migrator');
	const lock = new pg.Client({ connectionString: url });
	await lock.connect();
	const pool = new pg.Pool({ connectionString: url, max: 1 });
	try {
		await lock.query('select pg_advisory_lock($1)', [MIGRATION_LOCK]);
		step('Applying migrations');
		await apply(drizzle(pool), { migrationsFolder: path.join(root, 'drizzle') });
	} finally {
		await pool.end();
		// Ending the session releases the lock, even when the migration failed.
		await lock.end();
	}
}
