import { and, desc, eq, ne, sql } from 'drizzle-orm';
import { estimate, type EstimateInput } from '../../../estimating';
import { toEngine, type DraftError } from '../../../measure/draft';
import { job, quote, user } from '../schema';
import { inStore, type Tx } from '../tenant';
import { moveIn } from './jobs';
import * as measures from './measures';
import { priceBookFor } from './price-book';
import * as tradeSettings from './settings';

export type Quote = typeof quote.$inferSelect;
export type QuoteStatus = Quote['status'];

/** A quote version without its stored input and result, for lists. */
const summaryColumns = {
	id: quote.id,
	jobId: quote.jobId,
	version: quote.version,
	status: quote.status,
	currency: quote.currency,
	subtotalCents: quote.subtotalCents,
	taxCents: quote.taxCents,
	totalCents: quote.totalCents,
	depositCents: quote.depositCents,
	validUntil: quote.validUntil,
	sentAt: quote.sentAt,
	sentTo: quote.sentTo,
	acceptedAt: quote.acceptedAt,
	acceptedName: quote.acceptedName,
	changeNote: quote.changeNote,
	changeRequestedAt: quote.changeRequestedAt,
	createdAt: quote.createdAt,
	createdByName: user.name
};

export type QuoteSummary = Awaited<ReturnType<typeof list>>[number];

/** Every version of a job's quote, newest first. */
export async function list(storeId: string, jobId: string) {
	return inStore(storeId, (tx) =>
		tx
			.select(summaryColumns)
			.from(quote)
			.leftJoin(user, eq(user.id, quote.createdBy))
			.where(and(eq(quote.organizationId, storeId), eq(quote.jobId, jobId)))
			.orderBy(desc(quote.version))
	);
}

/** One version with what it was built from and what the engine said. */
export async function read(storeId: string, id: string): Promise<Quote | undefined> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select()
			.from(quote)
			.where(and(eq(quote.organizationId, storeId), eq(quote.id, id)));
		return row;
	});
}

export async function readVersion(storeId: string, jobId: string, version: number) {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select()
			.from(quote)
			.where(
				and(eq(quote.organizationId, storeId), eq(quote.jobId, jobId), eq(quote.version, version))
			);
		return row;
	});
}

/**
 * The version a customer's link shows: the newest one that was sent (it may since have been
 * accepted or sent back for changes). Drafts are never shown to customers.
 */
export async function forCustomer(storeId: string, jobId: string): Promise<Quote | undefined> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select()
			.from(quote)
			.where(
				and(
					eq(quote.organizationId, storeId),
					eq(quote.jobId, jobId),
					ne(quote.status, 'draft'),
					ne(quote.status, 'superseded')
				)
			)
			.orderBy(desc(quote.version))
			.limit(1);
		return row;
	});
}

export type BuildResult =
	| { ok: true; quote: Quote }
	| { ok: false; reason: 'not_found' | 'no_measure' | 'closed' }
	| { ok: false; reason: 'invalid'; errors: DraftError[] };

/** The whole input of a quote: the job's measure, the store's settings and a copy of its prices. */
async function inputFor(storeId: string, jobId: string) {
	const [stored, trade] = await Promise.all([
		measures.read(storeId, jobId),
		tradeSettings.read(storeId)
	]);
	if (!stored) return { missing: true as const };
	const priceBook = await priceBookFor(storeId, trade.currency);
	const read = toEngine(stored.draft, trade.settings);
	const input: EstimateInput = { job: read.job, settings: trade.settings, priceBook };
	return { input, draftErrors: read.errors, trade };
}

/**
 * Builds (or rebuilds) the draft version of a job's quote from its measure and today's price
 * book. A draft is replaced; when the newest version was already sent, this makes the next
 * version. Nothing is written while any field of the measure or any room cannot be priced.
 */
export async function build(storeId: string, jobId: string, userId: string): Promise<BuildResult> {
	const prepared = await inputFor(storeId, jobId);
	if ('missing' in prepared) return { ok: false, reason: 'no_measure' };
	const { input, draftErrors, trade } = prepared;
	if (draftErrors.length) return { ok: false, reason: 'invalid', errors: draftErrors };
	if (input.job.rooms.length === 0) {
		return {
			ok: false,
			reason: 'invalid',
			errors: [{ path: 'rooms', message: 'Measure at least one room first' }]
		};
	}
	const result = estimate(input);
	if (!result.ok) {
		return {
			ok: false,
			reason: 'invalid',
			errors: result.errors.map((e) => ({
				path: e.path.replace(/^job\./, ''),
				roomId: e.roomId,
				message: e.message
			}))
		};
	}
	return inStore(storeId, async (tx) => {
		const [j] = await tx
			.select({ status: job.status })
			.from(job)
			.where(and(eq(job.organizationId, storeId), eq(job.id, jobId)))
			.for('update');
		if (!j) return { ok: false, reason: 'not_found' } as const;
		if (!['draft', 'quoted'].includes(j.status)) return { ok: false, reason: 'closed' } as const;
		const [latest] = await tx
			.select({ id: quote.id, version: quote.version, status: quote.status })
			.from(quote)
			.where(and(eq(quote.organizationId, storeId), eq(quote.jobId, jobId)))
			.orderBy(desc(quote.version))
			.limit(1);
		const values = {
			input,
			result,
			currency: trade.currency,
			subtotalCents: result.totals.subtotalCents,
			taxCents: result.totals.taxCents,
			totalCents: result.totals.totalCents,
			depositCents: result.totals.depositCents,
			createdBy: userId
		};
		if (latest?.status === 'draft') {
			const [row] = await tx
				.update(quote)
				.set({ ...values, updatedAt: new Date() })
				.where(and(eq(quote.organizationId, storeId), eq(quote.id, latest.id)))
				.returning();
			return { ok: true, quote: row } as const;
		}
		const [row] = await tx
			.insert(quote)
			.values({ ...values, organizationId: storeId, jobId, version: (latest?.version ?? 0) + 1 })
			.returning();
		return { ok: true, quote: row } as const;
	});
}

