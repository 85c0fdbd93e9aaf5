// The desk as the store's day (issue 11, item 1): each group lists the jobs that need someone
// now, for the store's office, and only their own for a salesperson.
import { and, eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import {
	booking,
	changeOrder,
	job as jobTable,
	measure as measureTable,
	quote as quoteTable
} from '$lib/server/db/schema';
import { DESK_COUNT_MAX, WEEK_BOOKINGS } from '$lib/server/db/queries/desk';
import type { Schedule } from '$lib/estimating/schedule';
import * as measures from '$lib/server/db/queries/measures';
import { balancesFor, moneyFor } from '$lib/server/db/queries/payments';
import { formatMoney } from '$lib/format';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { storeDay, weekOf, type StoreDay } from '$lib/server/desk/day';
import { today } from '$lib/schedule/days';
import * as jobs from '$lib/server/db/queries/jobs';
import { grantsOf, type Role } from '$lib/server/permissions';
import {
	addMember,
	makeCustomer,
	makeJob,
	makePaidJob,
	makeQuotedJob,
	makeStore,
	roomDraft,
	sendAndAccept,
	type TestStore
} from './factories';
import { makeInstaller } from './field-factories';
import { seedChangeOrder } from './change-order-jobs';

let store: TestStore;
let salesId: string;
/** A quote's schedule, as bookings made outside the app carry. */
let aSchedule: Schedule;
const made: Record<string, { id: string; number: number }> = {};

const dayAs = (role: Role, userId: string, now = new Date()) =>
	readInStore(store.id, (tx) =>
		storeDay(tx, { grants: grantsOf(role), user: { id: userId }, store: { timeZone: 'UTC' } }, now)
	);

const group = (day: StoreDay, kind: string) => {
	const g = day.groups.find((x) => x.kind === kind);
	if (!g) throw new Error(`no ${kind} group`);
	return g;
};
const numbers = (day: StoreDay, kind: string) =>
	group(day, kind).lines.map((l) => l.job.split(' · ')[0]);

beforeAll(async () => {
	store = await makeStore('Larkspur Floors');
	const sales = await addMember(store.id, 'sales', 'Nell Ashdown');
	salesId = sales.id;
	// A job just opened, sold by the salesperson: nothing measured.
	made.bare = await makeJob(store.id, sales.id);
	// A measured job with a draft quote (the owner's).
	made.measured = (await makeQuotedJob(store)).job;
	// A quote with the customer for ten days.
	const sent = await makeQuotedJob(store);
	made.sent = sent.job;
	await inStore(store.id, (tx) => jobs.move(tx, sent.job.id, 'quoted', store.owner.id));
	// Accepted: the deposit is due.
	const accepted = await makeQuotedJob(store);
	await sendAndAccept(store, accepted);
	made.accepted = accepted.job;
	// Sold (deposit in), then another sold and booked this week.
	const paid = await makePaidJob(store);
	await inStore(store.id, (tx) => jobs.move(tx, paid.job.id, 'sold', store.owner.id));
	made.sold = paid.job;
	const booked = await makePaidJob(store);
	await inStore(store.id, (tx) => jobs.move(tx, booked.job.id, 'sold', store.owner.id));
	made.booked = booked.job;
	const { user: installer } = await makeInstaller(store);
	aSchedule = booked.quote.result.schedule;
	await inStore(store.id, async (tx) => {
		await tx.insert(booking).values({
			organizationId: store.id,
			jobId: booked.job.id,
			installerId: installer.id,
			startsOn: weekOf(today('UTC')).from,
			days: 2,
			proposedDays: 2,
			proposal: booked.quote.result.schedule,
			bookedBy: store.owner.id
		});
		await tx
			.update(jobTable)
			.set({ statusChangedAt: new Date(Date.now() - 10 * 86_400_000) })
			.where(and(eq(jobTable.organizationId, store.id), eq(jobTable.id, sent.job.id)));
	});
}, 240_000);

describe("the desk's day", { timeout: 60_000 }, () => {
	it("gives the manager the store's day, grouped by who acts next", async () => {
		const manager = await addMember(store.id, 'manager', 'Ivo Marsh');
		const day = await dayAs('manager', manager.id);
		expect(day.wholeStore).toBe(true);
		const label = (k: string) => `J-${made[k].number}`;
		expect(numbers(day, 'measure')).toEqual([label('bare')]);
		expect(numbers(day, 'quote')).toEqual([label('measured')]);
		expect(numbers(day, 'waiting')).toEqual([label('sent')]);
		expect(group(day, 'waiting').lines[0]).toMatchObject({ waitingDays: 10 });
		expect(group(day, 'waiting').lines[0].todo).toMatch(/follow up/);
		expect(numbers(day, 'deposits')).toEqual([label('accepted')]);
		// The booked job is not to book again; the other sold one is.
		expect(numbers(day, 'book')).toEqual([label('sold')]);
		expect(group(day, 'book').actor).toBe('you');
		expect(group(day, 'deposits').actor).toBe('customer');
		expect(day.week?.rows).toEqual([
			expect.objectContaining({
				installerName: 'An installer',
				jobs: [expect.objectContaining({ job: expect.stringContaining(label('booked')) })]
			})
		]);
		for (const g of day.groups) expect(g.total).toBeGreaterThanOrEqual(g.lines.length);
	});

	it('keeps its reads as statements named by their text, one for any number of ids', async () => {
		const manager = await addMember(store.id, 'manager', 'Ada Quill');
		// In one transaction, so on one connection: what the desk prepared there.
		const prepared = await readInStore(store.id, async (tx) => {
			await storeDay(tx, {
				grants: grantsOf('manager'),
				user: { id: manager.id },
				store: { timeZone: 'UTC' }
			});
			// The balances of one job, then of three: the same statements.
			await balancesFor(tx, [made.bare.id]);
			await balancesFor(tx, [made.bare.id, made.measured.id, made.sent.id]);
			const { rows } = await tx.execute<{ statement: string }>(
				sql`select statement from pg_prepared_statements where name like 'q\_%'`
			);
			return rows.map((r) => r.statement);
		});
		// Each kind's count, its limit in the text (a plan kept, not made again on every run).
		const counts = prepared.filter((t) => t.includes('limit 1001'));
		expect(counts.length).toBeGreaterThanOrEqual(6);
		// The sold jobs with no live booking are tested job by job, never hashed as a join.
		expect(prepared.some((t) => t.includes('"cancelled_at" is null offset 0'))).toBe(true);
		// The balances' reads take their jobs as one array, whatever their number.
		const quoteReads = prepared.filter((t) => /"quote"\."job_id" = any\(\$\d+::text\[\]\)/.test(t));
		expect(quoteReads).toHaveLength(1);
	});

	it('gives a salesperson only the jobs they sell, and no office groups', async () => {
		const day = await dayAs('sales', salesId);
		expect(day.wholeStore).toBe(false);
		expect(numbers(day, 'measure')).toEqual([`J-${made.bare.number}`]);
		expect(group(day, 'quote').total).toBe(0);
		expect(group(day, 'waiting').total).toBe(0);
		expect(day.groups.map((g) => g.kind)).not.toContain('book');
		expect(day.groups.map((g) => g.kind)).not.toContain('reconcile');
		expect(day.week?.rows).toEqual([]);
	});

	// Read from the change orders sent (migration 0022, bench/README.md): after the other tests,
	// as its jobs would join their groups.
	it('lists the jobs whose change order waits for review, oldest sent first', async () => {
		const older = await makePaidJob(store);
		const newer = await makePaidJob(store);
		const reviewed = await makePaidJob(store);
		const first = await seedChangeOrder(store, older);
		await seedChangeOrder(store, newer);
		const done = await seedChangeOrder(store, reviewed);
		await inStore(store.id, async (tx) => {
			await tx
				.update(changeOrder)
				.set({ createdAt: new Date(Date.now() - 3 * 86_400_000) })
				.where(eq(changeOrder.id, first.id));
			await tx.update(changeOrder).set({ status: 'reviewed' }).where(eq(changeOrder.id, done.id));
		});
		const manager = await addMember(store.id, 'manager', 'Ada Reyes');
		const day = await dayAs('manager', manager.id);
		expect(numbers(day, 'change-orders')).toEqual([
			`J-${older.job.number}`,
			`J-${newer.job.number}`
		]);
		expect(group(day, 'change-orders').total).toBe(2);
		expect(group(day, 'change-orders').lines[0]).toMatchObject({ waitingDays: 3 });
		// A salesperson reviews none: no such group.
		const sales = await dayAs('sales', salesId);
		expect(sales.groups.map((g) => g.kind)).not.toContain('change-orders');
	});

	// Migration 0023: the desk's kinds read two facts kept on the job by triggers, never the app.
	it('keeps on the job whether it is measured and when its quote was last sent', async () => {
		const facts = (id: string) =>
			readInStore(store.id, async (tx) => {
				const [row] = await tx
					.select({ measured: jobTable.roomsMeasured, sentAt: jobTable.quoteSentAt })
					.from(jobTable)
					.where(and(eq(jobTable.organizationId, store.id), eq(jobTable.id, id)));
				return row;
			});
		const fresh = await makeJob(store.id, store.owner.id);
		expect(await facts(fresh.id)).toEqual({ measured: false, sentAt: null });
		const room = roomDraft('r1', 'Hall', 'any-product');
		const save = (rooms: (typeof room)[], version: number) =>
			inStore(store.id, (tx) =>
				measures.save(tx, fresh.id, { builtYear: '1990', rooms }, version, store.owner.id)
			);
		expect((await save([], 0)).ok).toBe(true);
		expect((await facts(fresh.id)).measured).toBe(false);
		expect((await save([room], 1)).ok).toBe(true);
		expect((await facts(fresh.id)).measured).toBe(true);
		expect((await save([], 2)).ok).toBe(true);
		expect((await facts(fresh.id)).measured).toBe(false);
		expect((await save([room], 3)).ok).toBe(true);
		await inStore(store.id, (tx) =>
			tx
				.delete(measureTable)
				.where(and(eq(measureTable.organizationId, store.id), eq(measureTable.jobId, fresh.id)))
		);
		expect((await facts(fresh.id)).measured).toBe(false);
		// The accepted job's quote was sent: the job keeps when.
		const [sent] = await readInStore(store.id, (tx) =>
			tx
				.select({ at: quoteTable.sentAt })
				.from(quoteTable)
				.where(and(eq(quoteTable.organizationId, store.id), eq(quoteTable.jobId, made.accepted.id)))
		);
		expect(sent.at).toBeInstanceOf(Date);
		expect(await facts(made.accepted.id)).toEqual({ measured: true, sentAt: sent.at });
	});

	it("works out balances by the job's own ledger, the rows read for all at once", async () => {
		const finished = await makePaidJob(store);
		await inStore(store.id, (tx) =>
			tx
				.update(jobTable)
				.set({ status: 'completed' })
				.where(and(eq(jobTable.organizationId, store.id), eq(jobTable.id, finished.job.id)))
		);
		const ids = [finished.job.id, made.accepted.id, made.bare.id, made.sold.id];
		await readInStore(store.id, async (tx) => {
			const all = await balancesFor(tx, [...ids, 'no-such-job']);
			expect([...all.keys()].sort()).toEqual([...ids].sort());
			for (const id of ids) {
				const one = await moneyFor(tx, id);
				expect(all.get(id)).toEqual({
					balanceDueCents: one.ledger.balanceDueCents,
					currency: one.currency
				});
			}
		});
		const manager = await addMember(store.id, 'manager', 'Pia Lund');
		const balances = group(await dayAs('manager', manager.id), 'balances');
		expect(balances).toMatchObject({ total: 1, totalCapped: false });
		const due = await readInStore(store.id, (tx) => moneyFor(tx, finished.job.id));
		expect(due.ledger.balanceDueCents).toBeGreaterThan(0);
		expect(balances.lines[0].todo).toContain(formatMoney(due.ledger.balanceDueCents, due.currency));
	});

	it('counts a kind as far as 1,000, and says there are more', async () => {
		const big = await makeStore('Quarry Lane Floors');
		const customer = await makeCustomer(big.id);
		await inStore(big.id, (tx) =>
			tx.insert(jobTable).values(
				Array.from({ length: DESK_COUNT_MAX + 1 }, (_, i) => ({
					organizationId: big.id,
					number: 5001 + i,
					customerId: customer.id,
					title: `Hall ${i}`,
					status: 'accepted' as const,
					statusChangedAt: new Date(Date.UTC(2026, 0, 1) + i * 60_000)
				}))
			)
		);
		const manager = await addMember(big.id, 'manager', 'Tove Hart');
		const day = await readInStore(big.id, (tx) =>
			storeDay(tx, {
				grants: grantsOf('manager'),
				user: { id: manager.id },
				store: { timeZone: 'UTC' }
			})
		);
		const deposits = group(day, 'deposits');
		expect(deposits).toMatchObject({ total: DESK_COUNT_MAX, totalCapped: true });
		// The oldest first, from the kind's own index.
		expect(deposits.lines.map((l) => l.job.split(' · ')[0])).toEqual(
			Array.from({ length: 8 }, (_, i) => `J-${5001 + i}`)
		);
		expect(group(day, 'measure')).toMatchObject({ total: 0, totalCapped: false });

		// The week: two installers of one name, 201 bookings between them. The desk lists the first
		// 200, says there are more, and keeps the installers apart.
		const first = await makeInstaller(big);
		const second = await makeInstaller(big);
		const monday = weekOf(today('UTC')).from;
		await inStore(big.id, async (tx) => {
			const jobs = await tx
				.select({ id: jobTable.id })
				.from(jobTable)
				.where(eq(jobTable.organizationId, big.id))
				.orderBy(jobTable.number)
				.limit(WEEK_BOOKINGS + 1);
			await tx.insert(booking).values(
				jobs.map((j, i) => ({
					organizationId: big.id,
					jobId: j.id,
					installerId: (i % 2 ? second : first).user.id,
					startsOn: monday,
					days: 1,
					proposedDays: 1,
					proposal: aSchedule,
					bookedBy: big.owner.id
				}))
			);
		});
		const week = (
			await readInStore(big.id, (tx) =>
				storeDay(tx, {
					grants: grantsOf('manager'),
					user: { id: manager.id },
					store: { timeZone: 'UTC' }
				})
			)
		).week;
		expect(week?.more).toBe(true);
		expect(week?.rows.map((r) => r.installerName)).toEqual(['An installer', 'An installer']);
		// Each its own row (grouped by the installer, keyed by a booking), and no member's id in it.
		expect(new Set(week?.rows.map((r) => r.key)).size).toBe(2);
		for (const row of week?.rows ?? []) {
			expect(row.jobs.length).toBeGreaterThan(0);
			expect(JSON.stringify(row)).not.toContain(first.user.id);
			expect(JSON.stringify(row)).not.toContain(second.user.id);
		}
		expect(week?.rows.reduce((n, r) => n + r.jobs.length, 0)).toBe(WEEK_BOOKINGS);
	});

	it('works out the week from the store time zone, Monday to Sunday', () => {
		expect(weekOf('2026-12-02')).toEqual({ from: '2026-11-30', to: '2026-12-06' });
		expect(weekOf('2026-12-06')).toEqual({ from: '2026-11-30', to: '2026-12-06' });
		expect(today('Pacific/Auckland', new Date('2026-12-02T12:00:00Z'))).toBe('2026-12-03');
	});
});
