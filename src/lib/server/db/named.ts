import { createHash } from 'node:crypto';

interface Preparable<R> {
	toSQL(): { sql: string };
	prepare(name: string): { execute(): Promise<R> };
}

/**
 * Runs a built query as a prepared statement named after its SQL text: each pooled connection
 * parses it once, and PostgreSQL may then keep one generic plan instead of planning the query
 * again on every request (the job list's joins took longer to plan than to run; bench/README.md).
 * Only for queries whose text comes from a bounded set of shapes, every value a parameter: each
 * distinct text stays prepared on each connection for the connection's life.
 */
export function runNamed<R>(query: Preparable<R>): Promise<R> {
	const name = `q_${createHash('sha1').update(query.toSQL().sql).digest('hex').slice(0, 24)}`;
	return query.prepare(name).execute();
}
