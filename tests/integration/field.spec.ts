// The installer's phone, through the app as a browser reaches it: only assigned jobs, a work
// order with no price in it, check-in, items sent (and resent) by the phone's outbox, two phones
// merged by item, the report submitted once, and the job marked complete.
import * as fieldQueries from '$lib/server/db/queries/field';
import * as jobs from '$lib/server/db/queries/jobs';
import { addDays } from '$lib/schedule/days';
import { MAX_BOOKING_DAYS } from '$lib/schemas/crew';
import {
	booking,
	changeOrder,
	customer,
	fieldItem,
	fieldPhoto,
	fieldReport,
	jobCompletion,
	task
} from '$lib/server/db/schema';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { readWorkOrder } from '$lib/server/field/work-order';
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type App, type Visitor } from './app-server';
import { makePaidJob, makeStore, type TestStore } from './factories';
import { clientId, makeInstaller } from './field-factories';
import { makeBookedJob } from './field-jobs';

let app: App;
let store: TestStore;
let booked: Awaited<ReturnType<typeof makeBookedJob>>;
let unassigned: Awaited<ReturnType<typeof makePaidJob>>;
let installer: Visitor;
let other: Visitor;
let owner: Visitor;

beforeAll(async () => {
	app = await startApp();
	store = await makeStore('Quillmoor Floors');
	booked = await makeBookedJob(store);
	unassigned = await makePaidJob(store);
	const second = await makeInstaller(store);
	installer = await app.signIn(booked.installer.user.email);
	other = await app.signIn(second.user.email);
	owner = await app.signIn(store.owner.email);
	await installer.page('/field');
}, 240_000);

afterAll(async () => {
	await app?.close();
});

/** Every key anywhere in a value, with its value. */
function entries(value: unknown, out: [string, unknown][] = []): [string, unknown][] {
	if (Array.isArray(value)) for (const v of value) entries(v, out);
	else if (value && typeof value === 'object') {
		for (const [k, v] of Object.entries(value)) {
			out.push([k, v]);
			entries(v, out);
		}
	}
	return out;
}

/** Keys of money the installer must never get (their own pay is not on a work order either). */
const MONEY_KEY = /cents|price|cost|margin|pay|total|amount|fee/i;

function data(page: Awaited<ReturnType<Visitor['page']>>) {
	if (page.kind !== 'data') throw new Error(`expected data, got ${JSON.stringify(page)}`);
	return page.data;
}

const at = () => new Date().toISOString();

function send(who: Visitor, jobId: string, items: unknown[]) {
	return who.request(`/api/v1/field/jobs/${jobId}/items`, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ items })
	});
}

