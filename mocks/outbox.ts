import { appendFileSync, existsSync, mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';

/** One message the e-mail fake accepted. */
export interface OutboxMessage {
	id: string;
	at: string;
	from: string;
	to: string[];
	subject: string;
	html: string;
	text: string;
	replyTo: string | null;
	/** The `Idempotency-Key` it was sent with, if any: the same key sends nothing twice. */
	idempotencyKey?: string;
	/** Files sent with it, as Resend takes them (content in base64). */
	attachments?: { filename: string; contentType: string; content: string }[];
}

/** An attachment's content as text (calendar files and other text types). */
export function attachmentText(attachment: { content: string }): string {
	return Buffer.from(attachment.content, 'base64').toString('utf8');
}

/** Messages are kept as JSON lines in the data folder, so a restart keeps them. */
function file(dataDir: string) {
	return path.join(dataDir, 'outbox.jsonl');
}

export function recordMessage(dataDir: string, message: OutboxMessage) {
	mkdirSync(dataDir, { recursive: true });
	appendFileSync(file(dataDir), `${JSON.stringify(message)}\n`);
}

/** Every message, newest first. */
export function readOutbox(dataDir: string): OutboxMessage[] {
	if (!existsSync(file(dataDir))) return [];
	return readFileSync(file(dataDir), 'utf8')
		.split('\n')
		.filter(Boolean)
		.map((line) => JSON.parse(line) as OutboxMessage)
		.reverse();
}

/** The links in a message's HTML, in order, without repeats. */
export function linksOf(message: Pick<OutboxMessage, 'html'>): string[] {
	const found = [...message.html.matchAll(/href="([^"]+)"/g)].map((m) =>
		m[1].replace(/&amp;/g, '&')
	);
	return [...new Set(found)];
}
