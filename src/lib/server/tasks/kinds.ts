import { z } from 'zod';

/**
 * The kinds of task: what each carries, how often and how far apart it is tried, and whether it
 * is recorded in the store's `task` table (so a manager sees it fail and can send it again).
 * A new side effect is a new kind here and a handler in ./handlers.ts.
 */

/** The queue every task goes through (made by migration 0007, with the rest of pg-boss). */
export const TASK_QUEUE = 'tasks';
/** Where pg-boss puts a task whose retries are spent, or whose last worker died on it. */
export const DEAD_QUEUE = 'tasks-dead';

/** What e-mails are for, for the people of the store. */
export const MAIL_PURPOSES = {
	quote: 'Quote',
	'quote-link': 'Quote link sent again',
	'customer-answer': 'Customer’s answer, to the salesperson',
	receipt: 'Receipt',
	'paid-notice': 'Payment notice, to the salesperson',
	refund: 'Refund notice',
	'change-order': 'Change order, to the customer',
	'change-order-answer': 'Customer’s answer to a change order, to the store',
	'balance-request': 'Balance due, to the customer',
	invitation: 'Invitation',
	booking: 'Install dates',
	'booking-cancelled': 'Install dates cancelled',
	'password-reset': 'Password reset'
} as const;
export type MailPurpose = keyof typeof MAIL_PURPOSES;

const text = (max: number) => z.string().max(max);

/** One rendered e-mail, as `$lib/server/mail/templates` makes it. */
export const mailPayload = z.object({
	purpose: z.enum(Object.keys(MAIL_PURPOSES) as [MailPurpose, ...MailPurpose[]]),
	mail: z.object({
		to: text(320).min(3),
		subject: text(300),
		html: text(200_000),
		text: text(100_000),
		fromName: text(200).optional(),
		replyTo: text(320).optional(),
		attachments: z
			.array(
				z.object({
					filename: text(200).min(1),
					contentType: text(100).min(1),
					content: text(100_000)
				})
			)
			.max(5)
			.optional()
	})
});

export interface Retry {
	/** Attempts after the first one. */
	limit: number;
	/** Seconds before the first retry; doubled (with jitter) for each one after, by pg-boss. */
	delaySeconds: number;
}

interface KindDefinition<P extends z.ZodType> {
	payload: P;
	retry: Retry;
	/** How long one attempt may run before it counts as failed (a worker that died on it). */
	expireInSeconds: number;
	/** Kept in the store's `task` table, for managers to see and send again. */
	recorded: boolean;
}

const kind = <P extends z.ZodType>(d: KindDefinition<P>) => d;

export const TASK_KINDS = {
	/** An e-mail, rendered in the transaction of the change it tells of. */
	mail: kind({
		payload: mailPayload,
		// About 30 s, 1, 2, 4, 8 and 16 minutes apart: half an hour of a provider being down.
		retry: { limit: 6, delaySeconds: 30 },
		// A send takes seconds; an attempt still running after a minute is taken for dead and
		// tried again (under the same idempotency key, so a message is never sent twice).
		expireInSeconds: 60,
		recorded: true
	}),
	/** Brings the store's Stripe charges, refunds and payouts into its tables. */
	'stripe.sync': kind({
		payload: z.object({}),
		retry: { limit: 2, delaySeconds: 60 },
		expireInSeconds: 600,
		recorded: false
	}),
	/**
	 * An hour after a photo's files were written: removes them unless a photo row names them (the
	 * server died, or its transaction failed, between the files and the row). Queued in a
	 * transaction of its own before the files are written, so no file outlives both.
	 */
	'photo.files': kind({
		payload: z.object({
			clientId: z.string().min(1).max(100),
			fileKey: z.string().min(1).max(300),
			thumbKey: z.string().min(1).max(300)
		}),
		retry: { limit: 3, delaySeconds: 300 },
		expireInSeconds: 120,
		recorded: false
	}),
	/** Every half hour: asks for the work that is due by the clock (each store's Stripe sync). */
	periodic: kind({
		payload: z.object({}),
		retry: { limit: 0, delaySeconds: 0 },
		expireInSeconds: 600,
		recorded: false
	})
} as const;

export type TaskKind = keyof typeof TASK_KINDS;
export type TaskPayload<K extends TaskKind> = z.input<(typeof TASK_KINDS)[K]['payload']>;

export function isTaskKind(value: unknown): value is TaskKind {
	return typeof value === 'string' && Object.hasOwn(TASK_KINDS, value);
}

/** What a task carries through the queue. */
export interface TaskData {
	kind: string;
	/** The store it is for; null for the few that belong to no store (a password reset). */
	storeId: string | null;
	/** Its row in the store's `task` table, for recorded kinds. */
	taskId: string | null;
	/** The row's round: 0, then one more each time a manager sends it again. */
	round?: number;
	payload: unknown;
}
