// Installers, the schedule and its e-mails, against the real database: the engine's proposal
// kept with a booking, warnings for a second booking, a day off and time away, the job moved to
// scheduled and back, the calendar file (parsed) with the booking's id and version, and the
// e-mails queued in the booking's own transaction (a rollback queues nothing).
import * as installers from '$lib/server/db/queries/installers';
import * as jobs from '$lib/server/db/queries/jobs';
import * as stores from '$lib/server/db/queries/stores';
import { booking, customer, task } from '$lib/server/db/schema';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { bookJob, cancelBooking, moveBooking, propose } from '$lib/server/schedule/book';
import { bookingCalendar } from '$lib/server/schedule/calendar';
import { attachmentText, readOutbox } from '$mocks/outbox';
import { resendHandlers } from '$mocks/resend';
import { and, eq } from 'drizzle-orm';
import { setupServer } from 'msw/node';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { addMember, makePaidJob, makeStore, type TestStore } from './factories';
import { makeInstaller } from './field-factories';
import { testMailer } from './task-worker';

/** RFC 5545 content lines, unfolded, as name (with parameters) → value, for the VEVENT. */
function parseIcs(text: string) {
	const lines = text
		.replace(/\r\n[ \t]/g, '')
		.split(/\r?\n/)
		.filter(Boolean);
	const event: Record<string, string> = {};
	const calendar: Record<string, string> = {};
	let inEvent = false;
	for (const line of lines) {
		if (line === 'BEGIN:VEVENT') inEvent = true;
		else if (line === 'END:VEVENT') inEvent = false;
		const at = line.indexOf(':');
		const name = line.slice(0, at);
		(inEvent ? event : calendar)[name] = line.slice(at + 1);
	}
	return { calendar, event };
}

interface QueuedMail {
	purpose: string;
	mail: {
		to: string;
		subject: string;
		text: string;
		attachments?: { filename: string; contentType: string; content: string }[];
	};
}

async function mailsOf(storeId: string, jobId: string): Promise<QueuedMail[]> {
	const rows = await readInStore(storeId, (tx) =>
		tx
			.select()
			.from(task)
			.where(and(eq(task.organizationId, storeId), eq(task.jobId, jobId), eq(task.kind, 'mail')))
			.orderBy(task.createdAt)
	);
	return rows
		.map((r) => r.payload as unknown as QueuedMail)
		.filter((p) => p.purpose.startsWith('booking'));
}

let store: TestStore;
const actor = () => ({ id: store.owner.id, storeName: store.name });

beforeAll(async () => {
	store = await makeStore('Quillmoor Floors');
	await inStore(store.id, (tx) => stores.saveTimeZone(tx, 'America/Chicago'));
});

async function soldJob(email = 'ada.customer@test.example') {
	const made = await makePaidJob(store);
	await inStore(store.id, (tx) =>
		tx
			.update(customer)
			.set({ email })
			.where(and(eq(customer.organizationId, store.id), eq(customer.id, made.customer.id)))
	);
	const status = await readInStore(
		store.id,
		async (tx) => (await jobs.readForStore(tx, made.job.id))!.status
	);
	expect(status).toBe('sold');
	return made;
}

describe('the calendar file through the e-mail fake', () => {
	it('arrives as an attachment the outbox can show', async () => {
		const dir = mkdtempSync(path.join(tmpdir(), 'crew-outbox-'));
		const server = setupServer(...resendHandlers(dir));
		server.listen({ onUnhandledRequest: 'error' });
		try {
			const calendar = bookingCalendar({
				id: 'booking-1',
				version: 3,
				startsOn: '2027-01-30',
				days: 3,
				title: 'J-1001 Kitchen',
				description: 'Key with the neighbour',
				location: '4 Tansy Row, Millbrook',
				storeName: 'Quillmoor Floors'
			});
			await testMailer({
				to: 'fitter@test.example',
				subject: 'Booked',
				html: '<p>Booked</p>',
				text: 'Booked',
				attachments: [{ filename: 'install.ics', contentType: 'text/calendar', content: calendar }]
			});
			const [sent] = readOutbox(dir);
			expect(sent.attachments).toHaveLength(1);
			const file = sent.attachments![0];
			expect(file).toMatchObject({ filename: 'install.ics', contentType: 'text/calendar' });
			const { event } = parseIcs(attachmentText(file));
			// Three days from 30 January: the 30th, 31st and 1 February; DTEND is the day after.
			expect(event).toMatchObject({
				UID: 'booking-1',
				SEQUENCE: '3',
				'DTSTART;VALUE=DATE': '20270130',
				'DTEND;VALUE=DATE': '20270202',
				LOCATION: '4 Tansy Row\\, Millbrook'
			});
		} finally {
			server.close();
		}
	});
});

