// The database's own rules for the installer's half (issue 10), beneath the workflows: what a
// bug, a resend or a second tab must never be able to write.
import {
	CHANGE_ORDER_STATUSES,
	canMoveChangeOrder,
	type ChangeOrderStatus
} from '$lib/jobs/change-order-status';
import { pool } from '$lib/server/db';
import type { PoolClient } from 'pg';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeJob, makePaidJob, makeStore, type TestStore } from './factories';
import { clientId, makeFieldWork, makeInstaller } from './field-factories';

type Work = Awaited<ReturnType<typeof makeFieldWork>>;

/**
 * Runs `work` in a store transaction on one connection and rolls it back, so each check starts
 * from the same rows. Resolves to what PostgreSQL said: `ok`, or the refusal's constraint name
 * (for keys, uniques and checks) and message (for triggers).
 */
async function attempt(
	storeId: string,
	work: (c: PoolClient) => Promise<unknown>
): Promise<{ ok: true } | { ok: false; constraint?: string; message: string }> {
	const client = await pool.connect();
	try {
		await client.query('begin');
		await client.query(`select set_config('app.store_id', $1, true)`, [storeId]);
		await work(client);
		return { ok: true };
	} catch (e) {
		const err = e as { constraint?: string; message: string };
		return { ok: false, constraint: err.constraint, message: err.message };
	} finally {
		await client.query('rollback');
		client.release();
	}
}

/**
 * Inserts a row given by column names as in the table (fixed names written in this spec), with
 * an optional `on conflict` clause; objects and arrays go in as JSON.
 */
function insert(c: PoolClient, table: string, row: Record<string, unknown>, onConflict = '') {
	const columns = Object.keys(row);
	const values = Object.values(row).map((v) =>
		v !== null && typeof v === 'object' && !(v instanceof Date) ? JSON.stringify(v) : v
	);
	return c.query(
		`insert into "${table}" (id, ${columns.map((k) => `"${k}"`).join(', ')})
		 values (gen_random_uuid(), ${columns.map((_, i) => `$${i + 1}`).join(', ')})
		 ${onConflict} returning *`,
		values
	);
}

let a: TestStore;
let b: TestStore;
let work: Work;
let other: Work;

beforeAll(async () => {
	a = await makeStore('Rules Floors');
	b = await makeStore('Other Rules Floors');
	work = await makeFieldWork(a);
	other = await makeFieldWork(b);
});

const changeOrderRow = (w: Work, status?: ChangeOrderStatus) => ({
	organization_id: w.changeOrder.organizationId,
	job_id: w.job.id,
	report_id: w.report.id,
	number: 2,
	...(status ? { status } : {}),
	input: w.changeOrder.input,
	result: w.changeOrder.result,
	currency: w.changeOrder.currency,
	subtotal_cents: w.changeOrder.subtotalCents,
	tax_cents: w.changeOrder.taxCents,
	total_cents: w.changeOrder.totalCents,
	pay_delta_cents: w.changeOrder.payDeltaCents
});

const cashFor = (w: Work, changeOrderId: string, amountCents: number, status = 'succeeded') => ({
	organization_id: w.job.organizationId,
	job_id: w.job.id,
	change_order_id: changeOrderId,
	purpose: 'change_order',
	method: 'cash',
	status,
	currency: w.changeOrder.currency,
	amount_cents: amountCents
});

/** A statement of the installer of store A's work, for one period. */
const statementRow = (start: string, end: string, extra: Record<string, unknown> = {}) => ({
	organization_id: a.id,
	installer_id: work.installer.id,
	period_start: start,
	period_end: end,
	currency: 'USD',
	...extra
});

/** A line on a new open statement of that installer, for one period. */
async function lineOnNewStatement(
	c: PoolClient,
	[start, end]: [string, string],
	line: Record<string, unknown>
) {
	const s = await insert(c, 'installer_statement', statementRow(start, end));
	return insert(c, 'installer_statement_line', {
		organization_id: a.id,
		statement_id: s.rows[0].id,
		installer_id: work.installer.id,
		...line
	});
}

