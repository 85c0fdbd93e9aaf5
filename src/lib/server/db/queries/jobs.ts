import {
	and,
	asc,
	count,
	desc,
	eq,
	getTableColumns,
	inArray,
	like,
	or,
	sql,
	type AnyColumn,
	type Placeholder,
	type SQL
} from 'drizzle-orm';
import { canDelete, canMove, JOB_STATUSES, type JobStatus } from '../../../jobs/status';
import type { JobListQuery } from '../../../schemas/job';
import { rolesThatCan } from '../../permissions';
import {
	booking,
	customer,
	job,
	jobEvent,
	jobNameTrigram,
	jobNumberCounter,
	jobTally,
	member,
	payment,
	quote,
	user
} from '../schema';
import { PgTimestamp } from 'drizzle-orm/pg-core';
import { literalLimit, oneOf, runNamed, runShape } from '../named';
import type { Plans, StoreTx, StoreWriteTx } from '../tenant';
import { jobScopeFilter, type JobScope } from './access';
import { likePattern } from './customers';

/** A job as the app reads and returns it: every column but the search's lower-case copies. */
export type Job = Omit<typeof job.$inferSelect, 'titleLower' | 'customerNameLower'>;

/** The columns of a `Job`, for the writes that return one. */
const { titleLower: _title, customerNameLower: _name, ...jobRecord } = getTableColumns(job);

/** Which of the store's jobs the reader sees: a member's `scope`, or `WHOLE_STORE`. */
export type JobViewer = JobScope;

const viewerFilter = jobScopeFilter;

/** The roles a job can be assigned to: those who work assigned jobs. */
const assignable = () => inArray(member.role, rolesThatCan({ assignedJob: ['report'] }));

const jobColumns = {
	id: job.id,
	number: job.number,
	title: job.title,
	status: job.status,
	customerId: job.customerId,
	// The job's copy of the name (migration 0017), the one the list sorts and searches by.
	customerName: job.customerName,
	// The job's copy of the phone (migration 0024): a page reads no customer row.
	customerPhone: job.customerPhone,
	siteId: job.siteId,
	installerId: job.installerId,
	installerName: sql<
		string | null
	>`(select u.name from "user" u where u.id = "job"."installer_id")`,
	salespersonId: job.salespersonId,
	salespersonName: sql<
		string | null
	>`(select u.name from "user" u where u.id = "job"."salesperson_id")`,
	notes: job.notes,
	statusChangedAt: job.statusChangedAt,
	updatedAt: job.updatedAt,
	createdAt: job.createdAt
};

/**
 * A job row as JSON text, written by PostgreSQL: the keys of `jobColumns` in their order, each
 * value as JSON.stringify writes the row that drizzle reads (a time as `Date#toISOString` writes it,
 * UTC to the millisecond; both cut the microseconds, neither rounds). For the API's list: a page of
 * 50 jobs read into objects, their times into `Date`s, and written out again cost the server
 * 0.6-0.9 ms more than the rows as text (bench/README.md, "The API's list written by
 * PostgreSQL"). `row_to_json` of a one-row subquery, not `json_build_object`, which writes a space
 * on each side of every colon (8% more to send). The keys are the code's own names.
 */
