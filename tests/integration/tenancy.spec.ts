// The second wall: PostgreSQL row-level security on every domain table, beneath the queries'
// own organization_id filter.
import { inStore } from '$lib/server/db/tenant';
import * as jobs from '$lib/server/db/queries/jobs';
import { pool } from '$lib/server/db';
import { saveProfile } from '$lib/server/db/queries/stores';
import type { PoolClient } from 'pg';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeCustomer, makeJob, makeStore, type TestStore } from './factories';
import { makeFieldWork } from './field-factories';

/** better-auth's own tables: it reads them without a store, and checks membership in code. */
const AUTH_TABLES = new Set(['member', 'invitation']);

async function domainTables(): Promise<string[]> {
	const { rows } = await pool.query<{ table_name: string }>(
		`select table_name from information_schema.columns
		 where table_schema = 'public' and column_name = 'organization_id' order by table_name`
	);
	return rows.map((r) => r.table_name).filter((t) => !AUTH_TABLES.has(t));
}

/** Runs `work` on one connection inside a transaction with app.store_id set to `storeId`. */
async function asStore<T>(storeId: string | null, work: (c: PoolClient) => Promise<T>) {
	const client = await pool.connect();
	try {
		await client.query('begin');
		if (storeId) await client.query(`select set_config('app.store_id', $1, true)`, [storeId]);
		return await work(client);
	} finally {
		await client.query('rollback');
		client.release();
	}
}

let a: TestStore;
let b: TestStore;

beforeAll(async () => {
	a = await makeStore('Alpha Floors');
	b = await makeStore('Beta Floors');
	for (const store of [a, b]) {
		await inStore(store.id, (tx) =>
			saveProfile(tx, { address: '1 Test Row', town: 'Testville', phone: '', email: '' })
		);
		// A row in every domain table: settings, price book, customer, site, job and its history,
		// measure, quote, payment, refund, Stripe event, the e-mail tasks, the copy of Stripe activity,
		// and the installer's half (profile, time off, booking, report, items, photo, change order,
		// completion, statement and lines).
		await makeFieldWork(store);
	}
});

describe('row-level security', () => {
	it('is on and forced, with a store policy, for every table that carries a store id', async () => {
		const tables = await domainTables();
		expect(tables).toEqual(
			expect.arrayContaining(['customer', 'job', 'job_event', 'store_profile'])
		);
		const { rows } = await pool.query<{
			relname: string;
			relrowsecurity: boolean;
			relforcerowsecurity: boolean;
			policies: number;
		}>(
			`select c.relname, c.relrowsecurity, c.relforcerowsecurity,
			        (select count(*)::int from pg_policy p where p.polrelid = c.oid) as policies
			 from pg_class c where c.relnamespace = 'public'::regnamespace and c.relname = any($1)`,
			[tables]
		);
		expect(rows).toHaveLength(tables.length);
		for (const row of rows) {
			expect(row, row.relname).toMatchObject({ relrowsecurity: true, relforcerowsecurity: true });
			expect(row.policies, row.relname).toBeGreaterThan(0);
		}
	});

	it("shows store A none of store B's rows in any domain table, even with no filter", async () => {
		for (const table of await domainTables()) {
			const counts = await asStore(a.id, async (c) => {
				const all = await c.query(`select organization_id from "${table}"`);
				return {
					total: all.rowCount,
					ofB: all.rows.filter((r) => r.organization_id === b.id).length,
					ofA: all.rows.filter((r) => r.organization_id === a.id).length
				};
			});
			expect(counts.ofB, table).toBe(0);
			expect(counts.total, table).toBe(counts.ofA);
			expect(
				counts.ofA,
				`${table} should have rows of A to make the check mean something`
			).toBeGreaterThan(0);
		}
	});

	it('shows nothing at all to a query outside a store transaction', async () => {
		for (const table of await domainTables()) {
			const { rowCount } = await asStore(null, (c) => c.query(`select 1 from "${table}"`));
			expect(rowCount, table).toBe(0);
		}
	});

	it("refuses writing a row into store B from store A's transaction", async () => {
		await expect(
			asStore(a.id, (c) =>
				c.query(
					`insert into customer (id, organization_id, name) values (gen_random_uuid(), $1, 'Sneaky')`,
					[b.id]
				)
			)
		).rejects.toThrow(/row-level security/);
	});

	it("changes and deletes none of store B's rows from store A's transaction", async () => {
		const target = await makeCustomer(b.id, 'Beta customer');
		const result = await asStore(a.id, async (c) => {
			const updated = await c.query(`update customer set name = 'Changed' where id = $1`, [
				target.id
			]);
			const deleted = await c.query(`delete from customer where id = $1`, [target.id]);
			return { updated: updated.rowCount, deleted: deleted.rowCount };
		});
		expect(result).toEqual({ updated: 0, deleted: 0 });
		const still = await asStore(b.id, (c) =>
			c.query(`select name from customer where id = $1`, [target.id])
		);
		expect(still.rows).toEqual([{ name: 'Beta customer' }]);
	});

	it("refuses a job of store A that points at store B's customer, at the database", async () => {
		const foreign = await makeCustomer(b.id);
		await expect(
			asStore(a.id, (c) =>
				c.query(
					`insert into job (id, organization_id, number, customer_id, title) values (gen_random_uuid(), $1, 999999, $2, 'x')`,
					[a.id, foreign.id]
				)
			)
		).rejects.toThrow(/job_customer_same_store_fk/);
	});

	it('connects as a role that is neither superuser, table owner, nor exempt from row security', async () => {
		const { rows } = await pool.query<{ rolsuper: boolean; rolbypassrls: boolean; owns: number }>(
			`select r.rolsuper, r.rolbypassrls,
			        (select count(*)::int from pg_tables t where t.schemaname = 'public' and t.tableowner = current_user) as owns
			 from pg_roles r where r.rolname = current_user`
		);
		expect(rows[0]).toEqual({ rolsuper: false, rolbypassrls: false, owns: 0 });
	});
});

