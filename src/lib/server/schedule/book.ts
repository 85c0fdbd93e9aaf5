import { estimate } from '$lib/estimating';
import type { Schedule } from '$lib/estimating/schedule';
import { canBook, jobLabel } from '$lib/jobs/status';
import { addDays, bookingWarnings, type BookingWarning } from '$lib/schedule/days';
import * as bookings from '../db/queries/bookings';
import * as installers from '../db/queries/installers';
import * as jobs from '../db/queries/jobs';
import * as quotes from '../db/queries/quotes';
import type { StoreTx, StoreWriteTx } from '../db/tenant';
import { moveByHand } from '../jobs/move';
import { log } from '../log';
import { queueMail } from '../mail/queue';
import {
	customerBookingMail,
	installerBookingMail,
	type BookingChange,
	type BookingMailFacts
} from './mail';

export interface Proposal {
	days: number;
	schedule: Schedule;
}

/**
 * The days the engine proposes for a job done by this installer: the accepted quote's measure
 * and prep through `estimate()` again, with the installer's own ft² per day (by floor kind) in
 * place of the store's where their profile has it. Its `schedule` keeps the work steps, hours
 * and cure and test waits, so "why 3 days" can be shown. Undefined without an accepted quote.
 */
export async function propose(
	tx: StoreTx,
	jobId: string,
	installerId: string | null
): Promise<Proposal | undefined> {
	const q = await quotes.accepted(tx, jobId);
	if (!q) return undefined;
	const own = installerId
		? (await installers.read(tx, installerId))?.profile?.sqFtPerDay
		: undefined;
	let sched = q.result.schedule;
	if (own && Object.keys(own).length) {
		const s = q.input.settings;
		const result = estimate({
			...q.input,
			settings: {
				...s,
				schedule: { ...s.schedule, crewSqFtPerDay: { ...s.schedule.crewSqFtPerDay, ...own } }
			}
		});
		if (result.ok) sched = result.schedule;
		else log.warn({ jobId }, 'Re-estimating for the installer failed; the quote’s days are used');
	}
	return { days: Math.max(1, sched.days), schedule: sched };
}

/** What is wrong with these days for this installer (warnings, not refusals). */
export async function warningsFor(
	tx: StoreTx,
	input: { jobId: string; installerId: string; startsOn: string; days: number }
): Promise<BookingWarning[]> {
	const to = addDays(input.startsOn, input.days - 1);
	const [who, others, away] = [
		await installers.read(tx, input.installerId),
		await bookings.othersOf(tx, input.installerId, input.startsOn, to, input.jobId),
		await installers.listTimeOff(tx, { from: input.startsOn, to, installerId: input.installerId })
	];
	return bookingWarnings(
		{ startsOn: input.startsOn, days: input.days },
		{
			others: others.map((o) => ({ ...o, jobLabel: jobLabel(o.jobNumber) })),
			daysOff: who?.profile?.daysOff ?? [],
			timeOff: away
		}
	);
}

export interface BookingInput {
	installerId: string;
	startsOn: string;
	/** Days booked; none takes the engine's proposal. */
	days: number | null;
	arrivesAt: string | null;
	notes: string;
}

export type BookingResult =
	| { ok: true; bookingId: string; days: number; warnings: BookingWarning[] }
	| { ok: false; reason: 'not_found' }
	| { ok: false; reason: 'refused'; field?: string; message: string };

interface Actor {
	id: string;
	storeName: string;
	/** The app's origin, for the installer's link to the job (none: the e-mail has no link). */
	origin?: string;
}

const refused = (message: string, field?: string): BookingResult => ({
	ok: false,
	reason: 'refused',
	message,
	field
});

/** Queues the installer's and the customer's e-mail, each with its calendar file. */
async function tell(
	tx: StoreWriteTx,
	row: bookings.Booking,
	change: BookingChange,
	actor: Actor,
	only: 'both' | 'installer' = 'both'
) {
	const facts = await bookings.mailFacts(tx, row.jobId);
	const person = await installers.read(tx, row.installerId);
	if (!facts) return;
	const f: BookingMailFacts = {
		booking: row,
		job: { id: row.jobId, number: facts.number, title: facts.title },
		customerName: facts.customerName,
		address: [facts.address, facts.town].filter(Boolean).join(', '),
		storeName: actor.storeName
	};
	const about = { jobId: row.jobId, createdBy: actor.id };
	const purpose = change === 'cancelled' ? 'booking-cancelled' : 'booking';
	if (person?.email) {
		const url = actor.origin ? `${actor.origin}/field/jobs/${row.jobId}` : null;
		await queueMail(tx, purpose, installerBookingMail(person.email, f, change, url), about);
	}
	if (only === 'both' && facts.customerEmail) {
		await queueMail(tx, purpose, customerBookingMail(facts.customerEmail, f, change), about);
	}
}

