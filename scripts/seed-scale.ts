// `npm run seed:scale`: a large database for the benchmarks (bench/README.md), in its own cluster
// (.data/postgres-bench, port FLUSHLINE_BENCH_PG_PORT or 54322, database flushline_bench).
//
//   npm run seed:scale                          50 stores × ~2,000 jobs, ~48 customers each
//   npm run seed:scale -- --stores 2 --jobs 200 a small one, for working on the benchmarks
//   npm run seed:scale -- --big                 and one store of ~100,000 jobs, ~2,000 customers
//   npm run seed:scale -- --stores 0 --big      only the big store
//   npm run seed:scale -- --add --stores 0 --big  add the big store to the seeded database
//
// How: the demo seed (scripts/seed.ts) makes one template store through the app's own code
// (better-auth sign-ups, price book, measures, quotes built by the engine, payments, bookings),
// plus a field report, items and photos on its jobs under way. Each scale store is then a
// copy of that template made by PostgreSQL itself (`insert … select … cross join
// generate_series`): every id is remapped to a new uuid (md5 of the template id, the store and the
// copy), price-item ids inside the measure and quote JSON are remapped once per store, and times
// are spread backwards. The engine runs once per distinct measure, never per copy. The copy runs
// as the cluster's superuser, which row-level security does not apply to, with triggers off
// (`session_replication_role = replica`): the rows are the template's, already checked.
import path from 'node:path';
import pg from 'pg';

const args = process.argv.slice(2);
function option(name: string, fallback: number): number {
	const at = args.indexOf(`--${name}`);
	if (at === -1) return fallback;
	const value = Number(args[at + 1]);
	if (!Number.isInteger(value) || value < 0 || value > 1_000_000)
		throw new Error(`--${name} takes a whole number`);
	return value;
}
const STORES = option('stores', 50);
const JOBS = option('jobs', 2000);
const CUSTOMERS = option('customers', 40);
const BIG = args.includes('--big');
const BIG_JOBS = option('big-jobs', 100_000);
const BIG_CUSTOMERS = option('big-customers', 2000);
/** Add to the bench database already seeded (its template store stays) instead of starting afresh. */
const ADD = args.includes('--add');
/** The big store's number (stores are numbered 1…STORES). */
export const BIG_STORE = 1000;

const started = performance.now();
const seconds = () => ((performance.now() - started) / 1000).toFixed(1);

const { clusterAt, prepareDatabase, startCluster, databaseUrl } = await import('./lib/postgres.js');
const cluster = clusterAt('postgres-bench', Number(process.env.FLUSHLINE_BENCH_PG_PORT ?? 54322));
startCluster(cluster);
/** Another name keeps the one benchmarked while a second is seeded (`FLUSHLINE_BENCH_DB`). */
const database = process.env.FLUSHLINE_BENCH_DB ?? 'flushline_bench';
const { appUrl, ownerUrl } = await prepareDatabase(cluster, {
	database,
	fresh: !ADD
});
process.env.DATABASE_URL = appUrl;
process.env.DATABASE_OWNER_URL = ownerUrl;
process.env.FLUSHLINE_FAKES ??= '1';
// Photos go where the bench's server reads them (bench/run-http.js uses the same folder).
const dataDir = path.resolve(process.env.FLUSHLINE_DATA_DIR ?? '.data/bench-app');
process.env.FLUSHLINE_DATA_DIR = dataDir;
const superUrl = databaseUrl(cluster, 'postgres', database);

// The template: the demo store, made through the app's own code.
const { seedDemo } = await import('./seed');
const { pool } = await import('../src/lib/server/db/index');
let template: string;
if (ADD) {
	const { rows } = await pool.query<{ id: string }>(
		`select id from organization where slug = 'tallow-creek-floors'`
	);
	if (!rows[0]) throw new Error('--add needs a database seeded by npm run seed:scale before');
	template = rows[0].id;
} else {
	template = (await seedDemo()).storeId;
	const { addFieldWork } = await import('./seed-scale-field');
	await addFieldWork(template, dataDir);
}
await pool.end();
console.log(`template store made through the app in ${seconds()} s`);