const jobJson = sql<string>`(select row_to_json(r)::text from (select ${sql.join(
	Object.entries(jobColumns).map(([key, field]) => {
		// A column drizzle reads into a `Date` (timestamps in the schema's default mode).
		const value =
			field instanceof PgTimestamp
				? sql`to_char(${field} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`
				: field;
		return sql`${value} as ${sql.identifier(key)}`;
	}),
	sql`, `
)}) r)`;

/**
 * How the list hands over its rows: `objects` (for the app's pages), or `json`, each row as the
 * JSON text of the same object (`jobJson`), for an answer that is JSON anyway.
 */
export type RowForm = 'objects' | 'json';
type RowOf<F extends RowForm> = F extends 'json' ? string : JobRow;

const rowFields = (form: RowForm) => (form === 'json' ? { json: jobJson } : jobColumns);

/** The rows a select of `rowFields(form)` read, in the form's own shape. */
function rowsIn(form: RowForm, read: unknown[]): JobRow[] | string[] {
	return form === 'json' ? (read as { json: string }[]).map((r) => r.json) : (read as JobRow[]);
}

// Every sort is on `job` alone: the customer's name is the job's copy of it (migration 0017).
const sortColumns = {
	number: job.number,
	status: job.status,
	updated: job.updatedAt,
	customer: job.customerName
} as const;

/**
 * The job columns every view uses, with the customer's name and phone (the job's copies) and the
 * people's names. The names are looked up per row (a subquery each, written out in full: drizzle
 * leaves out the table's name when a query reads one table, and the lookups' own columns would
 * then be taken for `job`'s), not joined: the planner then has one table to order, not three, and
 * a page of the list planned in under half the time (bench/README.md); the lookups run for the
 * page's rows only.
 */
function selectJobs(tx: StoreTx) {
	return tx.select(jobColumns).from(job);
}

/** `selectJobs`, or its rows as JSON text (`RowForm`). */
function selectRows(tx: StoreTx, form: RowForm) {
	return tx.select(rowFields(form)).from(job);
}

/**
 * How far a job list counts: past this many (beyond the page's start) it says "1,000+" rather
 * than read every matching index entry of a large store. Also how many matches the search
 * function (below) hands over by id; more than that and the search filters as the list walks.
 */
export const COUNT_CAP = 1000;

/**
 * How many of the list's rows, in its order, a search tests before it asks the trigram indexes.
 * A common text fills a page within them (tested as the list walks, the cheapest way to find a
 * page when matches are many); a rare one does not, and is then found through the indexes.
 */
export const SEARCH_WINDOW = 2000;

/**
 * The status as a literal, not a parameter: each status has its own partial indexes (migration
 * 0017), and a prepared statement's generic plan cannot use a partial index whose predicate
 * depends on a parameter, so PostgreSQL planned the list's page again on every request and
 * counted through the wrong index (bench/README.md). One statement text per status: a closed set.
 */
export function statusIs(status: JobStatus, column: AnyColumn = job.status): SQL {
	if (!JOB_STATUSES.includes(status)) throw new Error(`Not a job status: ${status}`);
	return sql`${column} = ${sql.raw(`'${status}'`)}`;
}

/**
 * The page sizes a first page's `LIMIT` is written for as a literal: the list's own (25), the API's
 * common ones. A limit that is a parameter makes PostgreSQL plan the page again on every run (its
 * generic plan prices an unknown limit as a tenth of the table, so it is never kept): 0.25 ms of
 * planning for 0.43 ms of running, where a literal limit keeps one generic plan per connection
 * (bench/README.md). A closed set, so each shape has at most this many statement texts; any other
 * size stays a parameter.
 */
const LITERAL_PAGE_SIZES: readonly number[] = [10, 20, 25, 50, 100];

/** A first page's `LIMIT`, and what it adds to the statement's shape. */
function pageLimit(pageSize: number): { limit: Placeholder; shape: string } {
	if (!LITERAL_PAGE_SIZES.includes(pageSize))
		return { limit: sql.placeholder('pageSize'), shape: 'n' };
	return { limit: literalLimit(pageSize), shape: String(pageSize) };
}

/**
 * A page with how many jobs there are, `matches` counted or known: exact up to COUNT_CAP past the
 * page's start, then capped.
 */
function counted(rows: JobRow[] | string[], matches: number, offset: number): Page {
	const upTo = offset + COUNT_CAP;
	return { rows, total: Math.min(matches, upTo), totalCapped: matches > upTo };
}

/**
 * How many jobs the list holds, read from the store's tally (migration 0020) instead of counted:
 * for a list that nothing but the viewer, the status and the salesperson narrows (the tally's
 * keys); undefined for any other. Its values are the list's placeholders.
 */
function tallyOf(tx: StoreTx, viewer: JobViewer, query: ListQuery) {
	if (query.customerId || (viewer.kind !== 'store' && viewer.kind !== 'sold')) return undefined;
	const where = [eq(jobTally.organizationId, sql.placeholder('store'))];
	if (viewer.kind === 'sold') where.push(eq(jobTally.salespersonId, sql.placeholder('viewer')));
	if (query.salespersonId) where.push(eq(jobTally.salespersonId, sql.placeholder('salesperson')));
	if (query.status) where.push(statusIs(query.status, jobTally.status));
	return tx
		.select({ n: sql<number>`coalesce(sum(${jobTally.jobs}), 0)::int`.as('n') })
		.from(jobTally)
		.where(and(...where));
}

type ListQuery = JobListQuery & { customerId?: string; salespersonId?: string };
type Page<R = JobRow | string> = { rows: R[]; total: number; totalCapped: boolean };

/**
 * How the reads of a list (`list`, alone in its transaction) are best planned (readInStore's
 * `plans`). A page of the whole store's list, not searched, is read knowing its total from the
 * tally: a first page in one statement, a later one in two (the tally, then the page). For the big
 * store of the scale seed PostgreSQL priced the plans for its own id (100,000 jobs) below the
 * generic ones, and so planned these again on every run (0.3-0.5 ms), though the generic plans
 * read the same indexes the same way, made once per connection (bench/README.md, "Generic plans
 * for the whole store's list"). Other lists keep PostgreSQL's own choice: a search's functions
 * and an installer's own jobs planned worse generic.
 */
export function listPlans(query: ListQuery, viewer: JobViewer): Plans | undefined {
	const wholeStore =
		viewer.kind === 'store' && !query.q && !query.customerId && !query.salespersonId;
	return wholeStore ? 'generic' : undefined;
}

/**
 * A page of the store's jobs as the viewer may see them, and how many there are. Not searched, and
 * narrowed by nothing but the viewer's scope, the status and the salesperson, the total is the
 * store's tally (exact, never capped). Otherwise it is exact up to COUNT_CAP past the page's start,
 * then `totalCapped` says there are more than `total`. A search
 * that finds a page among the list's first SEARCH_WINDOW rows says only that more match than
 * the page shows (`total` is then the page's end, capped). The rows come in `form` (`RowForm`).
 */
export async function list<F extends RowForm = 'objects'>(
	tx: StoreTx,
	query: ListQuery,
	viewer: JobViewer,
	form: F = 'objects' as F
): Promise<Page<RowOf<F>>> {
	return (await listIn(tx, query, viewer, form)) as Page<RowOf<F>>;
}

async function listIn(
	tx: StoreTx,
	query: ListQuery,
	viewer: JobViewer,
	form: RowForm
): Promise<Page> {
	// Every value a placeholder, filled from `values`; `shape` names what the statement's text
	// depends on (the rows' form, which filters, the status, the order), so a first page is built
	// once per shape (runShape).
	const values: Record<string, unknown> = { store: tx.storeId };
	const shape: string[] = [form, viewer.kind, query.sort, query.dir, query.status ?? ''];
	const filters = [
		eq(job.organizationId, sql.placeholder('store')),
		viewerFilter(viewer, sql.placeholder('viewer'))
	];
	if (viewer.kind === 'sold' || viewer.kind === 'assigned') values.viewer = viewer.userId;
	if (query.status) filters.push(statusIs(query.status));
	if (query.customerId) {
		filters.push(eq(job.customerId, sql.placeholder('customer')));
		values.customer = query.customerId;
		shape.push('customer');
	}
	if (query.salespersonId) {
		filters.push(eq(job.salespersonId, sql.placeholder('salesperson')));
		values.salesperson = query.salespersonId;
		shape.push('salesperson');
	}
	const order = query.dir === 'asc' ? asc : desc;
	const sortColumn = sortColumns[query.sort];
	const orderBy = [order(sortColumn), desc(job.number)];
	const offset = (query.page - 1) * query.pageSize;
	// Whether anything but the search narrows the store's jobs (viewerFilter is undefined for all).
	const narrowed = filters.length > 2 || viewer.kind !== 'store';
	if (!query.q) {
		const tally = tallyOf(tx, viewer, query);
		if (tally) {
			const reversed = [(order === asc ? desc : asc)(sortColumn), asc(job.number)];
			// Only the whole store's list is read near its ends in one go (`nearPage`): narrowed by
			// a status or a person, the planner, not knowing how many rows the page skips, read all of
			// them through a bitmap and sorted them (bench/README.md, "Later pages near an end").
			return talliedPage(
				tx,
				and(...filters),
				{ orderBy, reversed, nearEnds: !narrowed },
				offset,
				query.pageSize,
				{
					values,
					shape: shape.join(' '),
					tally,
					form
				}
			);
		}
		return pageOf(tx, and(...filters), orderBy, offset, query.pageSize, values, {
			shape: shape.join(' '),
			form
		});
	}

	const pattern = likePattern(query.q);
	const asNumber = /^j?-?(\d{1,9})$/i.exec(query.q)?.[1];
	values.pattern = pattern;
	if (asNumber) {
		values.number = Number(asNumber);
		shape.push('number');
	}
	// Wildcards in the text are taken literally (likePattern); the number is a job's number. What
	// `ilike` finds, in a UTF-8 database: the title's and the name's kept lower case (migration
	// 0027) against the pattern lowered by PostgreSQL's own `lower`, once, not each row's text
	// lowered again on every test (bench/README.md, "The search's text tested in lower case").
	const lowered = sql`(select lower(${sql.placeholder('pattern')}))`;
	const found = or(
		like(job.titleLower, lowered),
		like(job.customerNameLower, lowered),
		asNumber ? eq(job.number, sql.placeholder('number')) : undefined
	) as SQL;

	// Sorted by customer, the store's whole list: the names holding the searched text's rarest
	// trigram are walked in name order, each name's jobs tested (migration 0019), so a page is found
	// after a few names wherever the matches sit in the order. Where the walk does not apply, or
	// reads too far, the steps below. Only for plain ASCII, where pg_trgm's and `ilike`'s lower case
	// cannot differ.
	const byNames = query.sort === 'customer' && !narrowed && !asNumber && offset <= 10_000;
	if (byNames && /^[\x20-\x7e]+$/.test(query.q)) {
		const first = await firstNamePage(tx, query.q, found, query.dir === 'desc', offset, {
			pageSize: query.pageSize,
			order: `${query.sort} ${query.dir}`,
			form,
			values
		});
		if (first) return { rows: first, total: offset + query.pageSize, totalCapped: true };
		const walked = await walkedPage(tx, query.q, pattern, query.dir === 'desc', offset, {
			pageSize: query.pageSize,
			orderBy,
			order: `${query.sort} ${query.dir}`,
			form
		});
		if (walked) {
			if (walked.matches === null)
				return { rows: walked.rows, total: offset + query.pageSize, totalCapped: true };
			return counted(walked.rows, walked.matches, offset);
		}
	}

	// 1. The list's first SEARCH_WINDOW rows in its order, tested row by row: a page and one more
	// match among them is the page, and says that more match (not how many: counting them would
	// read on through the store). Sorted by customer too, when the walk above did not apply. The
	// window is named `job`, so the list's columns and order read its rows as they would the
	// table's: a page's rows are tested and written in one pass, not found and then read again by
	// id (bench/README.md, "The search's window read once").
	if (offset + query.pageSize < SEARCH_WINDOW) {
		const read = await runShape(
			tx,
			`window ${shape.join(' ')}`,
			() => {
				const window = tx
					.select()
					.from(job)
					.where(and(...filters))
					.orderBy(...orderBy)
					.limit(SEARCH_WINDOW)
					.as('job');
				return tx
					.select(rowFields(form))
					.from(window)
					.where(found)
					.orderBy(...orderBy)
					.limit(sql.placeholder('limit'))
					.offset(sql.placeholder('offset'));
			},
			{ ...values, limit: query.pageSize + 1, offset }
		);
		const rows = rowsIn(form, read);
		if (rows.length > query.pageSize) {
			return {
				rows: rows.slice(0, query.pageSize),
				total: offset + query.pageSize,
				totalCapped: true
			};
		}
	}

	// 2. Sorted by customer, matches that the walk did not reach sit together in name order (all of a
	// matching customer's jobs), far from the start: the trigram indexes find them all, and the
	// function sorts them and hands over one page of ids with how many there are (migration 0017).
	if (byNames) {
		const page = await tx.execute<{ id: string; matches: string }>(
			sql`select s.id, s.matches from job_search_by_customer(${pattern}, ${query.dir === 'desc'}, ${query.pageSize}, ${offset}) as s`
		);
		const ids = page.rows.map((r) => r.id);
		const rows = await readIds(tx, ids, orderBy, `${query.sort} ${query.dir}`, form);
		// No row on a page past the end says nothing of how many there are: counted below.
		if (rows.length || !offset) {
			return counted(rows, Number(page.rows[0]?.matches ?? 0), offset);
		}
	}

	// 3. Few matches there: the search function reads the trigram indexes (row-level security keeps
	// `ilike` from being an index condition for the app's role; migration 0016). Up to COUNT_CAP
	// matches, the list reads them by primary key and knows how many there are.
	const ids = (
		await tx.execute<{ id: string }>(
			sql`select s.id from job_search_ids(${pattern}, ${COUNT_CAP + 1}) as s(id)`
		)
	).rows.map((r) => r.id);
	if (ids.length <= COUNT_CAP) {
		const byIds = or(
			oneOf(job.id, ids),
			asNumber ? eq(job.number, Number(asNumber)) : undefined
		) as SQL;
		// The number may be one more job: then it is counted.
		const known = narrowed || asNumber ? undefined : ids.length;
		return pageOf(tx, and(...filters, byIds), orderBy, offset, query.pageSize, values, {
			knows: known,
			form
		});
	}
	// 4. More than COUNT_CAP, though not among the list's first rows: tested as the list walks on.
	const where = and(...filters, found);
	const known = !narrowed && offset === 0 ? COUNT_CAP + 1 : undefined;
	return pageOf(tx, where, orderBy, offset, query.pageSize, values, { knows: known, form });
}

/**
 * The jobs of `ids` (a page found by a search function) with their people, in the list's order
 * (`order`, the sort and direction it is built from, names the statement's shape), in `form`.
 */
async function readIds(tx: StoreTx, ids: string[], orderBy: SQL[], order: string, form: RowForm) {
	if (!ids.length) return [];
	const read = await runShape(
		tx,
		`${form} ids ${order}`,
		() =>
			selectRows(tx, form)
				.where(
					and(
						eq(job.organizationId, sql.placeholder('store')),
						oneOf(job.id, sql.placeholder('ids'))
					)
				)
				.orderBy(...orderBy),
		{ store: tx.storeId, ids }
	);
	return rowsIn(form, read);
}

/**
 * How many jobs the walk of names (`job_search_by_name_page`, migrations 0019 and 0028) may read
 * before it gives up and every match is read and sorted instead: in the big store of the scale
 * seed, a text whose names hold 3,700 jobs and none matching took 14 ms to walk, against 26 ms to
 * find through the trigram indexes that nothing matches (bench/README.md).
 */
export const WALK_BUDGET = 5000;

/**
 * Sorted by customer, a page of a search that lies among the matching jobs of the first name the
 * walk (`walkedPage`) would read: the first name, in the list's order, of those holding the
 * searched text's rarest trigram. Every job that matches holds that trigram, so no name before it
 * has a match, and when its own newest WALK_BUDGET jobs hold the page and one more match, they are
 * the page, in the name's order (newest number first). A common text ("oak", a customer's name)
 * is found so, in one plain statement read as the list's window is (bench/README.md, "The first
 * name's page"): plpgsql's walk cost PostgreSQL more, the more requests ran at once. Undefined
 * when the name holds fewer: the walk then reads on from it.
 */
async function firstNamePage(
	tx: StoreTx,
	words: string,
	found: SQL,
	descending: boolean,
	offset: number,
	{
		pageSize,
		order,
		form,
		values
	}: { pageSize: number; order: string; form: RowForm; values: Record<string, unknown> }
): Promise<JobRow[] | string[] | undefined> {
	const read = await runShape(
		tx,
		`${form} first name ${order}`,
		() => {
			const store = sql.placeholder('store');
			// The inner trigrams of the text (pg_trgm's, without a word's padded ends), the one with
			// the fewest names first, each counted on the index to 2,001 at most: as the walk chooses.
			const rarest = sql`(select c.t from (select t from unnest(show_trgm(${sql.placeholder('words')})) t where strpos(t, ' ') = 0 limit 24) c order by (select count(*) from (select 1 from ${jobNameTrigram} k where k.organization_id = ${store} and k.trigram = c.t limit 2001) x), c.t limit 1)`;
			const name = sql`(select n.customer_name from ${jobNameTrigram} n where n.organization_id = ${store} and n.trigram = ${rarest} order by n.customer_name ${sql.raw(descending ? 'desc' : 'asc')} limit 1)`;
			// Ordered by number alone: the name is one, and the planner then reads the name's index
			// in order and stops at the page (with the name in the order too, it sorts them all).
			const window = tx
				.select()
				.from(job)
				.where(and(eq(job.organizationId, store), eq(job.customerName, name)))
				.orderBy(desc(job.number))
				.limit(sql.placeholder('budget'))
				.as('job');
			return tx
				.select(rowFields(form))
				.from(window)
				.where(found)
				.orderBy(desc(job.number))
				.limit(sql.placeholder('limit'))
				.offset(sql.placeholder('offset'));
		},
		{ ...values, words, budget: WALK_BUDGET, limit: pageSize + 1, offset }
	);
	const rows = rowsIn(form, read);
	return rows.length > pageSize ? (rows.slice(0, pageSize) as JobRow[] | string[]) : undefined;
}

/**
 * Sorted by customer, a page of a search found by walking the names that hold the searched text's
 * rarest trigram, in name order (migrations 0019 and 0028): the page's rows in `form`, and how many
 * match in all when the walk read every candidate (null: at least the page and one more). Undefined
 * when the walk does not apply (the text has no trigram inside a word) or read more than
 * WALK_BUDGET jobs. For plain ASCII only, as `firstNamePage` (the caller checks). One
 * statement: the walk's one row joined to the jobs it hands over, read as the list's `job` (none
 * when it found none or gave up), in the list's `orderBy` (`order` names the statement's shape).
 */
async function walkedPage(
	tx: StoreTx,
	words: string,
	pattern: string,
	descending: boolean,
	offset: number,
	{
		pageSize,
		orderBy,
		order,
		form
	}: { pageSize: number; orderBy: SQL[]; order: string; form: RowForm }
): Promise<{ rows: JobRow[] | string[]; matches: number | null } | undefined> {
	const read = await runShape(
		tx,
		`${form} walk ${order}`,
		() => {
			// The walk's one row joined to the jobs it hands over, named `job` for the list's
			// columns and order: the page's jobs as the function read them, not read again by id.
			const page = tx
				.$with('job', {
					walked: sql<boolean>`walked`.as('walked'),
					matches: sql<number | null>`matches`.as('matches')
				})
				.as(
					sql`select w.walked, w.matches, j.* from job_search_by_name_page(${sql.placeholder('words')}, ${sql.placeholder('pattern')}, ${sql.placeholder('descending')}, ${sql.placeholder('lim')}, ${sql.placeholder('skip')}, ${sql.placeholder('budget')}) as w left join lateral unnest(w.jobs[1:${sql.placeholder('pageSize')}]) as j on true`
				);
			return tx
				.with(page)
				.select({
					...rowFields(form),
					walked: page.walked,
					matches: page.matches,
					found: sql<boolean>`${job.id} is not null`
				})
				.from(page)
				.orderBy(...orderBy);
		},
		{
			words,
			pattern,
			descending,
			lim: pageSize + 1,
			skip: offset,
			budget: WALK_BUDGET,
			pageSize
		}
	);
	if (!read[0]?.walked) return undefined;
	const rows = read
		.filter((r) => r.found)
		.map(({ walked: _, matches: __, found: ___, ...row }) => row);
	return { rows: rowsIn(form, rows), matches: read[0].matches };
}

/**
 * A tallied list's order, the same order reversed (read from the far end), and whether a later page
 * near an end is read with its tally in one statement (`nearPage`).
 */
type TalliedOrder = { orderBy: SQL[]; reversed: SQL[]; nearEnds?: boolean };
/** A tallied list's statement values and shape, its tally, and the rows' form. */
type TalliedRead = { values: Record<string, unknown>; shape: string; tally: Tally; form: RowForm };

/**
 * How many rows a later page of a tallied list may skip by reading them: within that many of either
 * end of the list, a page is read with its tally in one statement (`nearPage`). Deeper in, the
 * skipped rows are counted on the index alone (`laterPage`), which costs a second statement and a
 * look-up of each of the page's rows by number (bench/README.md, "Later pages near an end").
 */
const NEAR_SKIP = 500;

/**
 * A later page of a tallied list in one statement: the tally, and the page read from the end of the
 * order it lies nearer to, when it skips at most NEAR_SKIP rows from there. Its rows, none when it
 * lies deeper (or past the end), and the tally's total.
 */
async function nearPage(
	tx: StoreTx,
	where: SQL | undefined,
	{ orderBy, reversed }: TalliedOrder,
	offset: number,
	pageSize: number,
	{ values, shape, tally, form }: TalliedRead
): Promise<{ rows: JobRow[] | string[]; total: number }> {
	const read = await runShape(
		tx,
		`near ${shape}`,
		() => {
			const skip = sql`${sql.placeholder('offset')}::int`;
			const size = sql`${sql.placeholder('pageSize')}::int`;
			const near = sql`${sql.placeholder('near')}::int`;
			const chosen = where ?? sql`true`;
			// One branch or none reads: from the far end past the middle, else from the start. From
			// the far end the page is the rows between `total - offset - pageSize` and
			// `total - offset` in the reversed order (fewer on the last page).
			const fromEnd = sql`select * from ${job} where ${chosen} and 2 * ${skip} > t.n and t.n - ${skip} - ${size} <= ${near} order by ${sql.join(reversed, sql`, `)} limit greatest(0, least(${size}, t.n - ${skip})) offset greatest(0, t.n - ${skip} - ${size})`;
			const fromStart = sql`select * from ${job} where ${chosen} and 2 * ${skip} <= t.n and ${skip} <= ${near} order by ${sql.join(orderBy, sql`, `)} limit ${size} offset ${skip}`;
			// Named `job`, so the list's columns and order read the page's rows as they would the
			// table's (as the search's window is).
			const page = tx
				.$with('job', { total: sql<number>`total`.as('total') })
				.as(
					sql`select t.n as total, j.* from (${tally}) t left join lateral ((${fromEnd}) union all (${fromStart})) j on true`
				);
			return tx
				.with(page)
				.select({
					...rowFields(form),
					total: page.total,
					found: sql<boolean>`${job.id} is not null`
				})
				.from(page)
				.orderBy(...orderBy);
		},
		{ ...values, offset, pageSize, near: NEAR_SKIP }
	);
	const rows = read.filter((r) => r.found).map(({ total: _, found: __, ...row }) => row);
	return { rows: rowsIn(form, rows), total: Number(read[0]?.total ?? 0) };
}

/**
 * The page of the jobs `where` selects when the store's tally (`tally`, migration 0020) says how
 * many there are: exactly, without counting. A page past the middle is read from the far end of the
 * order (`reversed`, the same index read backwards), so it skips what lies after it rather than
 * what lies before: the last page but one of 100,000 jobs skips 50 entries, not 99,900. A first
 * page, and (for the whole store's list, `nearEnds`) a later one that skips at most NEAR_SKIP rows
 * from its end of the list, are read with the tally in one statement (`nearPage`); any other later
 * page reads the tally, then the page.
 */
async function talliedPage(
	tx: StoreTx,
	where: SQL | undefined,
	{ orderBy, reversed, nearEnds }: TalliedOrder,
	offset: number,
	pageSize: number,
	{ values, shape, tally, form }: TalliedRead
): Promise<Page> {
	if (!offset) {
		const first = await firstPage(tx, where, orderBy, pageSize, sql`(${tally})`, values, {
			shape: `tallied ${shape}`,
			form
		});
		return { rows: first.rows, total: first.matches, totalCapped: false };
	}
	let total: number;
	if (nearEnds) {
		const near = await nearPage(tx, where, { orderBy, reversed }, offset, pageSize, {
			values,
			shape,
			tally,
			form
		});
		total = near.total;
		if (near.rows.length) return { rows: near.rows, total, totalCapped: false };
	} else {
		[{ n: total }] = await runShape(tx, `tally ${shape}`, () => tally, values);
	}
	if (offset >= total) return { rows: [], total, totalCapped: false };
	const rows =
		offset * 2 > total
			? await laterPage(
					tx,
					where,
					{ skipOrder: reversed, orderBy },
					Math.min(pageSize, total - offset),
					Math.max(0, total - offset - pageSize),
					values,
					{ shape: `from the end ${shape}`, form }
				)
			: await laterPage(tx, where, { skipOrder: orderBy, orderBy }, pageSize, offset, values, {
					shape: `later ${shape}`,
					form
				});
	return { rows, total, totalCapped: false };
}

/**
 * A first page in the list's order, and `matches` (an uncorrelated subquery, so it runs once, not
 * per row) in the same statement: one round trip for the page and how many there are. Built once
 * per `shape` when there is one (runShape), which then names the rows' `form` too.
 */
async function firstPage(
	tx: StoreTx,
	where: SQL | undefined,
	orderBy: SQL[],
	pageSize: number,
	matches: SQL,
	values: Record<string, unknown>,
	{ shape, form }: { shape?: string; form: RowForm }
): Promise<{ rows: JobRow[] | string[]; matches: number }> {
	const { limit, shape: sized } = pageLimit(pageSize);
	const build = () =>
		tx
			.select({ ...rowFields(form), matches: sql<number>`${matches}` })
			.from(job)
			.where(where)
			.orderBy(...orderBy)
			.limit(limit);
	const all = { ...values, pageSize };
	const found = shape
		? await runShape(tx, `${shape} ${sized}`, build, all)
		: await runNamed(build(), all);
	return {
		rows: rowsIn(
			form,
			found.map(({ matches: _, ...row }) => row)
		),
		matches: found[0]?.matches ?? 0
	};
}

/**
 * A later page: `limit` rows after `skip` in `skipOrder`, skipped on `job` alone, then read with
 * their people for the page's rows only (not for every row skipped), in the list's `orderBy`. It
 * skips by the job's number, not its id: the number is unique in the store and ends the indexes of
 * the sorts by number, last change and customer, so the skipping reads the index alone, not the
 * rows (a page 5,000 into the big store's sold jobs: 42 ms by id, 1.2 ms by number;
 * bench/README.md). Built once per `shape` when there is one (runShape), which then names the
 * rows' `form` too.
 */
async function laterPage(
	tx: StoreTx,
	where: SQL | undefined,
	{ skipOrder, orderBy }: { skipOrder: SQL[]; orderBy: SQL[] },
	limit: number,
	skip: number,
	values: Record<string, unknown>,
	{ shape, form }: { shape?: string; form: RowForm }
): Promise<JobRow[] | string[]> {
	const build = () =>
		selectRows(tx, form)
			.where(
				and(
					eq(job.organizationId, sql.placeholder('store')),
					inArray(
						job.number,
						tx
							.select({ number: job.number })
							.from(job)
							.where(where)
							.orderBy(...skipOrder)
							.limit(sql.placeholder('limit'))
							.offset(sql.placeholder('skip'))
					)
				)
			)
			.orderBy(...orderBy);
	const all = { ...values, limit, skip };
	return rowsIn(form, shape ? await runShape(tx, shape, build, all) : await runNamed(build(), all));
}

type Tally = NonNullable<ReturnType<typeof tallyOf>>;

/**
 * The page of the jobs `where` selects, and how many there are (up to COUNT_CAP past the page's
 * start): counted, unless the caller already `knows` how many.
 */
async function pageOf(
	tx: StoreTx,
	where: SQL | undefined,
	orderBy: SQL[],
	offset: number,
	pageSize: number,
	values: Record<string, unknown>,
	{ shape, knows, form }: { shape?: string; knows?: number; form: RowForm }
): Promise<Page> {
	const upTo = offset + COUNT_CAP;
	// A first page that is to be counted: the page and its count in one statement (one round trip
	// fewer on every list). Every job has its store's customer (`job_customer_same_store_fk`), so
	// the count reads `job` alone, and only as far as `upTo`: an exact count of 100,000 jobs reads
	// 100,000 index entries.
	if (!offset && knows === undefined) {
		const first = await firstPage(
			tx,
			where,
			orderBy,
			pageSize,
			sql`(select count(*)::int from (select 1 from ${job} where ${where} limit ${sql.raw(String(COUNT_CAP + 1))}) counted)`,
			values,
			{ shape: shape && `first ${shape}`, form }
		);
		return counted(first.rows, first.matches, offset);
	}
	const rows = offset
		? await laterPage(tx, where, { skipOrder: orderBy, orderBy }, pageSize, offset, values, {
				form
			})
		: rowsIn(
				form,
				await runNamed(
					selectRows(tx, form)
						.where(where)
						.orderBy(...orderBy)
						.limit(pageSize),
					values
				)
			);
	if (knows !== undefined) return counted(rows, knows, offset);
	const capped = tx
		.select({ one: sql`1`.as('one') })
		.from(job)
		.where(where)
		.limit(upTo + 1)
		.as('counted');
	const [{ n }] = await runNamed(tx.select({ n: count() }).from(capped), values);
	return counted(rows, n, offset);
}

export type JobRow = Awaited<ReturnType<ReturnType<typeof selectJobs>['execute']>>[number];

/** One job with its people as the viewer may see it: undefined when not the store's or not theirs. */
export async function readForViewer(tx: StoreTx, id: string, viewer: JobViewer) {
	// One statement per kind of scope; the member it names is a value.
	const user = viewer.kind === 'sold' || viewer.kind === 'assigned' ? viewer.userId : null;
	const [row] = await runShape(
		tx,
		`jobs.readForViewer.${viewer.kind}`,
		() =>
			selectJobs(tx).where(
				and(
					eq(job.organizationId, sql.placeholder('store')),
					eq(job.id, sql.placeholder('id')),
					viewerFilter(viewer, sql.placeholder('user'))
				)
			),
		user === null ? { store: tx.storeId, id } : { store: tx.storeId, id, user }
	);
	return row;
}

/**
 * One job of the store with its people, whoever asks: for workflows and the customer's link,
 * which are not a member looking. Undefined when it is not the store's.
 */
export async function readForStore(tx: StoreTx, id: string) {
	const [row] = await selectJobs(tx).where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)));
	return row;
}