describe('installer statements', () => {
	it('total the cent sum of their lines, whatever is written into the total; a correction goes in a later one', async () => {
		const sum = work.lines.reduce((t, l) => t + l.amountCents, 0);
		expect(sum).toBe(work.quote.result.installerPayCents + work.changeOrder.payDeltaCents);
		expect(work.statement.totalCents).toBe(sum);
		expect(work.statement.status).toBe('paid');

		const written = await attempt(a.id, async (c) => {
			const s = await insert(
				c,
				'installer_statement',
				statementRow('2027-01-01', '2027-01-31', { total_cents: 999_999 })
			);
			expect(s.rows[0].total_cents).toBe(0);
			const id = s.rows[0].id;
			for (const [kind, amount, reason] of [
				['chargeback', -1_250, 'Callback: cupped plank by the door'],
				['adjustment', 333, 'December pay short by 3.33']
			] as const) {
				await insert(c, 'installer_statement_line', {
					organization_id: a.id,
					statement_id: id,
					installer_id: work.installer.id,
					kind,
					amount_cents: amount,
					reason
				});
			}
			const kept = await c.query(`select total_cents from installer_statement where id = $1`, [id]);
			expect(kept.rows[0].total_cents).toBe(-1_250 + 333);
			const totals = await c.query(
				`update installer_statement set total_cents = 5 where id = $1 returning total_cents`,
				[id]
			);
			expect(totals.rows[0].total_cents).toBe(-1_250 + 333);
			await c.query(
				`delete from installer_statement_line where kind = 'adjustment' and statement_id = $1`,
				[id]
			);
			const after = await c.query(`select total_cents from installer_statement where id = $1`, [
				id
			]);
			expect(after.rows[0].total_cents).toBe(-1_250);
		});
		expect(written).toEqual({ ok: true });
	});

	it('refuse every change to a paid statement and to its lines', async () => {
		const line = work.lines[0];
		const refusals = await Promise.all([
			attempt(a.id, (c) =>
				insert(c, 'installer_statement_line', {
					organization_id: a.id,
					statement_id: work.statement.id,
					installer_id: work.installer.id,
					kind: 'adjustment',
					amount_cents: 100,
					reason: 'Late correction'
				})
			),
			attempt(a.id, (c) =>
				c.query(`update installer_statement_line set amount_cents = 1 where id = $1`, [line.id])
			),
			attempt(a.id, (c) =>
				c.query(`delete from installer_statement_line where id = $1`, [line.id])
			),
			attempt(a.id, (c) =>
				c.query(`update installer_statement set paid_reference = 'Other' where id = $1`, [
					work.statement.id
				])
			),
			attempt(a.id, (c) =>
				c.query(`update installer_statement set status = 'open', paid_at = null where id = $1`, [
					work.statement.id
				])
			),
			attempt(a.id, (c) =>
				c.query(`delete from installer_statement where id = $1`, [work.statement.id])
			)
		]);
		for (const r of refusals) {
			expect(r).toMatchObject({ ok: false, message: expect.stringMatching(/was paid/) });
		}
	});

	it('are opened, not born paid, and paid only with a reference', async () => {
		const row = statementRow('2027-02-01', '2027-02-28');
		expect(
			await attempt(a.id, (c) =>
				insert(c, 'installer_statement', {
					...row,
					status: 'paid',
					paid_at: new Date(),
					paid_reference: 'x'
				})
			)
		).toMatchObject({ ok: false, message: expect.stringMatching(/opened, then paid/) });
		expect(
			await attempt(a.id, async (c) => {
				const s = await insert(c, 'installer_statement', row);
				await c.query(
					`update installer_statement set status = 'paid', paid_at = now() where id = $1`,
					[s.rows[0].id]
				);
			})
		).toMatchObject({ ok: false, constraint: 'installer_statement_paid' });
	});

	it('pay a job once per installer and a change order once, and charge back only with a reason', async () => {
		const later = (c: PoolClient, line: Record<string, unknown>) =>
			lineOnNewStatement(c, ['2027-03-01', '2027-03-31'], line);
		expect(
			await attempt(a.id, (c) =>
				later(c, { kind: 'install', job_id: work.job.id, amount_cents: 1 })
			)
		).toMatchObject({ ok: false, constraint: 'installer_statement_line_install_once_uq' });
		expect(
			await attempt(a.id, (c) =>
				later(c, {
					kind: 'extra',
					job_id: work.job.id,
					change_order_id: work.changeOrder.id,
					amount_cents: 1
				})
			)
		).toMatchObject({ ok: false, constraint: 'installer_statement_line_extra_once_uq' });
		expect(
			await attempt(a.id, (c) => later(c, { kind: 'chargeback', amount_cents: -500 }))
		).toMatchObject({ ok: false, constraint: 'installer_statement_line_chargeback' });
		expect(
			await attempt(a.id, (c) =>
				later(c, { kind: 'chargeback', amount_cents: 500, reason: 'Wrong sign' })
			)
		).toMatchObject({ ok: false, constraint: 'installer_statement_line_chargeback' });
	});
});

