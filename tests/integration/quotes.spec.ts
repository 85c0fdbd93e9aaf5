import { inStore } from '$lib/server/db/tenant';
import { pool } from '$lib/server/db';
import * as measures from '$lib/server/db/queries/measures';
import * as priceBook from '$lib/server/db/queries/price-book';
import * as quotes from '$lib/server/db/queries/quotes';
import * as jobs from '$lib/server/db/queries/jobs';
import { acceptQuote, requestChanges } from '$lib/server/quotes/answer';
import { buildQuote } from '$lib/server/quotes/build';
import { sendQuote } from '$lib/server/quotes/send';
import { estimate } from '$lib/estimating';
import { describe, expect, it } from 'vitest';
import { makeJob, makeQuotedJob, makeStore, makePriceBook, roomDraft } from './factories';
import { jobScope } from '$lib/server/object-access';
import { grantsOf } from '$lib/server/permissions';

const staff = (userId: string) => jobScope(grantsOf('owner'), userId);

async function asOwner<T>(sqlText: string, params: unknown[]) {
	// The schema owner is subject to forced row security too; the trigger is what refuses here.
	const client = await pool.connect();
	try {
		await client.query('begin');
		await client.query(`select set_config('app.store_id', $1, true)`, [params[0]]);
		return (await client.query(sqlText, params.slice(1))) as T;
	} finally {
		await client.query('rollback');
		client.release();
	}
}

describe('building a quote', () => {
	it('stores every input, and its totals are what the engine gives for them', async () => {
		const store = await makeStore('Quote Floors');
		const { quote } = await makeQuotedJob(store);
		expect(quote.version).toBe(1);
		expect(quote.status).toBe('draft');
		const again = estimate(quote.input);
		expect(again).toEqual(quote.result);
		expect([quote.subtotalCents, quote.taxCents, quote.totalCents, quote.depositCents]).toEqual([
			again.totals.subtotalCents,
			again.totals.taxCents,
			again.totals.totalCents,
			again.totals.depositCents
		]);
		// The price book copy is in the quote itself.
		expect(quote.input.priceBook.floors.length).toBeGreaterThan(0);
		expect(Number.isInteger(quote.totalCents)).toBe(true);
	});

	it('refuses a room with no floor or an unreadable length, by its field, and saves nothing', async () => {
		const store = await makeStore('Refusing Floors');
		const { floors } = await makePriceBook(store.id);
		const job = await makeJob(store.id, store.owner.id);
		const noFloor = {
			...roomDraft('r1', 'Hall', floors['lvp-grey']),
			floor: { productId: '', layout: 'straight' as const }
		};
		const badLength = roomDraft('r2', 'Den', floors['lvp-grey'], '12\' 6 1/0"');
		await inStore(store.id, (tx) =>
			measures.save(tx, job.id, { builtYear: '', rooms: [noFloor] }, 0, store.owner.id)
		);
		const first = await inStore(store.id, (tx) => buildQuote(tx, job.id, store.owner.id));
		expect(first).toMatchObject({
			ok: false,
			reason: 'invalid',
			errors: [{ path: 'rooms.0.floor', roomId: 'r1' }]
		});
		await inStore(store.id, (tx) =>
			measures.save(tx, job.id, { builtYear: '', rooms: [badLength] }, 1, store.owner.id)
		);
		const second = await inStore(store.id, (tx) => buildQuote(tx, job.id, store.owner.id));
		expect(second).toMatchObject({
			ok: false,
			reason: 'invalid',
			errors: [{ path: 'rooms.0.shape.width' }]
		});
		expect(await inStore(store.id, (tx) => quotes.list(tx, job.id))).toEqual([]);
	});

	it('says so when nothing was measured', async () => {
		const store = await makeStore('Empty Floors');
		const job = await makeJob(store.id, store.owner.id);
		expect(await inStore(store.id, (tx) => buildQuote(tx, job.id, store.owner.id))).toEqual({
			ok: false,
			reason: 'no_measure'
		});
	});
});