/** The estimate the job's measure gives today, without saving anything (a preview). */
export async function preview(storeId: string, jobId: string) {
	const prepared = await inputFor(storeId, jobId);
	if ('missing' in prepared) return undefined;
	return { result: estimate(prepared.input), draftErrors: prepared.draftErrors };
}

export type SendResult =
	{ ok: true; quote: Quote } | { ok: false; reason: 'not_found' | 'not_draft' | 'job_moved_on' };

/**
 * Sends a draft version: it is frozen from now on, earlier versions are superseded, and a draft
 * job becomes quoted. The e-mail itself is the caller's (after this commits).
 */
export async function send(
	storeId: string,
	quoteId: string,
	options: { to: string; validDays: number; actorId: string }
): Promise<SendResult> {
	return inStore(storeId, async (tx) => {
		const [q] = await tx
			.select()
			.from(quote)
			.where(and(eq(quote.organizationId, storeId), eq(quote.id, quoteId)))
			.for('update');
		if (!q) return { ok: false, reason: 'not_found' };
		if (q.status !== 'draft') return { ok: false, reason: 'not_draft' };
		const [j] = await tx
			.select({ status: job.status })
			.from(job)
			.where(and(eq(job.organizationId, storeId), eq(job.id, q.jobId)))
			.for('update');
		if (!j || !['draft', 'quoted'].includes(j.status)) return { ok: false, reason: 'job_moved_on' };
		await tx
			.update(quote)
			.set({ status: 'superseded', updatedAt: new Date() })
			.where(
				and(
					eq(quote.organizationId, storeId),
					eq(quote.jobId, q.jobId),
					ne(quote.id, q.id),
					sql`${quote.status} in ('sent', 'changes_requested')`
				)
			);
		const now = new Date();
		const [row] = await tx
			.update(quote)
			.set({
				status: 'sent',
				sentAt: now,
				sentTo: options.to,
				validUntil: new Date(now.getTime() + options.validDays * 86_400_000),
				updatedAt: now
			})
			.where(and(eq(quote.organizationId, storeId), eq(quote.id, q.id)))
			.returning();
		if (j.status === 'draft') {
			await moveIn(
				tx,
				storeId,
				q.jobId,
				'quoted',
				options.actorId,
				`Quote version ${q.version} sent to ${options.to}`
			);
		}
		return { ok: true, quote: row };
	});
}

export type CustomerAnswer =
	{ ok: true; quote: Quote } | { ok: false; reason: 'not_found' | 'not_open' | 'expired' };

async function openQuote(tx: Tx, storeId: string, quoteId: string, jobId: string) {
	const [q] = await tx
		.select()
		.from(quote)
		.where(and(eq(quote.organizationId, storeId), eq(quote.id, quoteId), eq(quote.jobId, jobId)))
		.for('update');
	if (!q) return { ok: false, reason: 'not_found' } as const;
	if (q.status !== 'sent') return { ok: false, reason: 'not_open' } as const;
	if (q.validUntil && q.validUntil < new Date()) return { ok: false, reason: 'expired' } as const;
	return { ok: true, quote: q } as const;
}

/** The customer accepts a sent version by typing their name; the job becomes accepted. */
export async function accept(
	storeId: string,
	jobId: string,
	quoteId: string,
	signature: { name: string; ip: string | null; userAgent: string | null }
): Promise<CustomerAnswer> {
	return inStore(storeId, async (tx) => {
		const open = await openQuote(tx, storeId, quoteId, jobId);
		if (!open.ok) return open;
		const now = new Date();
		const [row] = await tx
			.update(quote)
			.set({
				status: 'accepted',
				acceptedAt: now,
				acceptedName: signature.name,
				acceptedIp: signature.ip,
				acceptedUserAgent: signature.userAgent,
				updatedAt: now
			})
			.where(and(eq(quote.organizationId, storeId), eq(quote.id, quoteId)))
			.returning();
		const moved = await moveIn(
			tx,
			storeId,
			jobId,
			'accepted',
			null,
			`Accepted by ${signature.name} (version ${row.version})`
		);
		if (!moved.ok) throw new Error(`job ${jobId} could not become accepted: ${moved.reason}`);
		return { ok: true, quote: row };
	});
}

/** The customer asks for changes with a note; the job goes back to draft for the next version. */
export async function requestChanges(
	storeId: string,
	jobId: string,
	quoteId: string,
	note: string
): Promise<CustomerAnswer> {
	return inStore(storeId, async (tx) => {
		const open = await openQuote(tx, storeId, quoteId, jobId);
		if (!open.ok) return open;
		const now = new Date();
		const [row] = await tx
			.update(quote)
			.set({
				status: 'changes_requested',
				changeNote: note,
				changeRequestedAt: now,
				updatedAt: now
			})
			.where(and(eq(quote.organizationId, storeId), eq(quote.id, quoteId)))
			.returning();
		await moveIn(tx, storeId, jobId, 'draft', null, `Customer asked for changes: ${note}`);
		return { ok: true, quote: row };
	});
}