/** Tables copied once per store, per customer copy, per job copy. */
const STORE_TABLES = [
	'store_profile',
	'store_settings',
	'price_item',
	'member',
	'installer_profile',
	'installer_time_off'
];
const CUSTOMER_TABLES = ['customer', 'site'];
const JOB_TABLES = [
	'job',
	'job_event',
	'measure',
	'quote',
	'payment',
	'refund',
	'booking',
	'field_report',
	'field_item',
	'field_photo',
	'change_order',
	'job_completion'
];
/** Columns naming a person (a user id): the store's copy of that person. */
const PERSON = new Set([
	'user_id',
	'account_id',
	'salesperson_id',
	'installer_id',
	'actor_id',
	'created_by',
	'recorded_by',
	'updated_by',
	'booked_by',
	'cancelled_by',
	'checked_in_by',
	'submitted_by',
	'uploaded_by',
	'reviewed_by',
	'declined_by',
	'completed_by',
	'paid_by',
	'inviter_id'
]);
const CUSTOMER_REF = new Set(['customer_id', 'site_id']);
const KEEP = new Set(['organization_id', 'provider_id']);

const client = new pg.Client({ connectionString: superUrl });
await client.connect();
await client.query(`set session_replication_role = replica`);

type Column = { name: string; type: string };
async function columnsOf(table: string): Promise<Column[]> {
	const { rows } = await client.query<Column>(
		`select attname as name, format_type(atttypid, atttypmod) as type from pg_attribute
		 where attrelid = $1::regclass and attnum > 0 and not attisdropped and attgenerated = '' order by attnum`,
		[`"${table}"`]
	);
	return rows;
}

// SQL helpers: $1 store number, $2 template id, $3 new store id.
const fs = (x: string) =>
	`(case when ${x} is null then null else md5(${x} || '/' || $1::int)::uuid::text end)`;
const fc = (x: string, c: string) =>
	`(case when ${x} is null then null else md5(${x} || '/' || $1::int || '/c' || (${c}))::uuid::text end)`;
const fk = (x: string) =>
	`(case when ${x} is null then null else md5(${x} || '/' || $1::int || '/j' || k)::uuid::text end)`;

/** A customer copy's name: the template's first name and a surname picked by the copy `c`. */
const copiedName = (name: string, c: string) =>
	`split_part(${name}, ' ', 1) || ' ' || (array[${SURNAMES.map((s) => `'${s}'`).join(',')}])[1 + (((${c}) * 7 + length(${name})) % ${SURNAMES.length})]`;

type Level = 'store' | 'customer' | 'job';
function expression(table: string, col: Column, level: Level, customerCopies: string): string {
	const t = `t."${col.name}"`;
	const idLike = col.name === 'id' || col.name.endsWith('_id') || PERSON.has(col.name);
	if (col.name === 'organization_id') return '$3';
	if (KEEP.has(col.name) || (col.name.startsWith('stripe_') && table !== 'store_settings'))
		return t;
	if (table === 'store_settings' && col.name === 'stripe_account_id')
		return `'acct_scale' || $1::int`;
	if (table === 'job' && col.name === 'number')
		return `1001 + k * ${'$4'}::int + (t.number - 1001)`;
	if (table === 'customer' && col.name === 'name') return copiedName(t, 'c');
	// The job's copy of its customer's name (migration 0017; triggers are off for the copy): the
	// same name as that customer's copy, whose number is `k % customerCopies` (CUSTOMER_REF below).
	if (table === 'job' && col.name === 'customer_name')
		return copiedName(t, `k % ${customerCopies}`);
	if (table === 'customer' && col.name === 'email')
		return `replace(t.email, '@', '+' || $1::int || '-' || c || '@')`;
	if (idLike || col.name === 'client_id' || col.name === 'item_client_id') {
		if (PERSON.has(col.name)) return fs(t);
		if (CUSTOMER_REF.has(col.name))
			return level === 'job' ? fc(t, `k % ${customerCopies}`) : fc(t, 'c');
		if (level === 'store') return fs(t);
		if (level === 'customer') return fc(t, 'c');
		return fk(t);
	}
	if (level === 'job' && col.type.startsWith('timestamp')) return `${t} - k * interval '3 hours'`;
	// Days move back with the times (8 copies a day): most bookings are past, as in a store that
	// has worked for years, and each installer has a few weeks ahead.
	if (level === 'job' && col.type === 'date') return `${t} - (k * 3 / 24)::int`;
	if (col.type === 'jsonb' && level === 'job') return `coalesce(j."${col.name}", ${t})`;
	return t;
}