describe('a sent quote', () => {
	it('stays as sent when a price changes afterwards; the next version takes the new price', async () => {
		const store = await makeStore('Frozen Floors');
		const { job, quote, floors } = await makeQuotedJob(store);
		const sent = await inStore(store.id, (tx) =>
			sendQuote(tx, quote.id, {
				to: 'c@test.example',
				validDays: 30,
				actorId: store.owner.id
			})
		);
		expect(sent.ok).toBe(true);
		const item = (await inStore(store.id, (tx) => priceBook.read(tx, floors['lvp-grey'])))!;
		const material = item.data.material as { basis: string; priceCents: number };
		await inStore(store.id, (tx) =>
			priceBook.update(tx, item.id, {
				data: { ...item.data, material: { ...material, priceCents: material.priceCents * 2 } }
			})
		);

		const kept = (await inStore(store.id, (tx) => quotes.read(tx, quote.id)))!;
		expect(kept.totalCents).toBe(quote.totalCents);
		expect(kept.input).toEqual(quote.input);
		expect(kept.result).toEqual(quote.result);

		const next = await inStore(store.id, (tx) => buildQuote(tx, job.id, store.owner.id));
		expect(next.ok && next.quote.version).toBe(2);
		expect(next.ok && next.quote.totalCents).toBeGreaterThan(quote.totalCents);
	});

	it('cannot be changed or deleted, even by a raw query', async () => {
		const store = await makeStore('Locked Floors');
		const { quote } = await makeQuotedJob(store);
		await inStore(store.id, (tx) =>
			sendQuote(tx, quote.id, {
				to: 'c@test.example',
				validDays: 30,
				actorId: store.owner.id
			})
		);
		await expect(
			asOwner(`update quote set total_cents = 1 where id = $1`, [store.id, quote.id])
		).rejects.toThrow(/frozen/);
		await expect(asOwner(`delete from quote where id = $1`, [store.id, quote.id])).rejects.toThrow(
			/kept for good/
		);
	});

	it('moves a draft job to quoted, and a newer sent version supersedes it', async () => {
		const store = await makeStore('Versions Floors');
		const { job, quote } = await makeQuotedJob(store);
		await inStore(store.id, (tx) =>
			sendQuote(tx, quote.id, {
				to: 'c@test.example',
				validDays: 30,
				actorId: store.owner.id
			})
		);
		expect(
			(await inStore(store.id, (tx) => jobs.readForViewer(tx, job.id, staff(store.owner.id))))
				?.status
		).toBe('quoted');
		const v2 = await inStore(store.id, (tx) => buildQuote(tx, job.id, store.owner.id));
		if (!v2.ok) throw new Error('v2');
		await inStore(store.id, (tx) =>
			sendQuote(tx, v2.quote.id, {
				to: 'c@test.example',
				validDays: 30,
				actorId: store.owner.id
			})
		);
		const statuses = (await inStore(store.id, (tx) => quotes.list(tx, job.id))).map((q) => [
			q.version,
			q.status
		]);
		expect(statuses).toEqual([
			[2, 'sent'],
			[1, 'superseded']
		]);
		expect((await inStore(store.id, (tx) => quotes.forCustomer(tx, job.id)))?.version).toBe(2);
	});
});

describe("the customer's answer", () => {
	it('accepts once, recording the name, and the job becomes accepted', async () => {
		const store = await makeStore('Accept Floors');
		const { job, quote } = await makeQuotedJob(store);
		await inStore(store.id, (tx) =>
			sendQuote(tx, quote.id, {
				to: 'c@test.example',
				validDays: 30,
				actorId: store.owner.id
			})
		);
		const signature = { name: 'Greta Oakhurst', ip: '203.0.113.7', userAgent: 'test' };
		const accepted = await inStore(store.id, (tx) => acceptQuote(tx, job.id, quote.id, signature));
		expect(accepted).toMatchObject({
			ok: true,
			quote: { status: 'accepted', acceptedName: 'Greta Oakhurst', acceptedIp: '203.0.113.7' }
		});
		expect(
			(await inStore(store.id, (tx) => jobs.readForViewer(tx, job.id, staff(store.owner.id))))
				?.status
		).toBe('accepted');
		expect(await inStore(store.id, (tx) => acceptQuote(tx, job.id, quote.id, signature))).toEqual({
			ok: false,
			reason: 'not_open'
		});
	});

	it('cannot accept a draft, an expired quote, or another job’s quote', async () => {
		const store = await makeStore('Late Floors');
		const { job, quote } = await makeQuotedJob(store);
		const signature = { name: 'A', ip: null, userAgent: null };
		expect(await inStore(store.id, (tx) => acceptQuote(tx, job.id, quote.id, signature))).toEqual({
			ok: false,
			reason: 'not_open'
		});
		await inStore(store.id, (tx) =>
			sendQuote(tx, quote.id, {
				to: 'c@test.example',
				validDays: 30,
				actorId: store.owner.id
			})
		);
		const other = await makeJob(store.id, store.owner.id);
		expect(await inStore(store.id, (tx) => acceptQuote(tx, other.id, quote.id, signature))).toEqual(
			{
				ok: false,
				reason: 'not_found'
			}
		);
		const expiredStore = await makeStore('Expired Floors');
		const expired = await makeQuotedJob(expiredStore);
		await inStore(expiredStore.id, (tx) =>
			sendQuote(tx, expired.quote.id, {
				to: 'c@test.example',
				validDays: 0,
				actorId: expiredStore.owner.id
			})
		);
		expect(
			await inStore(expiredStore.id, (tx) =>
				acceptQuote(tx, expired.job.id, expired.quote.id, signature)
			)
		).toEqual({ ok: false, reason: 'expired' });
	});

	it('asks for changes with a note; the job returns to draft for the next version', async () => {
		const store = await makeStore('Changes Floors');
		const { job, quote } = await makeQuotedJob(store);
		await inStore(store.id, (tx) =>
			sendQuote(tx, quote.id, {
				to: 'c@test.example',
				validDays: 30,
				actorId: store.owner.id
			})
		);
		const asked = await inStore(store.id, (tx) =>
			requestChanges(tx, job.id, quote.id, 'Oak in the hall instead')
		);
		expect(asked).toMatchObject({
			ok: true,
			quote: { status: 'changes_requested', changeNote: 'Oak in the hall instead' }
		});
		expect(
			(await inStore(store.id, (tx) => jobs.readForViewer(tx, job.id, staff(store.owner.id))))
				?.status
		).toBe('draft');
	});
});