/** The version the job's customer links are signed with (see `job.link_version`). */
export async function linkVersion(tx: StoreTx, id: string): Promise<number | undefined> {
	const [row] = await tx
		.select({ v: job.linkVersion })
		.from(job)
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)));
	return row?.v;
}

/** Raises the job's link version: every customer link made before stops working. */
export async function raiseLinkVersion(tx: StoreWriteTx, id: string): Promise<number | undefined> {
	const [row] = await tx
		.update(job)
		.set({ linkVersion: sql`${job.linkVersion} + 1`, updatedAt: new Date() })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.returning({ v: job.linkVersion });
	return row?.v;
}

/** Whether the job has a live (not cancelled) booking on the schedule. */
export async function isBooked(tx: StoreTx, id: string): Promise<boolean> {
	const [row] = await tx
		.select({ id: booking.id })
		.from(booking)
		.where(
			and(
				eq(booking.organizationId, tx.storeId),
				eq(booking.jobId, id),
				sql`${booking.cancelledAt} is null`
			)
		)
		.limit(1);
	return Boolean(row);
}

/**
 * Checks the store's tally of jobs (migration 0020) against counting its jobs, and mends it when
 * they differ: nothing in the app writes `job` with its triggers off, so a difference means a
 * write from outside (a copy or a restore done by hand). Mending holds back writes to `job` (every
 * store's, for as long as one store's count takes: tens of milliseconds for 100,000 jobs) so that
 * no change falls between the count and the tally. Returns whether it mended anything.
 */