async function checkInstaller(tx: StoreWriteTx, installerId: string) {
	if (!(await installers.isInstaller(tx, installerId))) return false;
	await installers.ensureProfiles(tx, installerId);
	return true;
}

/**
 * Books a job that may be booked (`canBook`) for an installer: the engine's proposal kept with
 * the booking, the job assigned to the installer and moved to scheduled through the hand-move
 * rules, a line in its history, and the e-mails with the calendar file queued in the same
 * transaction. A job already booked is moved instead (a second tab).
 */
export async function bookJob(
	tx: StoreWriteTx,
	jobId: string,
	input: BookingInput,
	actor: Actor,
	/** `tell: false` books without e-mail: the demo seed's made-up people are sent nothing. */
	options: { tell?: boolean } = {}
): Promise<BookingResult> {
	const status = await jobs.lockStatus(tx, jobId);
	if (!status) return { ok: false, reason: 'not_found' };
	if (!canBook(status)) return refused('Only a sold or scheduled job can be booked.');
	const live = await bookings.liveForJob(tx, jobId);
	if (live) return moveBooking(tx, live.id, input, actor);
	if (!(await checkInstaller(tx, input.installerId)))
		return refused('Choose one of the store’s installers.', 'installerId');
	const proposal = await propose(tx, jobId, input.installerId);
	if (!proposal) return refused('The job has no accepted quote to plan from.');
	const days = input.days ?? proposal.days;
	const row = await bookings.insert(
		tx,
		{
			jobId,
			installerId: input.installerId,
			startsOn: input.startsOn,
			days,
			arrivesAt: input.arrivesAt,
			proposedDays: proposal.days,
			proposal: proposal.schedule,
			notes: input.notes
		},
		actor.id
	);
	await jobs.assign(tx, jobId, input.installerId, actor.id);
	if (status === 'sold') {
		const moved = await moveByHand(tx, jobId, 'scheduled', actor.id, 'Booked');
		if (!moved.ok) throw new Error(`Booking could not schedule job ${jobId}`);
	}
	await bookings.recordEvent(tx, jobId, actor.id, `Booked from ${row.startsOn}, ${days} day(s)`);
	if (options.tell !== false) await tell(tx, row, 'booked', actor);
	const warnings = await warningsFor(tx, { jobId, ...input, days });
	return { ok: true, bookingId: row.id, days, warnings };
}

/**
 * Moves a live booking to other days or another installer: its version rises (the calendar
 * update replaces the first), the job follows the installer, and both people are told; an
 * installer taken off it gets the cancellation.
 */
export async function moveBooking(
	tx: StoreWriteTx,
	bookingId: string,
	input: BookingInput,
	actor: Actor
): Promise<BookingResult> {
	const before = await bookings.lockLive(tx, bookingId);
	if (!before) return { ok: false, reason: 'not_found' };
	const status = await jobs.lockStatus(tx, before.jobId);
	if (!status || !canBook(status))
		return refused('The work has started: the booking can no longer be moved.');
	if (!(await checkInstaller(tx, input.installerId)))
		return refused('Choose one of the store’s installers.', 'installerId');
	const days = input.days ?? before.days;
	const row = await bookings.reschedule(tx, bookingId, {
		installerId: input.installerId,
		startsOn: input.startsOn,
		days,
		arrivesAt: input.arrivesAt,
		notes: input.notes
	});
	if (before.installerId !== row.installerId) {
		await jobs.assign(tx, row.jobId, row.installerId, actor.id);
		await tell(tx, { ...row, installerId: before.installerId }, 'cancelled', actor, 'installer');
	}
	await bookings.recordEvent(tx, row.jobId, actor.id, `Moved to ${row.startsOn}, ${days} day(s)`);
	await tell(tx, row, 'moved', actor);
	const warnings = await warningsFor(tx, { jobId: row.jobId, ...input, days });
	return { ok: true, bookingId: row.id, days, warnings };
}

/**
 * Cancels a booking before the work starts: the row is kept (cancelled), the job returns to
 * sold and to nobody, and the installer and the customer get the cancellation.
 */
export async function cancelBooking(
	tx: StoreWriteTx,
	bookingId: string,
	actor: Actor
): Promise<BookingResult> {
	const before = await bookings.lockLive(tx, bookingId);
	if (!before) return { ok: false, reason: 'not_found' };
	const status = await jobs.lockStatus(tx, before.jobId);
	if (status !== 'scheduled')
		return refused('The work has started: the booking can no longer be cancelled.');
	const row = await bookings.cancel(tx, bookingId, actor.id);
	const moved = await moveByHand(tx, row.jobId, 'sold', actor.id, 'Booking cancelled');
	if (!moved.ok) throw new Error(`Cancelling booking ${bookingId} could not return the job`);
	await jobs.assign(tx, row.jobId, null, actor.id);
	await bookings.recordEvent(tx, row.jobId, actor.id, 'Booking cancelled');
	await tell(tx, row, 'cancelled', actor);
	return { ok: true, bookingId: row.id, days: row.days, warnings: [] };
}
