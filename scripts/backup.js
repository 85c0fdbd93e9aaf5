// `npm run db:backup [-- <folder>]` and `npm run db:restore -- <folder> [--into <database>]`.
//
// A backup is a folder: `database.dump` (pg_dump's custom format), `files/` (a copy of the file
// store: logos, photos) and `manifest.json` (every table's row count, read in the very snapshot
// the dump was taken in, and every file's size and SHA-256). A restore wipes the target database
// (drops and makes it again), restores the dump and the files, then checks every count and every
// file against the manifest and fails loudly on any difference.
//
// Which database: ADMIN_DATABASE_URL (a role that bypasses row security, such as the cluster's
// superuser: the table owner is held to row security and would dump nothing); else DATABASE_URL's
// database as the cluster's `postgres`; else the project's demo database (FLUSHLINE_PG_PORT). The
// file store is FLUSHLINE_DATA_DIR/files (default .data/app/files).
import { createHash } from 'node:crypto';
import {
	cpSync,
	existsSync,
	mkdirSync,
	readdirSync,
	readFileSync,
	rmSync,
	statSync,
	writeFileSync
} from 'node:fs';
import path from 'node:path';
import { spawn } from 'node:child_process';
import { ensurePackages, root, step } from './lib/system.js';

ensurePackages();
const { default: pg } = await import('pg');
const { ensurePostgresBinaries } = await import('./lib/postgres.js');

const [command, ...rest] = process.argv.slice(2);
const flag = (name) => {
	const i = rest.indexOf(name);
	return i >= 0 ? rest.splice(i, 2)[1] : undefined;
};
const into = flag('--into');
const folderArg = rest[0];

/** The database to back up or restore into, as a role that row security does not hold back. */
function adminUrlOf(env) {
	if (env.ADMIN_DATABASE_URL) return new URL(env.ADMIN_DATABASE_URL);
	if (env.DATABASE_URL) {
		// The app's own database on the project's cluster, as the cluster's superuser.
		const url = new URL(env.DATABASE_URL);
		url.username = 'postgres';
		url.password = '';
		return url;
	}
	return new URL(`postgres://postgres@127.0.0.1:${env.FLUSHLINE_PG_PORT ?? 54320}/flushline`);
}
const adminUrl = adminUrlOf(process.env);
const filesDir = path.join(
	path.resolve(root, process.env.FLUSHLINE_DATA_DIR ?? '.data/app'),
	'files'
);
const bin = ensurePostgresBinaries();

/** Every file under `dir`, as paths relative to it, sorted. */
function listFiles(dir, base = dir) {
	if (!existsSync(dir)) return [];
	return readdirSync(dir, { withFileTypes: true })
		.flatMap((e) => {
			const full = path.join(dir, e.name);
			if (e.isDirectory()) return listFiles(full, base);
			return e.isFile() && !e.name.endsWith('.part') ? [path.relative(base, full)] : [];
		})
		.sort();
}