describe('installer profiles', () => {
	it('are made for the store’s installers on first open, and only for them', async () => {
		const fitter = await addMember(store.id, 'installer', 'Odo Fitter');
		await addMember(store.id, 'sales', 'Pim Seller');
		const made = await inStore(store.id, (tx) => installers.ensureProfiles(tx));
		expect(made).toBeGreaterThanOrEqual(1);
		const list = await readInStore(store.id, installers.list);
		const odo = list.find((i) => i.userId === fitter.id);
		expect(odo?.profile).toMatchObject({ crewSize: 1, payRates: [], daysOff: [] });
		expect(list.some((i) => i.name === 'Pim Seller')).toBe(false);
		// A second open makes nothing more.
		expect(await inStore(store.id, (tx) => installers.ensureProfiles(tx))).toBe(0);
	});

	it('are the store’s own: another store cannot read one', async () => {
		const { user } = await makeInstaller(store);
		const other = await makeStore('Elsewhere Tile');
		expect(await readInStore(other.id, (tx) => installers.read(tx, user.id))).toBeUndefined();
		expect(await readInStore(store.id, (tx) => installers.read(tx, user.id))).toBeDefined();
	});
});

describe('booking', () => {
	it('proposes days from the engine with the installer’s own output', async () => {
		const made = await soldJob();
		const { user } = await makeInstaller(store);
		const fast = await addMember(store.id, 'installer', 'Slow Sam');
		await inStore(store.id, (tx) =>
			installers.save(tx, fast.id, {
				crewSize: 1,
				floorKinds: ['vinyl_plank'],
				// A crew this slow needs more days than the store's default output.
				sqFtPerDay: { vinyl_plank: 20, laminate: 20, engineered_wood: 20, hardwood: 20 },
				payRates: [],
				daysOff: [],
				phone: '',
				notes: ''
			})
		);
		const [normal, slow] = await readInStore(store.id, async (tx) => [
			await propose(tx, made.job.id, user.id),
			await propose(tx, made.job.id, fast.id)
		]);
		expect(normal!.days).toBeGreaterThanOrEqual(1);
		expect(normal!.schedule.steps.length).toBeGreaterThan(0);
		expect(slow!.days).toBeGreaterThan(normal!.days);
	});

	it('books a sold job: scheduled, assigned, the proposal kept, two e-mails with the calendar file', async () => {
		const made = await soldJob('bea.customer@test.example');
		const { user } = await makeInstaller(store);
		const result = await inStore(store.id, (tx) =>
			bookJob(
				tx,
				made.job.id,
				{
					installerId: user.id,
					startsOn: '2027-02-01',
					days: null,
					arrivesAt: '08:30',
					notes: 'Key under the mat'
				},
				actor()
			)
		);
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		const after = await readInStore(store.id, async (tx) => ({
			job: await jobs.readForStore(tx, made.job.id),
			row: (await tx.select().from(booking).where(eq(booking.id, result.bookingId)))[0]
		}));
		expect(after.job).toMatchObject({ status: 'scheduled', installerId: user.id });
		expect(after.row.proposedDays).toBe(result.days);
		expect(after.row.proposal.steps.length).toBeGreaterThan(0);
		expect(after.row.version).toBe(1);

		const mails = await mailsOf(store.id, made.job.id);
		expect(mails.map((m) => m.mail.to).sort()).toEqual(
			['bea.customer@test.example', user.email].sort()
		);
		for (const m of mails) {
			const file = m.mail.attachments?.[0];
			expect(file).toMatchObject({ filename: 'install.ics', contentType: 'text/calendar' });
			const { calendar, event } = parseIcs(file!.content);
			expect(calendar.METHOD).toBe('REQUEST');
			expect(event.UID).toBe(result.bookingId);
			expect(event.SEQUENCE).toBe('1');
			expect(event['DTSTART;VALUE=DATE']).toBe('20270201');
			// All-day events end the day after the last day.
			const end = new Date(Date.UTC(2027, 1, 1 + result.days))
				.toISOString()
				.slice(0, 10)
				.replace(/-/g, '');
			expect(event['DTEND;VALUE=DATE']).toBe(end);
		}
		// The customer's e-mail tells the days; neither tells a price.
		const toCustomer = mails.find((m) => m.mail.to === 'bea.customer@test.example')!;
		expect(toCustomer.mail.text).toContain('February 1, 2027');
		for (const m of mails) expect(m.mail.text).not.toMatch(/\$\d/);
	});

	it('warns (and still books) on a second booking, a weekday off and time away', async () => {
		const first = await soldJob();
		const second = await soldJob();
		// Sundays off (the factory's profile).
		const { user } = await makeInstaller(store);
		await inStore(store.id, (tx) =>
			installers.addTimeOff(
				tx,
				{ installerId: user.id, startsOn: '2027-03-03', endsOn: '2027-03-03', note: 'Course' },
				store.owner.id
			)
		);
		const one = await inStore(store.id, (tx) =>
			bookJob(
				tx,
				first.job.id,
				{ installerId: user.id, startsOn: '2027-03-01', days: 1, arrivesAt: null, notes: '' },
				actor()
			)
		);
		expect(one).toMatchObject({ ok: true, warnings: [] });
		// Mon 1 to Sun 7 March: J-first on the 1st, away on the 3rd, Sunday the 7th off.
		const two = await inStore(store.id, (tx) =>
			bookJob(
				tx,
				second.job.id,
				{ installerId: user.id, startsOn: '2027-03-01', days: 7, arrivesAt: null, notes: '' },
				actor()
			)
		);
		expect(two.ok).toBe(true);
		if (!two.ok) return;
		expect(two.warnings).toEqual([
			{ kind: 'double', day: '2027-03-01', jobLabel: `J-${first.job.number}` },
			{ kind: 'away', day: '2027-03-03', note: 'Course' },
			{ kind: 'day_off', day: '2027-03-07' }
		]);
	});

	it('moves a booking: the version rises, the old installer gets the cancellation', async () => {
		const made = await soldJob('cy.customer@test.example');
		const a = (await makeInstaller(store)).user;
		const b = (await makeInstaller(store)).user;
		const booked = await inStore(store.id, (tx) =>
			bookJob(
				tx,
				made.job.id,
				{ installerId: a.id, startsOn: '2027-04-05', days: 2, arrivesAt: null, notes: '' },
				actor()
			)
		);
		if (!booked.ok) throw new Error('not booked');
		const moved = await inStore(store.id, (tx) =>
			moveBooking(
				tx,
				booked.bookingId,
				{ installerId: b.id, startsOn: '2027-04-12', days: 3, arrivesAt: null, notes: '' },
				actor()
			)
		);
		expect(moved).toMatchObject({ ok: true, bookingId: booked.bookingId, days: 3 });
		const job = await readInStore(store.id, (tx) => jobs.readForStore(tx, made.job.id));
		expect(job?.installerId).toBe(b.id);
		const mails = (await mailsOf(store.id, made.job.id)).slice(2);
		const cancelA = mails.find((m) => m.mail.to === a.email)!;
		expect(cancelA.purpose).toBe('booking-cancelled');
		expect(parseIcs(cancelA.mail.attachments![0].content).calendar.METHOD).toBe('CANCEL');
		const toB = parseIcs(mails.find((m) => m.mail.to === b.email)!.mail.attachments![0].content);
		expect(toB.event).toMatchObject({
			UID: booked.bookingId,
			SEQUENCE: '2',
			'DTSTART;VALUE=DATE': '20270412',
			'DTEND;VALUE=DATE': '20270415'
		});
		expect(
			mails.some((m) => m.mail.to === 'cy.customer@test.example' && m.purpose === 'booking')
		).toBe(true);
	});

	it('cancels a booking: the job returns to sold and nobody, and the cancellation is sent', async () => {
		const made = await soldJob('di.customer@test.example');
		const { user } = await makeInstaller(store);
		const booked = await inStore(store.id, (tx) =>
			bookJob(
				tx,
				made.job.id,
				{ installerId: user.id, startsOn: '2027-05-03', days: 1, arrivesAt: null, notes: '' },
				actor()
			)
		);
		if (!booked.ok) throw new Error('not booked');
		const cancelled = await inStore(store.id, (tx) => cancelBooking(tx, booked.bookingId, actor()));
		expect(cancelled.ok).toBe(true);
		const job = await readInStore(store.id, (tx) => jobs.readForStore(tx, made.job.id));
		expect(job).toMatchObject({ status: 'sold', installerId: null });
		const last = (await mailsOf(store.id, made.job.id)).slice(2);
		expect(last).toHaveLength(2);
		for (const m of last) {
			const { calendar, event } = parseIcs(m.mail.attachments![0].content);
			expect(calendar.METHOD).toBe('CANCEL');
			expect(event).toMatchObject({ UID: booked.bookingId, STATUS: 'CANCELLED', SEQUENCE: '2' });
		}
		// Cancelled twice: the booking is no longer live.
		expect(await inStore(store.id, (tx) => cancelBooking(tx, booked.bookingId, actor()))).toEqual({
			ok: false,
			reason: 'not_found'
		});
		// A cancelled job can be booked again.
		const again = await inStore(store.id, (tx) =>
			bookJob(
				tx,
				made.job.id,
				{ installerId: user.id, startsOn: '2027-05-10', days: 1, arrivesAt: null, notes: '' },
				actor()
			)
		);
		expect(again.ok).toBe(true);
	});

	it('queues nothing and books nothing when its transaction rolls back', async () => {
		const made = await soldJob('eve.customer@test.example');
		const { user } = await makeInstaller(store);
		await expect(
			inStore(store.id, async (tx) => {
				const r = await bookJob(
					tx,
					made.job.id,
					{ installerId: user.id, startsOn: '2027-06-01', days: 1, arrivesAt: null, notes: '' },
					actor()
				);
				expect(r.ok).toBe(true);
				const queued = await mailsOfIn(tx, made.job.id);
				expect(queued.length).toBe(2);
				throw new Error('the rest of the unit of work failed');
			})
		).rejects.toThrow('the rest of the unit of work failed');
		expect(await mailsOf(store.id, made.job.id)).toEqual([]);
		const job = await readInStore(store.id, (tx) => jobs.readForStore(tx, made.job.id));
		expect(job?.status).toBe('sold');
		const count = await readInStore(store.id, async (tx) => await jobs.isBooked(tx, made.job.id));
		expect(count).toBe(false);
	});

	it('refuses a job that cannot be booked, a non-installer and another store’s job', async () => {
		const made = await soldJob();
		const seller = await addMember(store.id, 'sales', 'Quin Seller');
		const r = await inStore(store.id, (tx) =>
			bookJob(
				tx,
				made.job.id,
				{ installerId: seller.id, startsOn: '2027-06-01', days: 1, arrivesAt: null, notes: '' },
				actor()
			)
		);
		expect(r).toMatchObject({ ok: false, reason: 'refused', field: 'installerId' });
		const other = await makeStore('Faraway Floors');
		const { user } = await makeInstaller(other);
		const cross = await inStore(other.id, (tx) =>
			bookJob(
				tx,
				made.job.id,
				{ installerId: user.id, startsOn: '2027-06-01', days: 1, arrivesAt: null, notes: '' },
				{ id: other.owner.id, storeName: other.name }
			)
		);
		expect(cross).toEqual({ ok: false, reason: 'not_found' });
	});
});

async function mailsOfIn(tx: Parameters<Parameters<typeof inStore>[1]>[0], jobId: string) {
	const rows = await tx
		.select()
		.from(task)
		.where(and(eq(task.jobId, jobId), eq(task.kind, 'mail')));
	return rows.filter((r) => String(r.payload.purpose).startsWith('booking'));
}
