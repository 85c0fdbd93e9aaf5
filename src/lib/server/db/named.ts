import { createHash } from 'node:crypto';
import { sql, type AnyColumn, type Placeholder, type SQL } from 'drizzle-orm';
import { clientOf, type StoreTx } from './tenant';

type Values = Record<string, unknown>;

interface Prepared<R> {
	execute(values?: Values): Promise<R>;
}

interface Preparable<R> {
	toSQL(): { sql: string };
	prepare(name: string): Prepared<R>;
}

/** A prepared statement's name: from its SQL text, so one text is parsed once per connection. */
function nameOf(text: string): string {
	return `q_${createHash('sha1').update(text).digest('hex').slice(0, 24)}`;
}

/**
 * What drizzle's node-postgres prepared query keeps (drizzle-orm 0.45, `NodePgPreparedQuery`): its
 * text, and the two configs it hands pg on each run, read when it runs.
 */
interface BuiltQuery {
	queryString: string;
	rawQueryConfig: { name?: string };
	queryConfig: { name?: string };
}

/** A column's or an SQL expression's way from the driver's value to the row's (drizzle-orm 0.45). */
interface Decoder {
	mapFromDriverValue(value: unknown): unknown;
}

/**
 * What drizzle's prepared select keeps to map its rows (drizzle-orm 0.45, `NodePgPreparedQuery`):
 * each selected field with its path in the row object, and a mapper that, when set, maps the
 * driver's rows (arrays, in the fields' order) in its place.
 */
interface MappedQuery {
	fields?: { path: string[]; field: object }[];
	customResultMapper?: (rows: unknown[][]) => unknown;
}

/** The decoder drizzle's `mapResultRow` would use for a selected field: a column, SQL or alias. */
function decoderOf(field: object): Decoder | undefined {
	if (typeof (field as Partial<Decoder>).mapFromDriverValue === 'function') return field as Decoder;
	const own = (field as { decoder?: Decoder }).decoder;
	if (typeof own?.mapFromDriverValue === 'function') return own;
	const aliased = (field as { sql?: { decoder?: Decoder } }).sql?.decoder;
	if (typeof aliased?.mapFromDriverValue === 'function') return aliased;
	return undefined;
}

/**
 * Maps a prepared select's rows with one plain loop per row, each field's decoder found once when
 * the statement is built: drizzle's own `mapResultRow` finds every field's decoder again on every
 * row (a chain of `is` checks walking class prototypes) and walks each field's path with an
 * iterator, about a quarter of a millisecond for a page of 50 jobs (bench/README.md, "Rows mapped
 * once"). The same values: each field's own decoder, null kept as null. Only where every field sits
 * at the top of the row (no joined table's nested object, whose nulls drizzle folds into one null)
 * and drizzle has no mapper of its own; anything else keeps drizzle's.
 */
function mapRowsFlat(prepared: object): void {
	const q = prepared as MappedQuery;
	if (q.customResultMapper || !Array.isArray(q.fields) || !q.fields.length) return;
	const keys: string[] = [];
	const decoders: Decoder[] = [];
	for (const { path, field } of q.fields) {
		const decoder = decoderOf(field);
		if (path.length !== 1 || !decoder) return;
		keys.push(path[0]);
		decoders.push(decoder);
	}
	const width = keys.length;
	q.customResultMapper = (rows) =>
		rows.map((row) => {
			const out: Record<string, unknown> = {};
			for (let i = 0; i < width; i++) {
				const raw = row[i];
				out[keys[i]] = raw === null ? null : decoders[i].mapFromDriverValue(raw);
			}
			return out;
		});
}

function isBuilt(prepared: object): prepared is BuiltQuery {
	const p = prepared as Partial<BuiltQuery>;
	return (
		typeof p.queryString === 'string' &&
		typeof p.rawQueryConfig === 'object' &&
		typeof p.queryConfig === 'object'
	);
}