export async function mendTally(tx: StoreWriteTx): Promise<boolean> {
	const differs = sql`select 1 from (
			select status, salesperson_id, jobs from ${jobTally}
			where organization_id = ${tx.storeId} and jobs <> 0
		) t full join (
			select status, coalesce(salesperson_id, '') as salesperson_id, count(*)::int as jobs
			from ${job} where organization_id = ${tx.storeId} group by 1, 2
		) c using (status, salesperson_id)
		where t.jobs is distinct from c.jobs limit 1`;
	if (!(await tx.execute(differs)).rows.length) return false;
	await tx.execute(sql`lock table ${job} in share mode`);
	if (!(await tx.execute(differs)).rows.length) return false;
	// The migration's own count (run as the app, under the store policy: this store's rows only).
	await tx.execute(sql`select job_tally_fill(${tx.storeId})`);
	return true;
}

/** The first number a store gives (shown as J-1001). */
const FIRST_JOB_NUMBER = 1001;

/**
 * Creates a draft job for a customer of the same store. Returns undefined when the customer is
 * not the store's. Numbers are per store and never given twice (see `jobNumberCounter`).
 */
export async function create(
	tx: StoreWriteTx,
	input: { customerId: string; title: string; notes?: string },
	actorId: string
): Promise<Job | undefined> {
	const [owner] = await tx
		.select({ id: customer.id })
		.from(customer)
		.where(and(eq(customer.organizationId, tx.storeId), eq(customer.id, input.customerId)));
	if (!owner) return undefined;
	// The store's counter row, locked by the upsert until this transaction ends: never a number
	// given before, even to a job since deleted.
	const [{ number }] = await tx
		.insert(jobNumberCounter)
		.values({ organizationId: tx.storeId, lastNumber: FIRST_JOB_NUMBER })
		.onConflictDoUpdate({
			target: jobNumberCounter.organizationId,
			set: { lastNumber: sql`${jobNumberCounter.lastNumber} + 1` }
		})
		.returning({ number: jobNumberCounter.lastNumber });
	const [row] = await tx
		.insert(job)
		.values({
			organizationId: tx.storeId,
			number,
			customerId: input.customerId,
			title: input.title,
			notes: input.notes ?? '',
			salespersonId: actorId
		})
		.returning(jobRecord);
	await tx.insert(jobEvent).values({
		organizationId: tx.storeId,
		jobId: row.id,
		kind: 'created',
		toStatus: row.status,
		actorId
	});
	return row;
}

