// Which database errors are "try again" (503) and which are faults (500): connection failures,
// PostgreSQL shutting down or starting, and pg's own words for a dead connection, also when
// drizzle or better-auth wrap them; never a refused row or a bad query.
import { isHttpError } from '@sveltejs/kit';
import { describe, expect, it } from 'vitest';
import { databaseUnavailable, isDatabaseUnavailable } from './unavailable';

const withCode = (code: string, message = 'failed') => Object.assign(new Error(message), { code });

describe('isDatabaseUnavailable', () => {
	it('knows a database that is down, restarting or full', () => {
		for (const e of [
			withCode('ECONNREFUSED', 'connect ECONNREFUSED 127.0.0.1:5432'),
			withCode('ECONNRESET'),
			withCode('57P01', 'terminating connection due to administrator command'),
			withCode('57P03', 'the database system is starting up'),
			withCode('53300', 'sorry, too many clients already'),
			withCode('08006', 'connection failure'),
			new Error('Connection terminated unexpectedly'),
			new Error('Client has encountered a connection error and is not queryable'),
			new Error('timeout exceeded when trying to connect')
		]) {
			expect(isDatabaseUnavailable(e), String(e)).toBe(true);
		}
	});

	it('looks through the errors that wrap the driver’s', () => {
		const driver = withCode('57P01', 'terminating connection due to administrator command');
		const drizzle = new Error('Failed query: insert into "job" …', { cause: driver });
		expect(isDatabaseUnavailable(new Error('outer', { cause: drizzle }))).toBe(true);
	});

	it('leaves faults of the query or the code alone', () => {
		for (const e of [
			withCode('23505', 'duplicate key value violates unique constraint'),
			withCode('23514', 'new row violates check constraint'),
			withCode('42P01', 'relation "nope" does not exist'),
			new TypeError('Cannot read properties of undefined'),
			'a string',
			null,
			undefined
		]) {
			expect(isDatabaseUnavailable(e), String(e)).toBe(false);
		}
	});

	it('is answered 503 with a message that says to try again', () => {
		let thrown: unknown;
		try {
			databaseUnavailable();
		} catch (e) {
			thrown = e;
		}
		expect(isHttpError(thrown, 503)).toBe(true);
		expect((thrown as { body: { message: string } }).body.message).toMatch(/try again/);
	});
});