function fileManifest(dir) {
	return listFiles(dir).map((name) => {
		const bytes = readFileSync(path.join(dir, name));
		return { name, size: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex') };
	});
}

/** Runs a PostgreSQL client program; resolves when it exits 0. */
function client(program, args) {
	return new Promise((resolve, reject) => {
		const child = spawn(path.join(bin, program), args, { stdio: ['ignore', 'inherit', 'pipe'] });
		let stderr = '';
		child.stderr.on('data', (d) => (stderr += d));
		child.on('error', reject);
		child.on('exit', (code) =>
			code === 0 ? resolve() : reject(new Error(`${program} exited with ${code}: ${stderr.trim()}`))
		);
	});
}

/** Row counts of every table of the app's schemas, in the client's current snapshot. */
async function countRows(db) {
	const { rows: tables } = await db.query(
		`select table_schema as schema, table_name as name from information_schema.tables
		 where table_type = 'BASE TABLE' and table_schema in ('public', 'pgboss', 'drizzle')
		 order by 1, 2`
	);
	const counts = {};
	for (const t of tables) {
		const { rows } = await db.query(
			`select count(*)::bigint as n from ${pg.escapeIdentifier(t.schema)}.${pg.escapeIdentifier(t.name)}`
		);
		counts[`${t.schema}.${t.name}`] = Number(rows[0].n);
	}
	return counts;
}

async function backup(folder) {
	mkdirSync(folder, { recursive: true });
	const dump = path.join(folder, 'database.dump');
	const db = new pg.Client({ connectionString: adminUrl.href });
	await db.connect();
	try {
		// One snapshot for the dump and the counts: what the manifest says is what the dump holds.
		await db.query('begin isolation level repeatable read read only');
		const {
			rows: [{ snapshot }]
		} = await db.query('select pg_export_snapshot() as snapshot');
		step(`Dumping ${adminUrl.pathname.slice(1)} (snapshot ${snapshot})`);
		const dumping = client('pg_dump', [
			'--format=custom',
			`--snapshot=${snapshot}`,
			`--file=${dump}`,
			adminUrl.href
		]);
		const rows = await countRows(db);
		await dumping;
		await db.query('commit');
		step(`Copying the file store (${filesDir})`);
		rmSync(path.join(folder, 'files'), { recursive: true, force: true });
		if (existsSync(filesDir)) cpSync(filesDir, path.join(folder, 'files'), { recursive: true });
		const files = fileManifest(path.join(folder, 'files'));
		const manifest = {
			takenAt: new Date().toISOString(),
			database: adminUrl.pathname.slice(1),
			dumpBytes: statSync(dump).size,
			rows,
			files
		};
		writeFileSync(path.join(folder, 'manifest.json'), JSON.stringify(manifest, null, '\t'));
		const total = Object.values(rows).reduce((a, b) => a + b, 0);
		step(
			`Backed up ${total} rows in ${Object.keys(rows).length} tables and ${files.length} files to ${folder}`
		);
	} finally {
		await db.end();
	}
}

async function restore(folder) {
	const manifestFile = path.join(folder, 'manifest.json');
	if (!existsSync(manifestFile))
		throw new Error(`No backup in ${folder} (manifest.json is missing)`);
	const manifest = JSON.parse(readFileSync(manifestFile, 'utf8'));
	const database = into ?? adminUrl.pathname.slice(1);
	if (!/^[a-z_][a-z0-9_]{0,62}$/.test(database))
		throw new Error(`Not a database name: ${database}`);
	const target = new URL(adminUrl.href);
	target.pathname = `/${database}`;
	const maintenance = new URL(adminUrl.href);
	maintenance.pathname = '/postgres';

	step(`Wiping ${database} and restoring ${folder} into it`);
	const admin = new pg.Client({ connectionString: maintenance.href });
	await admin.connect();
	try {
		const { rows } = await admin.query(
			'select pg_get_userbyid(datdba) as owner from pg_database where datname = $1',
			[manifest.database]
		);
		const owner = rows[0]?.owner ?? 'flushline_owner';
		await admin.query(`drop database if exists ${pg.escapeIdentifier(database)} with (force)`);
		await admin.query(
			`create database ${pg.escapeIdentifier(database)} owner ${pg.escapeIdentifier(owner)}`
		);
	} finally {
		await admin.end();
	}
	await client('pg_restore', [
		'--exit-on-error',
		`--dbname=${target.href}`,
		path.join(folder, 'database.dump')
	]);

	rmSync(filesDir, { recursive: true, force: true });
	if (existsSync(path.join(folder, 'files')))
		cpSync(path.join(folder, 'files'), filesDir, { recursive: true });

	// Every row and every file, checked against the manifest.
	const db = new pg.Client({ connectionString: target.href });
	await db.connect();
	let counts;
	try {
		counts = await countRows(db);
	} finally {
		await db.end();
	}
	const problems = [];
	for (const [table, n] of Object.entries(manifest.rows)) {
		if (counts[table] !== n)
			problems.push(`${table}: ${counts[table] ?? 'missing'} rows, the backup has ${n}`);
	}
	const restored = new Map(fileManifest(filesDir).map((f) => [f.name, f]));
	for (const f of manifest.files) {
		const got = restored.get(f.name);
		if (!got) problems.push(`file ${f.name} is missing`);
		else if (got.sha256 !== f.sha256) problems.push(`file ${f.name} differs from the backup`);
	}
	if (problems.length)
		throw new Error(`The restore does not match the backup:\n  ${problems.join('\n  ')}`);
	const total = Object.values(counts).reduce((a, b) => a + b, 0);
	step(
		`Restored ${total} rows and ${manifest.files.length} files into ${database}; every one checked`
	);
}

try {
	if (command === 'backup') {
		const stamp = new Date().toISOString().replace(/[:.]/g, '-');
		await backup(path.resolve(folderArg ?? path.join(root, '.data', 'backups', stamp)));
	} else if (command === 'restore') {
		if (!folderArg) throw new Error('Name the backup folder: npm run db:restore -- <folder>');
		await restore(path.resolve(folderArg));
	} else {
		throw new Error(
			'Usage: node scripts/backup.js backup [folder] | restore <folder> [--into <database>]'
		);
	}
} catch (e) {
	console.error(`\x1b[31m${e instanceof Error ? e.message : e}\x1b[0m`);
	process.exitCode = 1;
}