export async function update(
	tx: StoreWriteTx,
	id: string,
	input: { title?: string; notes?: string }
): Promise<Job | undefined> {
	const [row] = await tx
		.update(job)
		.set({ ...input, updatedAt: new Date() })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.returning(jobRecord);
	return row;
}

/** A job's status, its row locked until the transaction ends; undefined when not the store's. */
export async function lockStatus(tx: StoreWriteTx, id: string) {
	const [row] = await tx
		.select({ status: job.status })
		.from(job)
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.for('update');
	return row?.status;
}

export type MoveResult =
	| { ok: true; job: Job }
	| { ok: false; reason: 'not_found' }
	| { ok: false; reason: 'not_allowed'; from: JobStatus };

/**
 * Moves a job to another status when the state machine allows it, recording who and why. The
 * row is locked for the check, so two people moving the same job cannot both succeed.
 */
export async function move(
	tx: StoreWriteTx,
	id: string,
	to: JobStatus,
	actorId: string | null,
	note = ''
): Promise<MoveResult> {
	const from = await lockStatus(tx, id);
	if (!from) return { ok: false, reason: 'not_found' };
	if (!canMove(from, to)) return { ok: false, reason: 'not_allowed', from };
	const now = new Date();
	const [row] = await tx
		.update(job)
		.set({ status: to, statusChangedAt: now, updatedAt: now })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.returning(jobRecord);
	await tx.insert(jobEvent).values({
		organizationId: tx.storeId,
		jobId: id,
		kind: 'status',
		fromStatus: from,
		toStatus: to,
		actorId,
		note
	});
	return { ok: true, job: row };
}

