// Installer statements against the real database: install pay per job completed in the period
// (the completion's day in the store's time zone) from the accepted quote, with the installer's
// own rates; extras from change orders approved in the period; chargebacks; totals to the cent
// (the database's sum and the pure function's agree); a paid statement frozen; other stores 404.
import {
	changeOrder as priceChangeOrder,
	soldQuantities,
	type QuantityItem
} from '$lib/estimating';
import { extend, refKey } from '$lib/estimating/pricing';
import * as jobs from '$lib/server/db/queries/jobs';
import * as statements from '$lib/server/db/queries/statements';
import * as stores from '$lib/server/db/queries/stores';
import {
	changeOrder,
	fieldReport,
	installerStatementLine,
	jobCompletion
} from '$lib/server/db/schema';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { bookJob } from '$lib/server/schedule/book';
import {
	addManualLine,
	makeStatement,
	payStatement,
	refreshStatement
} from '$lib/server/statements/build';
import { statementTotal } from '$lib/statements/maths';
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { makePaidJob, makeStore, type TestStore } from './factories';
import { makeInstaller } from './field-factories';

let store: TestStore;
let installer: Awaited<ReturnType<typeof makeInstaller>>['user'];
const HOLE = { type: 'prep', kind: 'hole_repair' } as const;
/** The factory's profile pays 55.00 a hole in place of the book's rate. */
const OWN_HOLE_CENTS = 5_500;

/** A sold job booked for the installer, worked and completed at `completedAt`. */
async function completedJob(completedAt: string) {
	const made = await makePaidJob(store);
	const booked = await inStore(store.id, (tx) =>
		bookJob(
			tx,
			made.job.id,
			{ installerId: installer.id, startsOn: '2026-11-02', days: 1, arrivesAt: null, notes: '' },
			{ id: store.owner.id, storeName: store.name }
		)
	);
	if (!booked.ok) throw new Error('not booked');
	await inStore(store.id, async (tx) => {
		await jobs.move(tx, made.job.id, 'in_progress', installer.id);
		await jobs.move(tx, made.job.id, 'completed', installer.id);
		await tx.insert(jobCompletion).values({
			organizationId: store.id,
			jobId: made.job.id,
			completedAt: new Date(completedAt),
			completedBy: installer.id
		});
	});
	return made;
}

/** The job's install pay worked out here, apart from the module: book pay, own rate for holes. */
function expectedPay(made: Awaited<ReturnType<typeof makePaidJob>>) {
	const { lines, pay } = made.quote.result;
	let total = 0;
	for (const line of lines) {
		if (refKey(line.ref) === refKey(HOLE)) total += extend(line.qty, OWN_HOLE_CENTS);
		else total += pay.find((p) => p.lineId === line.id)?.amountCents ?? 0;
	}
	return total;
}

/** A change order on the job with one more hole than sold, approved by the customer at `at`. */
async function approvedChangeOrder(made: Awaited<ReturnType<typeof makePaidJob>>, at: string) {
	const { quote, job } = made;
	const roomId = quote.input.job.rooms[0].id;
	const sold = soldQuantities(quote.result);
	const found: QuantityItem[] = [...sold, { roomId, ref: HOLE, qty: 1 }];
	const priced = priceChangeOrder({
		sold,
		found,
		priceBook: quote.input.priceBook,
		settings: quote.input.settings
	});
	if (!priced.ok) throw new Error('change order not priced');
	return inStore(store.id, async (tx) => {
		const [report] = await tx
			.insert(fieldReport)
			.values({
				organizationId: store.id,
				jobId: job.id,
				checkedInAt: new Date(),
				checkedInBy: installer.id
			})
			.returning();
		const [co] = await tx
			.insert(changeOrder)
			.values({
				organizationId: store.id,
				jobId: job.id,
				reportId: report.id,
				number: 1,
				input: { sold, found, priceBook: quote.input.priceBook, settings: quote.input.settings },
				result: priced,
				currency: quote.currency,
				subtotalCents: priced.subtotalCents,
				taxCents: priced.taxCents,
				totalCents: priced.totalCents,
				payDeltaCents: priced.payDeltaCents,
				createdBy: installer.id
			})
			.returning();
		const where = and(eq(changeOrder.organizationId, store.id), eq(changeOrder.id, co.id));
		await tx
			.update(changeOrder)
			.set({ status: 'reviewed', reviewedAt: new Date(), reviewedBy: store.owner.id })
			.where(where);
		const [approved] = await tx
			.update(changeOrder)
			.set({ status: 'approved', decidedAt: new Date(at), decidedName: 'A Customer' })
			.where(where)
			.returning();
		return approved;
	});
}

const actor = () => ({ id: store.owner.id, timeZone: 'America/Chicago' });

let lateNovember: Awaited<ReturnType<typeof completedJob>>;
let december: Awaited<ReturnType<typeof completedJob>>;
let extra: Awaited<ReturnType<typeof approvedChangeOrder>>;

beforeAll(async () => {
	store = await makeStore('Larchwood Floors');
	await inStore(store.id, (tx) => stores.saveTimeZone(tx, 'America/Chicago'));
	installer = (await makeInstaller(store)).user;
	// 03:00 UTC on 1 December is still 30 November in Chicago.
	lateNovember = await completedJob('2026-12-01T03:00:00Z');
	december = await completedJob('2026-12-15T18:00:00Z');
	extra = await approvedChangeOrder(december, '2026-12-16T15:00:00Z');
});