describe('what an installer sees', () => {
	it('lists only the jobs booked for them, today first', async () => {
		const mine = data(await installer.page('/field')) as {
			todays: { jobId: string }[];
			open: { id: string }[];
		};
		expect(mine.todays.map((b) => b.jobId)).toEqual([booked.job.id]);
		expect(mine.open.map((j) => j.id)).not.toContain(unassigned.job.id);
		const theirs = data(await other.page('/field')) as { todays: unknown[]; open: unknown[] };
		expect(theirs.todays).toEqual([]);
		expect(theirs.open).toEqual([]);
	});

	// The query is written so that no estimate can make it read an installer's whole history
	// (bench/README.md): its bound on the first day must keep every booking still running.
	it("lists an installer's live bookings not yet over, the longest one too, and no other", async () => {
		const today = new Date().toISOString().slice(0, 10);
		const who = await makeInstaller(store);
		const longest = await makeBookedJob(store, who, addDays(today, 1 - MAX_BOOKING_DAYS), 60);
		await makeBookedJob(store, who, addDays(today, -MAX_BOOKING_DAYS), 60); // ended yesterday
		const later = await makeBookedJob(store, who, addDays(today, 5), 3);
		const handedOn = await makeBookedJob(store, who, today, 1);
		const cancelled = await makeBookedJob(store, who, addDays(today, 1), 1);
		await inStore(store.id, async (tx) => {
			const next = await makeInstaller(store);
			expect(await jobs.assign(tx, handedOn.job.id, next.user.id, store.owner.id)).toBe('assigned');
			await tx
				.update(booking)
				.set({ cancelledAt: new Date() })
				.where(and(eq(booking.organizationId, store.id), eq(booking.jobId, cancelled.job.id)));
		});
		const listed = await readInStore(store.id, (tx) =>
			fieldQueries.listBookingsFor(tx, who.user.id, today)
		);
		expect(listed.map((b) => [b.jobId, b.startsOn, b.endsOn])).toEqual([
			[longest.job.id, addDays(today, 1 - MAX_BOOKING_DAYS), today],
			[later.job.id, addDays(today, 5), addDays(today, 7)]
		]);
	});

	it('answers 404 for a job not assigned to them, on the page, the PDF and the API', async () => {
		expect(await installer.page(`/field/jobs/${unassigned.job.id}`)).toMatchObject({
			kind: 'error',
			status: 404
		});
		expect((await other.request(`/field/jobs/${booked.job.id}/work-order.pdf`)).status).toBe(404);
		expect((await send(other, booked.job.id, [])).status).toBe(404);
	});

	it('gives the work order with rooms, materials, prep in order and cautions, and no price', async () => {
		const page = data(await installer.page(`/field/jobs/${booked.job.id}`));
		const order = page.order as Awaited<ReturnType<typeof readWorkOrder>>;
		expect(order!.site!.address).toBe('9 Test Lane');
		expect(order!.booking!.notes).toBe('Key under the blue pot');
		expect(order!.rooms[0]).toMatchObject({ id: 'r1', name: 'Kitchen' });
		expect(order!.rooms[0].outline).toBeDefined();
		expect(order!.materials.length).toBeGreaterThan(0);
		expect(order!.cautions.some((c) => /asbestos/i.test(c))).toBe(true);
		// The steps keep the engine's order of work.
		const keys = order!.steps.map((s) => s.key);
		expect(keys.indexOf('install')).toBeGreaterThan(-1);
		for (const [k, v] of entries(page)) {
			if (MONEY_KEY.test(k) && typeof v === 'number') throw new Error(`${k}: ${v} in page data`);
		}
		expect(JSON.stringify(page)).not.toMatch(/\$\s?\d/);
	});

	it('prints the same work order as a PDF to the installer and to the desk', async () => {
		for (const [who, path] of [
			[installer, `/field/jobs/${booked.job.id}/work-order.pdf`],
			[owner, `/app/jobs/${booked.job.id}/work-order.pdf`]
		] as const) {
			const answer = await who.request(path);
			expect(answer.status).toBe(200);
			expect(answer.text.startsWith('%PDF-')).toBe(true);
		}
		// What the PDF is drawn from carries no figure of money at all.
		const order = await readInStore(store.id, (tx) =>
			readWorkOrder(tx, booked.job.id, { kind: 'assigned', userId: booked.installer.user.id })
		);
		for (const [k, v] of entries(order))
			if (MONEY_KEY.test(k) && typeof v === 'number') throw new Error(`${k}: ${v} in the PDF`);
	});
});