const SURNAMES = [
	'Ashgrove',
	'Birchall',
	'Cardwell',
	'Dunmere',
	'Elsworth',
	'Farrant',
	'Gorsedge',
	'Halloway',
	'Ingleby',
	'Jessamy',
	'Kestrel',
	'Lowther',
	'Merriden',
	'Northam',
	'Orwin',
	'Pellow',
	'Quillan',
	'Rushby',
	'Stannard',
	'Thorley',
	'Upwood',
	'Verity',
	'Wendover',
	'Yarrow'
];
const TOWNS = [
	'Marlow Bend',
	'Cinder Ford',
	'Hazelmoor',
	'Pike Hollow',
	'Ravensdale',
	'Sedge Green',
	'Thornbury Cross',
	'Willowmere',
	'Ashby Reach',
	'Brackenfield'
];

const templateJobs = Number(
	(await client.query('select count(*) as n from job where organization_id = $1', [template]))
		.rows[0].n
);
const templateCustomers = Number(
	(await client.query('select count(*) as n from customer where organization_id = $1', [template]))
		.rows[0].n
);
const priceIds = (
	await client.query<{ id: string }>('select id from price_item where organization_id = $1', [
		template
	])
).rows.map((r) => r.id);

// Measure, quote and change-order JSON names price items: their ids are remapped once per store.
await client.query(`
	create or replace function pg_temp.remap(j jsonb, ids text[], s int) returns jsonb
	language plpgsql immutable as $$
	declare t text; i text;
	begin
		if j is null then return null; end if;
		t := j::text;
		foreach i in array ids loop
			if position(i in t) > 0 then t := replace(t, i, md5(i || '/' || s)::uuid::text); end if;
		end loop;
		return t::jsonb;
	end $$`);

const columns = new Map<string, Column[]>();
for (const table of [...STORE_TABLES, ...CUSTOMER_TABLES, ...JOB_TABLES])
	columns.set(table, await columnsOf(table));