describe('making a statement', () => {
	it('pays the period’s jobs (in the store’s zone) and approved extras, to the cent', async () => {
		const made = await inStore(store.id, (tx) =>
			makeStatement(
				tx,
				{ installerId: installer.id, periodStart: '2026-12-01', periodEnd: '2026-12-31' },
				actor()
			)
		);
		expect(made).toMatchObject({ ok: true, added: 2 });
		if (!made.ok) return;
		const { row, lines } = await readInStore(store.id, async (tx) => ({
			row: await statements.read(tx, made.statementId),
			lines: await statements.lines(tx, made.statementId)
		}));
		expect(lines.map((l) => [l.kind, l.jobId])).toEqual([
			['install', december.job.id],
			['extra', december.job.id]
		]);
		const install = expectedPay(december);
		expect(install).toBeGreaterThan(0);
		expect(lines[0].amountCents).toBe(install);
		expect(lines[1].amountCents).toBe(extra.payDeltaCents);
		expect(row!.statement.totalCents).toBe(install + extra.payDeltaCents);
		expect(statementTotal(lines)).toBe(row!.statement.totalCents);
		expect(row!.statement.currency).toBe(december.quote.currency);
	});

	it('puts the late-November job on November’s statement, and never a job twice', async () => {
		const nov = await inStore(store.id, (tx) =>
			makeStatement(
				tx,
				{ installerId: installer.id, periodStart: '2026-11-01', periodEnd: '2026-11-30' },
				actor()
			)
		);
		if (!nov.ok) throw new Error('not made');
		const lines = await readInStore(store.id, (tx) => statements.lines(tx, nov.statementId));
		expect(lines.map((l) => l.jobId)).toEqual([lateNovember.job.id]);
		expect(lines[0].amountCents).toBe(expectedPay(lateNovember));
		// Brought up to date, nothing new comes in; a second statement starting the same day is refused.
		const again = await inStore(store.id, (tx) => refreshStatement(tx, nov.statementId, actor()));
		expect(again).toMatchObject({ ok: true, added: 0 });
		const twice = await inStore(store.id, (tx) =>
			makeStatement(
				tx,
				{ installerId: installer.id, periodStart: '2026-11-01', periodEnd: '2026-11-15' },
				actor()
			)
		);
		expect(twice).toMatchObject({ ok: false, reason: 'refused', field: 'periodStart' });
	});

	it('takes chargebacks off, totals to the cent, and freezes once paid', async () => {
		const made = await inStore(store.id, (tx) =>
			makeStatement(
				tx,
				{ installerId: installer.id, periodStart: '2027-01-01', periodEnd: '2027-01-31' },
				actor()
			)
		);
		if (!made.ok) throw new Error('not made');
		const id = made.statementId;
		const add = (kind: 'chargeback' | 'adjustment', amountCents: number, reason: string) =>
			inStore(store.id, (tx) =>
				addManualLine(tx, id, { kind, amountCents, reason, description: '' }, store.owner.id)
			);
		expect(await add('chargeback', 2_599, 'Scratched threshold replaced')).toMatchObject({
			ok: true
		});
		expect(await add('adjustment', 1_001, 'December trip charge missed')).toMatchObject({
			ok: true
		});
		expect(await add('adjustment', 0, 'Nothing')).toMatchObject({ ok: false, field: 'amount' });
		const row = await readInStore(store.id, (tx) => statements.read(tx, id));
		// −25.99 + 10.01 = −15.98
		expect(row!.statement.totalCents).toBe(-1_598);

		expect(
			await inStore(store.id, (tx) => payStatement(tx, id, 'Cheque 118', store.owner.id))
		).toMatchObject({ ok: true });
		expect(
			await inStore(store.id, (tx) => payStatement(tx, id, 'Again', store.owner.id))
		).toMatchObject({ ok: false, reason: 'refused' });
		expect(await add('chargeback', 100, 'Late')).toMatchObject({ ok: false, reason: 'refused' });
		expect(await inStore(store.id, (tx) => refreshStatement(tx, id, actor()))).toMatchObject({
			ok: false,
			reason: 'refused'
		});
		// Beneath the workflow, the database refuses a line on a paid statement too.
		await expect(
			inStore(store.id, (tx) =>
				tx.insert(installerStatementLine).values({
					organizationId: store.id,
					statementId: id,
					installerId: installer.id,
					kind: 'adjustment',
					reason: 'Sneaked in',
					amountCents: 1
				})
			)
		).rejects.toThrow();
		const paid = await readInStore(store.id, (tx) => statements.read(tx, id));
		expect(paid!.statement).toMatchObject({
			status: 'paid',
			paidReference: 'Cheque 118',
			totalCents: -1_598
		});
	});

	it('is the store’s own and the installer’s own', async () => {
		const list = await readInStore(store.id, (tx) => statements.list(tx));
		const one = list[0];
		const other = await makeStore('Wrenfield Tile');
		expect(await readInStore(other.id, (tx) => statements.read(tx, one.id))).toBeUndefined();
		expect(await readInStore(other.id, (tx) => statements.list(tx))).toEqual([]);
		const stranger = (await makeInstaller(store)).user;
		expect(
			await readInStore(store.id, (tx) => statements.read(tx, one.id, stranger.id))
		).toBeUndefined();
		expect(
			await readInStore(store.id, (tx) => statements.list(tx, { installerId: stranger.id }))
		).toEqual([]);
		const refused = await inStore(other.id, (tx) =>
			addManualLine(
				tx,
				one.id,
				{ kind: 'chargeback', amountCents: 1, reason: 'x', description: '' },
				other.owner.id
			)
		);
		expect(refused).toEqual({ ok: false, reason: 'not_found' });
	});
});
