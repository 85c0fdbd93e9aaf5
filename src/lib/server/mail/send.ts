import { Resend } from 'resend';
import type { Mail } from './templates';

/** Resend refuses a client without a key; with the local fake on, this one is accepted by the fake. */
export const FAKE_RESEND_KEY = 're_local_fake';

/**
 * Sends one e-mail. With an idempotency key, sending the same e-mail again under the same key
 * (a task retried after its worker died mid-send) delivers it once.
 */
export type SendMail = (
	mail: Mail,
	options?: { idempotencyKey?: string }
) => Promise<{ id: string }>;

/**
 * Sends through the Resend SDK. With no real key the msw fake in `mocks/` answers instead of
 * Resend; the code path is the same.
 */
export function createMailer(options: { apiKey?: string; from: string }): SendMail {
	const resend = new Resend(options.apiKey || FAKE_RESEND_KEY);
	const address = /<([^>]+)>/.exec(options.from)?.[1] ?? options.from;
	return async (mail, sendOptions = {}) => {
		const from = mail.fromName
			? `${mail.fromName.replace(/[<>"\r\n]/g, '')} <${address}>`
			: options.from;
		const { data, error } = await resend.emails.send(
			{
				from,
				to: mail.to,
				subject: mail.subject,
				html: mail.html,
				text: mail.text,
				replyTo: mail.replyTo,
				// Resend takes a file's content as base64.
				attachments: mail.attachments?.map((a) => ({
					filename: a.filename,
					contentType: a.contentType,
					content: Buffer.from(a.content, 'utf8').toString('base64')
				}))
			},
			sendOptions.idempotencyKey ? { idempotencyKey: sendOptions.idempotencyKey } : undefined
		);
		if (error || !data)
			throw new Error(`E-mail to ${mail.to} failed: ${error?.message ?? 'no answer'}`);
		return { id: data.id };
	};
}
