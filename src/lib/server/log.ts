import { AsyncLocalStorage } from 'node:async_hooks';
import pino from 'pino';

/**
 * The server's one structured logger: JSON lines on stdout, each carrying the request id of the
 * request it belongs to (set by the `handleRequestId` hook through `withRequestId`). Import `log`
 * and write `log.info({ jobId }, 'quote sent')`; never log an e-mail address, a phone number, a
 * token or a whole URL: log `safePath(url)` instead.
 *
 * `LOG_LEVEL` sets the level (`info` by default; `silent` under vitest unless set).
 */

const context = new AsyncLocalStorage<{ requestId: string }>();

/** Runs `work` with `requestId` attached to every log line written while it runs. */
export function withRequestId<T>(requestId: string, work: () => T): T {
	return context.run({ requestId }, work);
}

/** The id of the request being handled, or undefined outside one. */
export function currentRequestId(): string | undefined {
	return context.getStore()?.requestId;
}

/** Field names whose values are personal data or secrets, wherever they appear in a log object. */
const PERSONAL = ['email', 'phone', 'password', 'token', 'cookie', 'authorization'];

/** A logger with Flushline's options (request id, redaction), writing to `destination` or stdout. */
export function createLogger(destination?: pino.DestinationStream, level?: string) {
	return pino(
		{
			level: level ?? (process.env.LOG_LEVEL || (process.env.VITEST ? 'silent' : 'info')),
			base: { service: 'flushline' },
			timestamp: pino.stdTimeFunctions.isoTime,
			formatters: { level: (label) => ({ level: label }) },
			mixin: () => {
				const requestId = currentRequestId();
				return requestId ? { requestId } : {};
			},
			redact: {
				paths: [...PERSONAL, ...PERSONAL.map((k) => `*.${k}`), 'headers', '*.headers'],
				censor: '[redacted]'
			}
		},
		destination
	);
}

export const log = createLogger();

/** Query parameters whose values say nothing about a person, kept as they are in logs. */
const PLAIN_PARAMS = new Set([
	'page',
	'pageSize',
	'sort',
	'dir',
	'status',
	'section',
	'from',
	'to',
	'tab',
	'reset',
	'paid',
	'type',
	'event'
]);

/** Path segments after these are link secrets (a customer link, an invitation). */
const SECRET_SEGMENT_AFTER = new Set(['c', 'invite']);

const EMAIL_LIKE = /[^/\s@]+@[^/\s@]+/g;
const PHONE_LIKE = /\+?\d[\d ().-]{6,}\d/g;

/**
 * A URL as it may be logged: the path with link secrets and anything like an e-mail address or
 * a phone number masked, and the query with the value of every parameter not known to be plain
 * replaced, so `/api/v1/customers?q=ada@example.com` logs as `/api/v1/customers?q=[redacted]`.
 */
export function safePath(url: URL): string {
	const segments = url.pathname.split('/');
	const path = segments
		.map((segment, i) => {
			if (i === 2 && SECRET_SEGMENT_AFTER.has(segments[1])) return '[redacted]';
			return segment.replace(EMAIL_LIKE, '[redacted]').replace(PHONE_LIKE, '[redacted]');
		})
		.join('/');
	if (!url.search) return path;
	const parts: string[] = [];
	for (const [key, value] of url.searchParams) {
		const plain = PLAIN_PARAMS.has(key) && !/@/.test(value);
		parts.push(`${encodeURIComponent(key)}=${plain ? encodeURIComponent(value) : '[redacted]'}`);
		if (parts.length >= 20) break;
	}
	return `${path}?${parts.join('&')}`;
}