// The job search (migration 0016) runs as `flushline_search`, which reads every store's job titles
// and customer names through a policy of its own, so the trigram indexes can be used. What keeps it
// to one store is the function itself: these are its walls.
describe('the job search function', () => {
	let aOak: { job: string; byName: string };
	let bOak: { job: string; byName: string };

	beforeAll(async () => {
		const oaks = async (store: TestStore) => {
			const plain = await makeCustomer(store.id, `Plain ${store.name}`);
			const named = await makeCustomer(store.id, `Oakhurst of ${store.name}`);
			const title = await makeJob(store.id, store.owner.id, plain.id);
			const byName = await makeJob(store.id, store.owner.id, named.id);
			await inStore(store.id, (tx) => jobs.update(tx, title.id, { title: 'Living room oak' }));
			return { job: title.id, byName: byName.id };
		};
		aOak = await oaks(a);
		bOak = await oaks(b);
	});

	const search = (c: PoolClient, pattern: string, cap = 1001) =>
		c
			.query<{ id: string }>(`select s.id from job_search_ids($1, $2) as s(id)`, [pattern, cap])
			.then((r) => r.rows.map((row) => row.id).sort());

	it("finds the store's jobs by title or by customer's name, never another store's", async () => {
		expect(await asStore(a.id, (c) => search(c, '%oak%'))).toEqual([aOak.job, aOak.byName].sort());
		expect(await asStore(b.id, (c) => search(c, '%oak%'))).toEqual([bOak.job, bOak.byName].sort());
		// Every job of every store matches '%': still only the store's own.
		const all = await asStore(a.id, (c) => search(c, '%', 10001));
		const ofA = await asStore(a.id, (c) => c.query<{ id: string }>(`select id from job`));
		expect(all).toEqual(ofA.rows.map((r) => r.id).sort());
		expect(all).not.toContain(bOak.job);
	});

	it('refuses to run outside a store transaction, or with an empty store', async () => {
		await expect(asStore(null, (c) => search(c, '%oak%'))).rejects.toThrow(/app\.store_id/);
		await expect(
			asStore(null, async (c) => {
				await c.query(`select set_config('app.store_id', '', true)`);
				return search(c, '%oak%');
			})
		).rejects.toThrow(/app\.store_id/);
	});

	it('takes the store only from the setting: an unknown store finds nothing', async () => {
		expect(await asStore('no-such-store', (c) => search(c, '%'))).toEqual([]);
	});

	it('keeps to its bounds: a cap of 1 to 10001 and a pattern of at most 400 characters', async () => {
		expect(await asStore(a.id, (c) => search(c, '%', 1))).toHaveLength(1);
		await expect(asStore(a.id, (c) => search(c, '%', 0))).rejects.toThrow(/cap/);
		await expect(asStore(a.id, (c) => search(c, '%', 10002))).rejects.toThrow(/cap/);
		await expect(asStore(a.id, (c) => search(c, 'x'.repeat(401)))).rejects.toThrow(/pattern/);
	});

	it('runs as a role that cannot log in, skips no row security, and the app cannot become', async () => {
		const { rows } = await pool.query(
			`select p.prosecdef, pg_get_userbyid(p.proowner) as owner, r.rolcanlogin, r.rolbypassrls,
			        r.rolsuper, pg_has_role(current_user, r.oid, 'member') as app_is_member,
			        (select count(*)::int from pg_tables t where t.tableowner = r.rolname) as owns
			 from pg_proc p join pg_roles r on r.oid = p.proowner
			 where p.proname in ('job_search_ids', 'job_search_by_customer', 'customer_search_ids')`
		);
		expect(rows).toHaveLength(3);
		expect(rows).toEqual(
			Array(3).fill({
				prosecdef: true,
				owner: 'flushline_search',
				rolcanlogin: false,
				rolbypassrls: false,
				rolsuper: false,
				app_is_member: false,
				owns: 0
			})
		);
		await expect(asStore(a.id, (c) => c.query(`set role flushline_search`))).rejects.toThrow(
			/permission denied/
		);
	});

	it("gives its role nothing to write, and nothing to read but the searched columns and names' trigrams", async () => {
		const { rows } = await pool.query<{ col: string }>(
			`select c.relname || '.' || a.attname as col
			 from pg_class c join pg_attribute a on a.attrelid = c.oid
			 where c.relnamespace = 'public'::regnamespace and c.relkind = 'r' and a.attnum > 0
			   and not a.attisdropped
			   and has_column_privilege('flushline_search', c.oid, a.attnum, 'select, insert, update')
			 order by 1`
		);
		const writes = await pool.query(
			`select c.relname from pg_class c where c.relnamespace = 'public'::regnamespace
			   and c.relkind = 'r' and has_table_privilege('flushline_search', c.oid, 'insert, update, delete, truncate')`
		);
		expect(writes.rows).toEqual([]);
		expect(rows.map((r) => r.col)).toEqual([
			'customer.email',
			'customer.id',
			'customer.name',
			'customer.organization_id',
			'customer.phone',
			'job.customer_name',
			'job.id',
			'job.number',
			'job.organization_id',
			'job.title',
			'job_name_trigram.customer_name',
			'job_name_trigram.organization_id',
			'job_name_trigram.trigram'
		]);
	});

	const byCustomer = (c: PoolClient, pattern: string, lim = 50, skip = 0) =>
		c
			.query<{ id: string; matches: string }>(
				`select s.id, s.matches from job_search_by_customer($1, false, $2, $3) as s`,
				[pattern, lim, skip]
			)
			.then((r) => r.rows.map((row) => ({ id: row.id, matches: Number(row.matches) })));

	it("sorted by customer, gives a page of the store's own matches and how many, never another's", async () => {
		// "Oakhurst of …" sorts before "Plain …": the customer's name first, then the title's match.
		expect(await asStore(a.id, (c) => byCustomer(c, '%oak%'))).toEqual([
			{ id: aOak.byName, matches: 2 },
			{ id: aOak.job, matches: 2 }
		]);
		expect(await asStore(b.id, (c) => byCustomer(c, '%oak%', 1, 1))).toEqual([
			{ id: bOak.job, matches: 2 }
		]);
		const ofA = await asStore(a.id, (c) => c.query<{ id: string }>(`select id from job`));
		// Every job of every store matches '%': still only the store's own, and counted as such.
		const all = await asStore(a.id, (c) => byCustomer(c, '%', 101));
		const own = new Set(ofA.rows.map((r) => r.id));
		expect(all).toHaveLength(Math.min(101, own.size));
		expect(all.every((r) => own.has(r.id) && r.matches === own.size)).toBe(true);
		expect(await asStore('no-such-store', (c) => byCustomer(c, '%'))).toEqual([]);
	});

	it('sorted by customer, refuses to run outside a store or beyond its bounds', async () => {
		await expect(asStore(null, (c) => byCustomer(c, '%oak%'))).rejects.toThrow(/app\.store_id/);
		await expect(asStore(a.id, (c) => byCustomer(c, '%', 0))).rejects.toThrow(/page/);
		await expect(asStore(a.id, (c) => byCustomer(c, '%', 102))).rejects.toThrow(/page/);
		await expect(asStore(a.id, (c) => byCustomer(c, '%', 10, -1))).rejects.toThrow(/start/);
		await expect(asStore(a.id, (c) => byCustomer(c, '%', 10, 10001))).rejects.toThrow(/start/);
		await expect(asStore(a.id, (c) => byCustomer(c, 'x'.repeat(401)))).rejects.toThrow(/pattern/);
		const { rows } = await pool.query(
			`select p.prosecdef, pg_get_userbyid(p.proowner) as owner from pg_proc p
			 where p.proname = 'job_search_by_customer'`
		);
		expect(rows).toEqual([{ prosecdef: true, owner: 'flushline_search' }]);
	});

	// The walk of names (migration 0028) hands over whole jobs, so it runs as its caller, under the
	// store's row security, not as the search role.
	const walkPage = (c: PoolClient, words: string, lim = 10, skip = 0, budget = 5000) =>
		c
			.query<{ ids: string[]; walked: boolean; matches: number | null }>(
				`select array(select (x).id from unnest(w.jobs) x) as ids, w.walked, w.matches
				 from job_search_by_name_page($1, '%' || $1 || '%', false, $2, $3, $4) as w`,
				[words, lim, skip, budget]
			)
			.then((r) => r.rows[0]);

	it("walking names, hands over the store's own matching jobs, never another's", async () => {
		expect(await asStore(a.id, (c) => walkPage(c, 'oak'))).toEqual({
			ids: [aOak.byName, aOak.job],
			walked: true,
			matches: 2
		});
		// A full page says only that at least that many match.
		expect(await asStore(b.id, (c) => walkPage(c, 'oak', 1, 1))).toEqual({
			ids: [bOak.job],
			walked: true,
			matches: null
		});
		expect(await asStore('no-such-store', (c) => walkPage(c, 'oak'))).toEqual({
			ids: [],
			walked: true,
			matches: 0
		});
		const { rows } = await pool.query(
			`select p.prosecdef, pg_get_userbyid(p.proowner) <> 'flushline_search' as not_search
			 from pg_proc p where p.proname = 'job_search_by_name_page'`
		);
		expect(rows).toEqual([{ prosecdef: false, not_search: true }]);
	});

	it('walking names, refuses to run outside a store or beyond its bounds', async () => {
		await expect(asStore(null, (c) => walkPage(c, 'oak'))).rejects.toThrow(/app\.store_id/);
		await expect(asStore(a.id, (c) => walkPage(c, 'oak', 0))).rejects.toThrow(/page/);
		await expect(asStore(a.id, (c) => walkPage(c, 'oak', 102))).rejects.toThrow(/page/);
		await expect(asStore(a.id, (c) => walkPage(c, 'oak', 10, -1))).rejects.toThrow(/start/);
		await expect(asStore(a.id, (c) => walkPage(c, 'oak', 10, 10001))).rejects.toThrow(/start/);
		await expect(asStore(a.id, (c) => walkPage(c, 'oak', 10, 0, 0))).rejects.toThrow(/budget/);
		await expect(asStore(a.id, (c) => walkPage(c, 'o'.repeat(201)))).rejects.toThrow(/text/);
	});
});