describe('measures', () => {
	it('tell the later of two saves from the same version that the measure changed, and keep both', async () => {
		const store = await makeStore('Busy Measure Floors');
		const { floors } = await makePriceBook(store.id);
		const job = await makeJob(store.id, store.owner.id);
		const priya = { builtYear: '', rooms: [roomDraft('r1', 'Kitchen', floors['oak-7'])] };
		const jonah = { builtYear: '', rooms: [roomDraft('r1', 'Kitchen', floors['lvp-grey'], "14'")] };
		expect(
			await inStore(store.id, (tx) => measures.save(tx, job.id, priya, 0, store.owner.id))
		).toMatchObject({
			ok: true,
			version: 1
		});
		const late = await inStore(store.id, (tx) =>
			measures.save(tx, job.id, jonah, 0, store.owner.id)
		);
		expect(late).toMatchObject({
			ok: false,
			reason: 'conflict',
			current: { version: 1, draft: priya }
		});
		expect((await inStore(store.id, (tx) => measures.read(tx, job.id)))?.draft).toEqual(priya);
		expect(
			await inStore(store.id, (tx) => measures.save(tx, job.id, jonah, 1, store.owner.id))
		).toMatchObject({
			ok: true,
			version: 2
		});
	});
});

describe('across stores', () => {
	it("never reads, builds, sends or answers another store's quote or measure", async () => {
		const a = await makeStore('Alpha Quote Floors');
		const b = await makeStore('Beta Quote Floors');
		const theirs = await makeQuotedJob(b);
		expect(await inStore(a.id, (tx) => quotes.read(tx, theirs.quote.id))).toBeUndefined();
		expect(await inStore(a.id, (tx) => quotes.readVersion(tx, theirs.job.id, 1))).toBeUndefined();
		expect(await inStore(a.id, (tx) => quotes.list(tx, theirs.job.id))).toEqual([]);
		expect(await inStore(a.id, (tx) => buildQuote(tx, theirs.job.id, a.owner.id))).toEqual({
			ok: false,
			reason: 'no_measure'
		});
		expect(
			await inStore(a.id, (tx) =>
				sendQuote(tx, theirs.quote.id, {
					to: 'x@test.example',
					validDays: 30,
					actorId: a.owner.id
				})
			)
		).toEqual({
			ok: false,
			reason: 'not_found'
		});
		const signature = { name: 'X', ip: null, userAgent: null };
		expect(
			await inStore(a.id, (tx) => acceptQuote(tx, theirs.job.id, theirs.quote.id, signature))
		).toEqual({
			ok: false,
			reason: 'not_found'
		});
		expect(await inStore(a.id, (tx) => measures.read(tx, theirs.job.id))).toBeUndefined();
		expect(
			await inStore(a.id, (tx) => measures.save(tx, theirs.job.id, theirs.draft, 1, a.owner.id))
		).toEqual({
			ok: false,
			reason: 'not_found'
		});
		expect(await inStore(a.id, (tx) => priceBook.read(tx, theirs.floors['oak-7']))).toBeUndefined();
	});
});