/**
 * Runs a built query as a prepared statement named after its SQL text: each pooled connection
 * parses it once, and PostgreSQL may then keep one generic plan instead of planning the query
 * again on every request (the job list's joins took longer to plan than to run; bench/README.md).
 * Only for queries whose text comes from a bounded set of shapes, every value a parameter: each
 * distinct text stays prepared on each connection for the connection's life. `values` fill the
 * query's placeholders (`sql.placeholder`), if it has any.
 *
 * The text is built once: prepared under a provisional name, then named after the text the
 * prepared query holds. (Asking for the text first and preparing after built it twice, which cost
 * the job page more of the server's time than the names saved PostgreSQL.) A drizzle that keeps
 * the text elsewhere gets the two builds, never an unnamed or misnamed statement.
 */
export function runNamed<R>(query: Preparable<R>, values?: Values): Promise<R> {
	const prepared = query.prepare('provisional');
	mapRowsFlat(prepared);
	if (!isBuilt(prepared)) return query.prepare(nameOf(query.toSQL().sql)).execute(values);
	const name = nameOf(prepared.queryString);
	prepared.rawQueryConfig.name = name;
	prepared.queryConfig.name = name;
	return prepared.execute(values);
}

/** Statements built once, by the shape that names them (a bounded set: SHAPE_LIMIT is a guard). */
const shapes = new Map<string, { name: string; prepared: Prepared<unknown> }>();
const SHAPE_LIMIT = 2000;
/** Under vitest every call builds its query again and checks that its shape's text is the same. */
const CHECK_SHAPES = process.env.VITEST !== undefined;

/**
 * Runs, in `tx`, the query that `build` makes, whose every changing value is a placeholder filled
 * from `values`, and whose SQL text `shape` alone decides: built and prepared by drizzle the first
 * time the shape is seen, then only run. Building a page of the job list took longer in the app
 * than running it in PostgreSQL (bench/README.md, "Built once"). Like `runNamed`, a prepared
 * statement named after its text. With `tx` null it runs on the pool, outside any store (a read
 * made before the store is known, such as the member's own); such a shape is built on `db`, and
 * always run with null.
 */
export function runShape<R>(
	tx: StoreTx | null,
	shape: string,
	build: () => Preparable<R>,
	values: Values
): Promise<R> {
	let kept = shapes.get(shape) as { name: string; prepared: Prepared<R> } | undefined;
	if (!kept) {
		const query = build();
		const name = nameOf(query.toSQL().sql);
		kept = { name, prepared: query.prepare(name) };
		mapRowsFlat(kept.prepared);
		if (shapes.size < SHAPE_LIMIT) shapes.set(shape, kept);
	} else if (CHECK_SHAPES && nameOf(build().toSQL().sql) !== kept.name) {
		throw new Error(`The shape "${shape}" names two different queries`);
	}
	if (!tx) return kept.prepared.execute(values);
	// drizzle's prepared query runs on the client it was first prepared on (`client`): this run's
	// copy of it runs on this transaction's client instead.
	const mine = Object.create(kept.prepared, { client: { value: clientOf(tx) } }) as Prepared<R>;
	return mine.execute(values);
}

/**
 * `column` is one of `ids`: one array parameter, so a statement kept by its text (`runShape`,
 * `runNamed`) has one text for any number of ids, where drizzle's `inArray` writes a parameter per
 * id. `ids` is the list itself or the placeholder standing for it.
 */
export function oneOf(column: AnyColumn, ids: string[] | Placeholder): SQL {
	return sql`${column} = any(${Array.isArray(ids) ? sql.param(ids) : ids}::text[])`;
}

/**
 * A `LIMIT` written into the statement's text, for a statement built once and kept (`runShape`):
 * with a limit that is a parameter PostgreSQL plans it again on every run (its generic plan prices
 * an unknown limit as a tenth of the table, so it is never kept; bench/README.md). drizzle's
 * `limit` is typed for a number or a placeholder, and writes a number as a parameter; it writes any
 * SQL it is given as it is, so the literal goes in as raw SQL under a placeholder's type. Only for
 * the code's own constants and closed sets: each value is another statement text.
 */
export function literalLimit(n: number): Placeholder {
	if (!Number.isSafeInteger(n) || n < 0) throw new Error(`Not a limit: ${n}`);
	return sql.raw(String(n)) as unknown as Placeholder;
}