describe('the report from the phone', () => {
	const hole = clientId();

	it('refuses items before check-in, then checks in and starts the job', async () => {
		expect((await send(installer, booked.job.id, [note(clientId(), 'early')])).status).toBe(409);
		const answer = await installer.action(`/field/jobs/${booked.job.id}?/checkIn`, {});
		expect(answer.status).toBe(200);
		const page = data(await installer.page(`/field/jobs/${booked.job.id}`)) as {
			order: { job: { status: string } };
		};
		expect(page.order.job.status).toBe('in_progress');
		// A second check-in (the next day) keeps the one report.
		await installer.action(`/field/jobs/${booked.job.id}?/checkIn`, {});
		const reports = await readInStore(store.id, (tx) =>
			tx.select().from(fieldReport).where(eq(fieldReport.jobId, booked.job.id))
		);
		expect(reports).toHaveLength(1);
	});

	it('stores an item once however often the phone sends it', async () => {
		const item = {
			clientId: hole,
			kind: 'found',
			roomId: 'r1',
			refKey: 'prep:hole_repair',
			qty: 2,
			note: 'Rot by the sink',
			recordedAt: at()
		};
		const first = await send(installer, booked.job.id, [item]);
		expect(first.status).toBe(200);
		expect(first.json()).toMatchObject({
			items: [{ clientId: hole, status: 'stored', item: { qty: 2, unit: 'each', version: 1 } }]
		});
		const again = await send(installer, booked.job.id, [item]);
		expect(again.json()).toMatchObject({ items: [{ status: 'unchanged' }] });
		const rows = await readInStore(store.id, (tx) =>
			tx.select().from(fieldItem).where(eq(fieldItem.clientId, hole))
		);
		expect(rows).toHaveLength(1);
	});

	it('merges two phones by item: a stale edit comes back as a conflict, never applied', async () => {
		// Phone A edits from version 1: applied, version 2.
		const a = await send(installer, booked.job.id, [
			{
				clientId: hole,
				kind: 'found',
				roomId: 'r1',
				refKey: 'prep:hole_repair',
				qty: 3,
				baseVersion: 1,
				recordedAt: at()
			}
		]);
		expect(a.json()).toMatchObject({
			items: [{ status: 'updated', item: { qty: 3, version: 2 } }]
		});
		// Phone B still thinks version 1 and says 5: refused with the stored 3 to merge.
		const b = await send(installer, booked.job.id, [
			{
				clientId: hole,
				kind: 'found',
				roomId: 'r1',
				refKey: 'prep:hole_repair',
				qty: 5,
				baseVersion: 1,
				recordedAt: at()
			}
		]);
		expect(b.json()).toMatchObject({
			items: [{ status: 'conflict', item: { qty: 3, version: 2 } }]
		});
		// Phone B's own new item for the same room and item merges with A's, not beside it.
		const dup = await send(installer, booked.job.id, [
			{
				clientId: clientId(),
				kind: 'found',
				roomId: 'r1',
				refKey: 'prep:hole_repair',
				qty: 1,
				recordedAt: at()
			}
		]);
		expect(dup.json()).toMatchObject({ items: [{ status: 'conflict', item: { clientId: hole } }] });
		// B keeps its own amount on top of version 2.
		const kept = await send(installer, booked.job.id, [
			{
				clientId: hole,
				kind: 'found',
				roomId: 'r1',
				refKey: 'prep:hole_repair',
				qty: 5,
				baseVersion: 2,
				recordedAt: at()
			}
		]);
		expect(kept.json()).toMatchObject({
			items: [{ status: 'updated', item: { qty: 5, version: 3 } }]
		});
	});

	it('takes readings and notes, and refuses what the quote does not have', async () => {
		const answer = await send(installer, booked.job.id, [
			{
				clientId: clientId(),
				kind: 'reading',
				roomId: 'r1',
				readingKind: 'flatness',
				reading: { spanIn: 120, gapIn: 0.25, kind: 'low' },
				recordedAt: at()
			},
			note(clientId(), 'Old vinyl under the carpet'),
			{
				clientId: clientId(),
				kind: 'found',
				roomId: 'r1',
				refKey: 'prep:nonsense',
				qty: 1,
				recordedAt: at()
			},
			{
				clientId: clientId(),
				kind: 'found',
				roomId: 'no-room',
				refKey: 'prep:hole_repair',
				qty: 1,
				recordedAt: at()
			}
		]);
		const statuses = (answer.json() as { items: { status: string }[] }).items.map((i) => i.status);
		expect(statuses).toEqual(['stored', 'stored', 'refused', 'refused']);
		const bad = await send(installer, booked.job.id, [
			{
				clientId: 'x',
				kind: 'found',
				roomId: 'r1',
				refKey: 'prep:hole_repair',
				qty: -1,
				recordedAt: at()
			}
		]);
		expect(bad.status).toBe(400);
		expect(JSON.stringify(bad.json())).toMatch(/items\.0\.(clientId|qty)/);
	});

	it('records without JavaScript by form: the same form twice is one edit', async () => {
		const fields = {
			clientId: clientId(),
			roomId: 'r1',
			refKey: 'prep:hole_repair',
			amount: '6',
			note: 'Counted again'
		};
		for (let i = 0; i < 2; i++) {
			const answer = await installer.action(`/field/jobs/${booked.job.id}?/record`, fields);
			expect(answer.status).toBe(200);
			expect(answer.text).not.toMatch(/"type":"failure"/);
		}
		const live = await readInStore(store.id, (tx) =>
			tx
				.select()
				.from(fieldItem)
				.where(and(eq(fieldItem.refKey, 'prep:hole_repair'), eq(fieldItem.roomId, 'r1')))
		);
		// The amount found already recorded for the room and item is edited, not doubled.
		expect(live.map((r) => [r.clientId, r.qty])).toEqual([[hole, 6]]);
		const bad = await installer.action(`/field/jobs/${booked.job.id}?/record`, {
			...fields,
			amount: '0,5'
		});
		expect(bad.text).toMatch(/"type":"failure","status":400/);
		expect(bad.text).toMatch(/amount/);
	});

	it('submits the report once however often it is sent', async () => {
		for (let i = 0; i < 2; i++) {
			const answer = await installer.action(`/field/jobs/${booked.job.id}?/submit`, {});
			expect(answer.status).toBe(200);
		}
		const reports = await readInStore(store.id, (tx) =>
			tx.select().from(fieldReport).where(eq(fieldReport.jobId, booked.job.id))
		);
		expect(reports).toHaveLength(1);
		expect(reports[0].submittedAt).not.toBeNull();
		// What was found beyond what was sold became one change order for the store's review,
		// in the submission's transaction; sending twice did not make a second.
		const made = await readInStore(store.id, (tx) =>
			tx.select().from(changeOrder).where(eq(changeOrder.jobId, booked.job.id))
		);
		expect(made.map((c) => [c.number, c.status])).toEqual([[1, 'submitted']]);
		const page = data(await installer.page(`/field/jobs/${booked.job.id}`));
		expect(page.decisions).toEqual([expect.objectContaining({ number: 1, status: 'submitted' })]);
		// The installer's own pay difference, and no price of the change order.
		expect(Object.keys((page.decisions as object[])[0]).sort()).toEqual([
			'currency',
			'number',
			'payDeltaCents',
			'status'
		]);
	});

	it('marks the job complete only with a completion photo, once', async () => {
		const refused = await installer.action(`/field/jobs/${booked.job.id}?/complete`, {
			walkthroughNotes: 'Customer walked it with me'
		});
		expect(refused.text).toMatch(/photo of the finished floor/);
		const photo = await sharp({
			create: { width: 64, height: 48, channels: 3, background: '#a9652c' }
		})
			.jpeg()
			.toBuffer();
		const form = new FormData();
		form.set('file', new Blob([new Uint8Array(photo)], { type: 'image/jpeg' }), 'done.jpg');
		form.set('clientId', clientId());
		form.set('purpose', 'completion');
		expect(
			(
				await installer.request(`/api/v1/field/jobs/${booked.job.id}/photos`, {
					method: 'POST',
					body: form
				})
			).status
		).toBe(201);
		// A customer with an e-mail address, to be asked for the balance.
		await inStore(store.id, (tx) =>
			tx
				.update(customer)
				.set({ email: 'ada.brook@test.example' })
				.where(eq(customer.id, booked.customer.id))
		);
		for (let i = 0; i < 2; i++) {
			const done = await installer.action(`/field/jobs/${booked.job.id}?/complete`, {
				walkthroughNotes: 'Customer walked it with me'
			});
			expect(done.status).toBe(200);
			expect(done.text).not.toMatch(/cannot be marked/);
		}
		const [rows, photos] = await readInStore(store.id, async (tx) => [
			await tx.select().from(jobCompletion).where(eq(jobCompletion.jobId, booked.job.id)),
			await tx
				.select()
				.from(fieldPhoto)
				.where(and(eq(fieldPhoto.jobId, booked.job.id), eq(fieldPhoto.purpose, 'completion')))
		]);
		expect(rows).toHaveLength(1);
		expect(rows[0].walkthroughNotes).toBe('Customer walked it with me');
		expect(photos).toHaveLength(1);
		const page = data(await installer.page(`/field/jobs/${booked.job.id}`)) as {
			order: { job: { status: string } };
		};
		expect(page.order.job.status).toBe('completed');
		// The customer was asked for the balance, once, in the completion's transaction.
		const asked = await readInStore(store.id, (tx) =>
			tx
				.select({ payload: task.payload })
				.from(task)
				.where(and(eq(task.jobId, booked.job.id), eq(task.kind, 'mail')))
		);
		expect(asked.filter((t) => t.payload.purpose === 'balance-request')).toHaveLength(1);
		// Nothing more is recorded on a completed job.
		expect((await send(installer, booked.job.id, [note(clientId(), 'late')])).status).toBe(409);
	});
});

function note(id: string, text: string) {
	return { clientId: id, kind: 'note', roomId: null, note: text, recordedAt: at() };
}