const foundRow = (w: Work, id: string, extra: Record<string, unknown> = {}) => ({
	organization_id: w.report.organizationId,
	report_id: w.report.id,
	client_id: id,
	kind: 'found',
	room_id: w.hole.roomId,
	ref: w.hole.ref,
	ref_key: w.hole.refKey,
	qty: 2,
	unit: 'each',
	recorded_at: new Date(),
	...extra
});

const photoRow = (w: Work, id: string, extra: Record<string, unknown> = {}) => ({
	organization_id: w.job.organizationId,
	job_id: w.job.id,
	client_id: id,
	purpose: 'report',
	file_key: 'photos/x.jpg',
	thumb_key: 'photos/x-thumb.jpg',
	media_type: 'image/jpeg',
	byte_size: 1000,
	width: 10,
	height: 10,
	...extra
});

describe('what the phone sends', () => {
	it('stores an item or a photo sent twice once: its id is made on the phone', async () => {
		const again = foundRow(work, work.hole.clientId, { qty: 1 });
		expect(await attempt(a.id, (c) => insert(c, 'field_item', again))).toMatchObject({
			ok: false,
			constraint: 'field_item_client_uq'
		});
		expect(
			await attempt(a.id, async (c) => {
				const stored = await insert(
					c,
					'field_item',
					again,
					'on conflict (organization_id, client_id) do nothing'
				);
				expect(stored.rowCount).toBe(0);
				const count = await c.query(
					`select count(*)::int as n from field_item where client_id = $1`,
					[work.hole.clientId]
				);
				expect(count.rows[0].n).toBe(1);
			})
		).toEqual({ ok: true });
		expect(
			await attempt(a.id, (c) => insert(c, 'field_photo', photoRow(work, work.photo.clientId)))
		).toMatchObject({ ok: false, constraint: 'field_photo_client_uq' });
	});

	it("keeps one live amount per room and item, so a second phone's item merges instead of adding", async () => {
		expect(
			await attempt(a.id, (c) => insert(c, 'field_item', foundRow(work, clientId())))
		).toMatchObject({ ok: false, constraint: 'field_item_found_once_uq' });
		expect(
			await attempt(a.id, async (c) => {
				await c.query(
					`update field_item set deleted_at = now(), version = version + 1 where id = $1`,
					[work.hole.id]
				);
				await insert(c, 'field_item', foundRow(work, clientId()));
			})
		).toEqual({ ok: true });
	});

	it('refuses a found item without its amount and unit, and a photo that is not a stored image', async () => {
		expect(
			await attempt(a.id, (c) =>
				insert(c, 'field_item', foundRow(work, clientId(), { unit: null }))
			)
		).toMatchObject({ ok: false, constraint: 'field_item_found_shape' });
		expect(
			await attempt(a.id, (c) =>
				insert(c, 'field_photo', photoRow(work, clientId(), { media_type: 'image/svg+xml' }))
			)
		).toMatchObject({ ok: false, constraint: 'field_photo_media_type' });
		expect(
			await attempt(a.id, (c) =>
				insert(c, 'field_photo', photoRow(work, clientId(), { item_client_id: clientId() }))
			)
		).toMatchObject({ ok: false, constraint: 'field_photo_item_same_store_fk' });
	});
});

