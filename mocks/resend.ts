import { http, HttpResponse } from 'msw';
import { recordMessage } from './outbox';

const base = () => (process.env.RESEND_BASE_URL ?? 'https://api.resend.com').replace(/\/$/, '');

/** Resend's error body (https://resend.com/docs/api-reference/errors). */
function failure(statusCode: number, name: string, message: string) {
	return HttpResponse.json({ statusCode, name, message }, { status: statusCode });
}

const asList = (v: unknown): string[] =>
	(Array.isArray(v) ? v : v ? [v] : []).map((x) => String(x));

/** Handlers for the part of Resend's API the app uses: sending one e-mail. */
export function resendHandlers(dataDir: string) {
	return [
		http.post(`${base()}/emails`, async ({ request }) => {
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
			const id = crypto.randomUUID();
			recordMessage(dataDir, {
				id,
				at: new Date().toISOString(),
				from: String(body.from),
				to,
				subject: String(body.subject),
				html: String(body.html ?? ''),
				text: String(body.text ?? ''),
				replyTo: body.reply_to ? asList(body.reply_to).join(', ') : null
			});
			return HttpResponse.json({ id });
		})
	];
}
