import { existsSync } from 'node:fs';
import path from 'node:path';
import { http, HttpResponse } from 'msw';
import { readOutbox, recordMessage } from './outbox';

/**
 * Switches for trying faults (tests/server/faults.spec.ts), read on every request: files in the
 * fake's data folder, so they exist only where the fake does (FLUSHLINE_FAKES=1), never in
 * production. `fake-mail-down`: the provider is down, every send answers 503. `fake-mail-hold`:
 * a send is taken (it is in the outbox) but its answer waits while the file is there, as a
 * provider that accepted a message and then lost the connection.
 */
export const MAIL_DOWN_FILE = 'fake-mail-down';
export const MAIL_HOLD_FILE = 'fake-mail-hold';
/** The longest a held answer waits (then it is given). */
const HOLD_MAX_MS = 10 * 60_000;

const base = () => (process.env.RESEND_BASE_URL ?? 'https://api.resend.com').replace(/\/$/, '');

/** Resend's error body (https://resend.com/docs/api-reference/errors). */
function failure(statusCode: number, name: string, message: string) {
	return HttpResponse.json({ statusCode, name, message }, { status: statusCode });
}

const asList = (v: unknown): string[] =>
	(Array.isArray(v) ? v : v ? [v] : []).map((x) => String(x));

/** Resend keeps an idempotency key for 24 hours. */
const KEY_HOURS = 24;

/** Handlers for the part of Resend's API the app uses: sending one e-mail. */
export function resendHandlers(dataDir: string) {
	return [
		http.post(`${base()}/emails`, async ({ request }) => {
			if (existsSync(path.join(dataDir, MAIL_DOWN_FILE))) {
				return failure(503, 'service_unavailable', 'The e-mail service is down (local fake).');
			}
			if (!request.headers.get('authorization')?.startsWith('Bearer ')) {
				return failure(401, 'missing_api_key', 'Missing API key in the authorization header.');
			}
			const body = (await request.json().catch(() => null)) as Record<string, unknown> | null;
			if (!body) return failure(422, 'validation_error', 'The body must be JSON.');
			const to = asList(body.to);
			for (const field of ['from', 'subject'] as const) {
				if (typeof body[field] !== 'string' || !body[field]) {
					return failure(422, 'validation_error', `The \`${field}\` field is required.`);
				}
			}
			if (to.length === 0) return failure(422, 'validation_error', 'The `to` field is required.');
			if (!body.html && !body.text) {
				return failure(422, 'validation_error', 'Either `html` or `text` must be provided.');
			}
			// The same key and message answer the first send again and send nothing; the same key
			// with another message is refused, as Resend does.
			const key = request.headers.get('idempotency-key');
			if (key) {
				const since = Date.now() - KEY_HOURS * 3_600_000;
				const first = readOutbox(dataDir).find(
					(m) => m.idempotencyKey === key && Date.parse(m.at) >= since
				);
				if (first && (first.subject !== body.subject || first.to.join() !== to.join())) {
					return failure(
						409,
						'invalid_idempotent_request',
						'Same idempotency key used with a different request payload.'
					);
				}
				if (first) return HttpResponse.json({ id: first.id });
			}
			const attachments = Array.isArray(body.attachments)
				? (body.attachments as Record<string, unknown>[]).map((a) => ({
						filename: String(a.filename ?? ''),
						contentType: String(a.content_type ?? 'application/octet-stream'),
						content: String(a.content ?? '')
					}))
				: [];
			if (attachments.some((a) => !a.filename || !a.content)) {
				return failure(422, 'validation_error', 'Each attachment needs a filename and content.');
			}
			const id = crypto.randomUUID();
			recordMessage(dataDir, {
				id,
				at: new Date().toISOString(),
				from: String(body.from),
				to,
				subject: String(body.subject),
				html: String(body.html ?? ''),
				text: String(body.text ?? ''),
				replyTo: body.reply_to ? asList(body.reply_to).join(', ') : null,
				...(key ? { idempotencyKey: key } : {}),
				...(attachments.length ? { attachments } : {})
			});
			const hold = path.join(dataDir, MAIL_HOLD_FILE);
			for (const until = Date.now() + HOLD_MAX_MS; existsSync(hold) && Date.now() < until;) {
				await new Promise((r) => setTimeout(r, 100));
			}
			return HttpResponse.json({ id });
		})
	];
}