// The customers search (migration 0021) runs as the same role, reading every store's customers'
// names, e-mails and phones through its policy: the function's walls keep it to one store.
describe('the customers search function', () => {
	const search = (c: PoolClient, pattern: string, cap = 1001) =>
		c
			.query<{ id: string }>(`select s.id from customer_search_ids($1, $2) as s(id)`, [
				pattern,
				cap
			])
			.then((r) => r.rows.map((row) => row.id).sort());
	let aWren: string;
	let bWren: string;

	beforeAll(async () => {
		aWren = (await makeCustomer(a.id, 'Wrenfield of Alpha')).id;
		bWren = (await makeCustomer(b.id, 'Wrenfield of Beta')).id;
	});

	it("finds the store's own customers, never another store's", async () => {
		expect(await asStore(a.id, (c) => search(c, '%wrenfield%'))).toEqual([aWren]);
		expect(await asStore(b.id, (c) => search(c, '%wrenfield%'))).toEqual([bWren]);
		const all = await asStore(a.id, (c) => search(c, '%', 10001));
		const ofA = await asStore(a.id, (c) => c.query<{ id: string }>(`select id from customer`));
		expect(all).toEqual(ofA.rows.map((r) => r.id).sort());
		expect(all).not.toContain(bWren);
		expect(await asStore('no-such-store', (c) => search(c, '%'))).toEqual([]);
	});

	it('refuses to run outside a store transaction or beyond its bounds', async () => {
		await expect(asStore(null, (c) => search(c, '%wren%'))).rejects.toThrow(/app\.store_id/);
		await expect(asStore(a.id, (c) => search(c, '%', 0))).rejects.toThrow(/cap/);
		await expect(asStore(a.id, (c) => search(c, '%', 10002))).rejects.toThrow(/cap/);
		await expect(asStore(a.id, (c) => search(c, 'x'.repeat(401)))).rejects.toThrow(/pattern/);
	});

	// Migration 0026: a written customer's entries go straight into the trigram indexes, never to a
	// pending list that makes the planner turn from them until a vacuum.
	it('reads through trigram indexes that keep no pending list', async () => {
		const { rows } = await pool.query<{ relname: string; reloptions: string[] | null }>(
			`select c.relname, c.reloptions from pg_class c
			 where c.relname in ('customer_organization_name_trgm_idx',
			   'customer_organization_email_trgm_idx', 'customer_organization_phone_trgm_idx')
			 order by c.relname`
		);
		expect(rows.map((r) => r.relname)).toHaveLength(3);
		for (const row of rows) expect(row.reloptions).toContain('fastupdate=off');
	});
});