describe('change orders', () => {
	it('move only as change-order-status.ts says, at the database too', async () => {
		const reach: Record<ChangeOrderStatus, ChangeOrderStatus[]> = {
			submitted: [],
			reviewed: ['reviewed'],
			approved: ['reviewed', 'approved'],
			declined: ['declined']
		};
		const setFor = (to: ChangeOrderStatus) =>
			to === 'approved'
				? `status = 'approved', decided_at = now(), decided_name = 'A Customer'`
				: to === 'declined'
					? `status = 'declined', decided_at = now(), decided_name = 'A Customer'`
					: `status = '${to}'`;
		for (const from of CHANGE_ORDER_STATUSES) {
			for (const to of CHANGE_ORDER_STATUSES) {
				if (from === to) continue;
				const outcome = await attempt(a.id, async (c) => {
					const co = await insert(c, 'change_order', changeOrderRow(work));
					for (const step of reach[from]) {
						await c.query(`update change_order set ${setFor(step)} where id = $1`, [co.rows[0].id]);
					}
					await c.query(`update change_order set ${setFor(to)} where id = $1`, [co.rows[0].id]);
				});
				expect(outcome.ok, `${from} → ${to}`).toBe(canMoveChangeOrder(from, to));
				if (!outcome.ok) expect(outcome.message, `${from} → ${to}`).toMatch(/cannot move/);
			}
		}
		expect(
			await attempt(a.id, (c) => insert(c, 'change_order', changeOrderRow(work, 'approved')))
		).toMatchObject({ ok: false, message: expect.stringMatching(/starts as submitted/) });
	});

	it('keep an approved decision, and what the customer saw, as they are', async () => {
		const id = work.changeOrder.id;
		const tries = {
			again: `update change_order set decided_name = 'Someone else', decided_at = now() where id = $1`,
			decline: `update change_order set status = 'declined' where id = $1`,
			reprice: `update change_order set total_cents = total_cents + 100, subtotal_cents = subtotal_cents + 100 where id = $1`,
			adjust: `update change_order set adjustments = '[{"description":"x","amountCents":1,"payCents":0}]' where id = $1`,
			remove: `delete from change_order where id = $1`
		};
		const out = Object.fromEntries(
			await Promise.all(
				Object.entries(tries).map(async ([k, q]) => [
					k,
					await attempt(a.id, (c) => c.query(q, [id]))
				])
			)
		);
		expect(out.again).toMatchObject({ ok: false, message: expect.stringMatching(/kept as it is/) });
		expect(out.decline).toMatchObject({ ok: false, message: expect.stringMatching(/cannot move/) });
		expect(out.reprice).toMatchObject({ ok: false, message: expect.stringMatching(/frozen/) });
		expect(out.adjust).toMatchObject({ ok: false, message: expect.stringMatching(/frozen/) });
		expect(out.remove).toMatchObject({
			ok: false,
			message: expect.stringMatching(/kept for good/)
		});
	});

	it('allow one in the works per job', async () => {
		expect(
			await attempt(a.id, async (c) => {
				await insert(c, 'change_order', changeOrderRow(work));
				await insert(c, 'change_order', { ...changeOrderRow(work), number: 3 });
			})
		).toMatchObject({ ok: false, constraint: 'change_order_one_open_uq' });
	});

	it('are paid once, only when approved, for exactly their amount', async () => {
		const total = work.changeOrder.totalCents;
		expect(total).toBeGreaterThan(0);
		expect(work.changeOrderPayment.amountCents).toBe(total);
		expect(
			await attempt(a.id, (c) => insert(c, 'payment', cashFor(work, work.changeOrder.id, total)))
		).toMatchObject({ ok: false, constraint: 'payment_change_order_once_uq' });

		const fresh = async (c: PoolClient, approve: boolean) => {
			const co = await insert(c, 'change_order', changeOrderRow(work));
			const id: string = co.rows[0].id;
			if (approve) {
				await c.query(`update change_order set status = 'reviewed' where id = $1`, [id]);
				await c.query(
					`update change_order set status = 'approved', decided_at = now(), decided_name = 'A Customer' where id = $1`,
					[id]
				);
			}
			return id;
		};
		expect(
			await attempt(a.id, async (c) =>
				insert(c, 'payment', cashFor(work, await fresh(c, false), total))
			)
		).toMatchObject({ ok: false, message: expect.stringMatching(/after the customer approved/) });
		expect(
			await attempt(a.id, async (c) =>
				insert(c, 'payment', cashFor(work, await fresh(c, true), total - 1))
			)
		).toMatchObject({ ok: false, message: expect.stringMatching(/must be its amount/) });
		expect(
			await attempt(a.id, async (c) => {
				const id = await fresh(c, true);
				await insert(c, 'payment', cashFor(work, id, total, 'failed'));
				await insert(c, 'payment', cashFor(work, id, total, 'pending'));
			})
		).toEqual({ ok: true });
		expect(
			await attempt(a.id, (c) =>
				insert(c, 'payment', {
					...cashFor(work, work.changeOrder.id, total),
					change_order_id: null
				})
			)
		).toMatchObject({ ok: false, constraint: 'payment_change_order_purpose' });
	});
});