/** The store's members with the installer role, for assigning jobs. */
export async function listInstallers(tx: StoreTx) {
	return runShape(
		tx,
		'jobs.listInstallers',
		() =>
			tx
				.select({ id: user.id, name: user.name, email: user.email })
				.from(member)
				.innerJoin(user, eq(user.id, member.userId))
				.where(and(eq(member.organizationId, sql.placeholder('store')), assignable()))
				.orderBy(asc(user.name)),
		{ store: tx.storeId }
	);
}

export type AssignResult = 'assigned' | 'not_found' | 'not_an_installer';

/** Assigns (or, with null, unassigns) an installer who is a member of the same store. */
export async function assign(
	tx: StoreWriteTx,
	id: string,
	installerId: string | null,
	actorId: string
): Promise<AssignResult> {
	if (installerId) {
		const [m] = await tx
			.select({ id: member.id })
			.from(member)
			.where(
				and(eq(member.organizationId, tx.storeId), eq(member.userId, installerId), assignable())
			);
		if (!m) return 'not_an_installer';
	}
	const updated = await tx
		.update(job)
		.set({ installerId, updatedAt: new Date() })
		.where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)))
		.returning({ id: job.id });
	if (!updated.length) return 'not_found';
	await tx.insert(jobEvent).values({
		organizationId: tx.storeId,
		jobId: id,
		kind: 'assigned',
		actorId,
		note: installerId ?? ''
	});
	return 'assigned';
}