async function copyStore(s: number, jobs: number, customers: number) {
	const copies = Math.max(1, Math.ceil(jobs / templateJobs));
	const customerCopies = Math.max(1, Math.ceil(customers / templateCustomers));
	const town = TOWNS[s % TOWNS.length];
	await client.query('begin');
	const storeId = (
		await client.query<{ id: string }>(`select md5($1 || '/' || $2::int)::uuid::text as id`, [
			template,
			s
		])
	).rows[0].id;
	const params = [s, template, storeId];
	await client.query(
		`insert into organization (id, name, slug, logo, created_at, metadata, time_zone, sales_see_costs, sales_jobs)
		 select $3, $4, slug || '-' || $1::int, logo, created_at, metadata, time_zone, sales_see_costs, sales_jobs
		 from organization where id = $2`,
		[...params, `${town} Floor Co. ${s}`]
	);
	// The template's people, each with a login of their own in this store (same password).
	await client.query(
		`insert into "user" (id, name, email, email_verified, image, created_at, updated_at)
		 select ${fs('u.id')}, u.name, replace(u.email, '@', '+s' || $1::int || '@'), u.email_verified, u.image, u.created_at, u.updated_at
		 from "user" u join member m on m.user_id = u.id where m.organization_id = $2 and $3 <> ''`,
		params
	);
	const accountCols = (await columnsOf('account')).map((c) => c.name);
	await client.query(
		`insert into account (${accountCols.map((c) => `"${c}"`).join(', ')})
		 select ${accountCols.map((c) => (c === 'id' || c === 'user_id' || c === 'account_id' ? fs(`t."${c}"`) : `t."${c}"`)).join(', ')}
		 from account t join member m on m.user_id = t.user_id where m.organization_id = $2 and $3 <> ''`,
		params
	);
	for (const table of STORE_TABLES) {
		const cols = columns.get(table)!;
		await client.query(
			`insert into "${table}" (${cols.map((c) => `"${c.name}"`).join(', ')})
			 select ${cols.map((c) => expression(table, c, 'store', '1')).join(', ')}
			 from "${table}" t where t.organization_id = $2 and $1::int > 0 and $3 <> ''`,
			params
		);
	}
	await client.query(
		`insert into job_number_counter (organization_id, last_number) values ($1, $2::int + 1000)
		 on conflict (organization_id) do nothing`,
		[storeId, copies * templateJobs]
	);
	for (const table of CUSTOMER_TABLES) {
		const cols = columns.get(table)!;
		await client.query(
			`insert into "${table}" (${cols.map((c) => `"${c.name}"`).join(', ')})
			 select ${cols.map((c) => expression(table, c, 'customer', String(customerCopies))).join(', ')}
			 from "${table}" t cross join generate_series(0, ${customerCopies - 1}) c
			 where t.organization_id = $2 and $1::int > 0 and $3 <> ''`,
			params
		);
	}
	for (const table of JOB_TABLES) {
		const cols = columns.get(table)!;
		const json = cols.filter((c) => c.type === 'jsonb');
		// The JSON of each template row, remapped to this store's price items once.
		const join = json.length
			? `left join (select id, ${json.map((c) => `pg_temp.remap("${c.name}", $5::text[], $1::int) as "${c.name}"`).join(', ')}
			   from "${table}" where organization_id = $2) j on j.id = t.id`
			: '';
		const sql = `insert into "${table}" (${cols.map((c) => `"${c.name}"`).join(', ')})
			 select ${cols.map((c) => expression(table, c, 'job', String(customerCopies))).join(', ')}
			 from "${table}" t ${join} cross join generate_series(0, ${copies - 1}) k
			 where t.organization_id = $2 and $1::int > 0 and $3 <> '' and $4::int > 0 ${json.length ? '' : 'and $5::text[] is not null'}`;
		await client.query(sql, [...params, templateJobs, priceIds]);
	}
	// The trigrams of the store's job titles and names (migration 0019) and its tally of jobs per
	// status (0020), which the job triggers (off for the copy) would have written.
	await client.query('select job_name_trigrams_fill($1)', [storeId]);
	await client.query('select job_tally_fill($1)', [storeId]);
	await client.query('commit');
	return { storeId, jobs: copies * templateJobs, customers: customerCopies * templateCustomers };
}

const made: { s: number; storeId: string; jobs: number; customers: number }[] = [];
for (let s = 1; s <= STORES; s++) {
	made.push({ s, ...(await copyStore(s, JOBS, CUSTOMERS)) });
	if (s % 10 === 0 || s === STORES) console.log(`${s} stores copied (${seconds()} s)`);
}
if (BIG) {
	made.push({ s: BIG_STORE, ...(await copyStore(BIG_STORE, BIG_JOBS, BIG_CUSTOMERS)) });
	console.log(`the big store copied (${seconds()} s)`);
}
await client.query('set session_replication_role = origin');
// Fresh statistics and visibility maps, as autovacuum would leave them: index-only scans count rows.
await client.query('vacuum analyze');

const counts = await client.query<{ table: string; n: string }>(
	[...CUSTOMER_TABLES, ...JOB_TABLES, 'organization', 'user', 'member', 'price_item']
		.map((t) => `select '${t}' as table, count(*) as n from "${t}"`)
		.join(' union all ')
);
await client.end();

console.log(`\nseed:scale done in ${seconds()} s`);
for (const r of counts.rows)
	console.log(`  ${r.table.padEnd(16)} ${Number(r.n).toLocaleString('en')}`);
const first = made[0];
if (first) {
	console.log(
		`\nA store to sign in to: owner+s${first.s}@tallowcreek.example (the demo password), ${first.jobs} jobs`
	);
}
if (BIG) console.log(`The big store: owner+s${BIG_STORE}@tallowcreek.example`);
console.log(`DATABASE_URL=${appUrl}\nDATABASE_OWNER_URL=${ownerUrl}`);