describe('bookings and completion', () => {
	it('book a job once at a time, and know its last day', async () => {
		expect(work.booking.endsOn).toBe(
			new Date(Date.UTC(2026, 11, 14 + work.booking.days - 1)).toISOString().slice(0, 10)
		);
		const again = {
			organization_id: a.id,
			job_id: work.job.id,
			installer_id: work.installer.id,
			starts_on: '2026-12-21',
			days: 2,
			proposed_days: 2,
			proposal: work.booking.proposal
		};
		expect(await attempt(a.id, (c) => insert(c, 'booking', again))).toMatchObject({
			ok: false,
			constraint: 'booking_job_live_uq'
		});
		expect(
			await attempt(a.id, async (c) => {
				await c.query(`update booking set cancelled_at = now() where id = $1`, [work.booking.id]);
				const moved = await insert(c, 'booking', again);
				const last = await c.query(`select ends_on::text as d from booking where id = $1`, [
					moved.rows[0].id
				]);
				expect(last.rows[0].d).toBe('2026-12-22');
			})
		).toEqual({ ok: true });
	});

	it("keep the customer's sign-off as it was given", async () => {
		for (const q of [
			`update job_completion set walkthrough_notes = 'Changed' where id = $1`,
			`delete from job_completion where id = $1`
		]) {
			expect(await attempt(a.id, (c) => c.query(q, [work.completion.id]))).toMatchObject({
				ok: false,
				message: expect.stringMatching(/signed off/)
			});
		}
	});
});

describe("another store's rows", () => {
	it('cannot be pointed at from this store, even by a raw insert', async () => {
		const [aJob, bOnly] = await Promise.all([
			makeJob(a.id, a.owner.id),
			(async () => {
				const sold = await makePaidJob(b);
				return { sold, installer: await makeInstaller(b) };
			})()
		]);
		const cases: [string, (c: PoolClient) => Promise<unknown>][] = [
			[
				'booking_job_same_store_fk',
				(c) => insert(c, 'booking', { ...bookingOf(work), job_id: other.job.id })
			],
			[
				'booking_installer_profile_fk',
				(c) =>
					insert(c, 'booking', {
						...bookingOf(work),
						job_id: aJob.id,
						installer_id: bOnly.installer.user.id
					})
			],
			[
				'field_item_report_same_store_fk',
				(c) =>
					insert(c, 'field_item', { ...foundRow(work, clientId()), report_id: other.report.id })
			],
			[
				'field_photo_item_same_store_fk',
				(c) =>
					insert(
						c,
						'field_photo',
						photoRow(work, clientId(), { item_client_id: other.hole.clientId })
					)
			],
			[
				'change_order_report_same_store_fk',
				(c) => insert(c, 'change_order', { ...changeOrderRow(work), report_id: other.report.id })
			],
			[
				'payment_change_order_same_job_fk',
				(c) =>
					insert(c, 'payment', cashFor(work, other.changeOrder.id, other.changeOrder.totalCents))
			],
			[
				'payment_change_order_same_job_fk',
				async (c) => {
					// Its own payment set aside, so the one-payment rule is not what refuses it.
					await c.query(`update payment set status = 'failed' where id = $1`, [
						work.changeOrderPayment.id
					]);
					return insert(c, 'payment', {
						...cashFor(work, work.changeOrder.id, work.changeOrder.totalCents),
						job_id: aJob.id
					});
				}
			],
			[
				'installer_statement_line_job_same_store_fk',
				(c) =>
					lineOnNewStatement(c, ['2027-04-01', '2027-04-30'], {
						kind: 'install',
						job_id: other.job.id,
						amount_cents: 100
					})
			]
		];
		for (const [constraint, write] of cases) {
			expect(await attempt(a.id, write), constraint).toMatchObject({ ok: false, constraint });
		}
	});
});

const bookingOf = (w: Work) => ({
	organization_id: w.job.organizationId,
	job_id: w.job.id,
	installer_id: w.installer.id,
	starts_on: '2027-02-01',
	days: 1,
	proposed_days: 1,
	proposal: w.booking.proposal
});