/**
 * Deletes a job that may still be deleted (see `canDelete`) and has no quote and no money on it;
 * others are kept for their history and are cancelled instead (sent quotes are kept for good).
 */
export async function remove(
	tx: StoreWriteTx,
	id: string
): Promise<'deleted' | 'not_found' | 'not_draft'> {
	const status = await lockStatus(tx, id);
	if (!status) return 'not_found';
	if (!canDelete(status)) return 'not_draft';
	const [{ quotes }] = await tx
		.select({ quotes: count() })
		.from(quote)
		.where(and(eq(quote.organizationId, tx.storeId), eq(quote.jobId, id)));
	const [{ payments }] = await tx
		.select({ payments: count() })
		.from(payment)
		.where(and(eq(payment.organizationId, tx.storeId), eq(payment.jobId, id)));
	if (quotes > 0 || payments > 0) return 'not_draft';
	await tx.delete(job).where(and(eq(job.organizationId, tx.storeId), eq(job.id, id)));
	return 'deleted';
}

/** A job's history, newest first, with who did each step. */
export async function events(tx: StoreTx, jobId: string) {
	return runShape(
		tx,
		'jobs.events',
		() =>
			tx
				.select({
					id: jobEvent.id,
					kind: jobEvent.kind,
					fromStatus: jobEvent.fromStatus,
					toStatus: jobEvent.toStatus,
					note: jobEvent.note,
					createdAt: jobEvent.createdAt,
					actorName: user.name
				})
				.from(jobEvent)
				.leftJoin(user, eq(user.id, jobEvent.actorId))
				.where(
					and(
						eq(jobEvent.organizationId, sql.placeholder('store')),
						eq(jobEvent.jobId, sql.placeholder('job'))
					)
				)
				.orderBy(desc(jobEvent.createdAt), desc(sql`${jobEvent.id}`)),
		{ store: tx.storeId, job: jobId }
	);
}
