import { canBook, jobLabel } from '$lib/jobs/status';
import {
	addDays,
	dayRange,
	formatDay,
	monthLength,
	monthStart,
	today,
	warningText,
	weekStart
} from '$lib/schedule/days';
import { bookSchema, cancelSchema, moveSchema, scheduleViewSchema } from '$lib/schemas/crew';
import * as bookings from '$lib/server/db/queries/bookings';
import * as installers from '$lib/server/db/queries/installers';
import * as jobs from '$lib/server/db/queries/jobs';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { parseForm, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import {
	bookJob,
	cancelBooking,
	moveBooking,
	propose,
	type BookingResult
} from '$lib/server/schedule/book';
import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

/** At most this many installers get a proposal of their own on the booking form. */
const PROPOSALS_FOR = 25;

export const load: PageServerLoad = async ({ url }) => {
	const { store, scope } = requirePermission({ job: ['schedule'] });
	const query = scheduleViewSchema.parse(Object.fromEntries(url.searchParams));
	const anchor = query.from ?? today(store.timeZone);
	const first = query.view === 'week' ? weekStart(anchor) : monthStart(anchor);
	const count = query.view === 'week' ? 7 : monthLength(anchor);
	const days = dayRange(first, count);
	const last = days[days.length - 1];
	return readInStore(store.id, async (tx) => {
		const people = await installers.list(tx);
		const live = await bookings.listLive(tx, { from: first, to: last });
		const away = await installers.listTimeOff(tx, { from: first, to: last });
		const { rows: waiting } = await jobs.list(
			tx,
			{ status: 'sold', sort: 'number', dir: 'asc', page: 1, pageSize: 100, q: null },
			scope
		);
		let chosen = null;
		if (query.job) {
			const job = await jobs.readForViewer(tx, query.job, scope);
			if (job && canBook(job.status)) {
				const proposals = [];
				for (const p of people.slice(0, PROPOSALS_FOR)) {
					const made = await propose(tx, job.id, p.userId);
					if (made) proposals.push({ installerId: p.userId, days: made.days });
				}
				const general = await propose(tx, job.id, null);
				chosen = {
					id: job.id,
					label: `${jobLabel(job.number)} ${job.title}`,
					customerName: job.customerName,
					booking: (await bookings.liveForJob(tx, job.id)) ?? null,
					proposals,
					proposal: general
						? {
								days: general.days,
								steps: general.schedule.steps.map((s) => ({
									label: s.label,
									hours: s.hours,
									cureHours: s.cureHours ?? 0
								}))
							}
						: null
				};
			}
		}
		return {
			view: query.view,
			days,
			previous: query.view === 'week' ? addDays(first, -7) : monthStart(addDays(first, -1)),
			next: query.view === 'week' ? addDays(first, 7) : addDays(first, count),
			today: today(store.timeZone),
			installers: people.map((p) => ({
				id: p.userId,
				name: p.name,
				daysOff: p.profile?.daysOff ?? []
			})),
			bookings: live.map((b) => ({
				id: b.id,
				jobId: b.jobId,
				label: jobLabel(b.jobNumber),
				title: b.jobTitle,
				customerName: b.customerName,
				installerId: b.installerId,
				startsOn: b.startsOn,
				days: b.days,
				arrivesAt: b.arrivesAt?.slice(0, 5) ?? '',
				notes: b.notes,
				movable: canBook(b.jobStatus)
			})),
			away: away.map((a) => ({
				installerId: a.installerId,
				startsOn: a.startsOn,
				endsOn: a.endsOn,
				note: a.note
			})),
			waiting: waiting
				.filter((j) => !live.some((b) => b.jobId === j.id))
				.map((j) => ({
					id: j.id,
					label: `${jobLabel(j.number)} ${j.title}`,
					customer: j.customerName
				})),
			chosen
		};
	});
};

/** The outcome of a booking action for the page: its warnings in words, or a refusal. */
function answer(form: FormData, result: BookingResult, done: string) {
	if (!result.ok && result.reason === 'not_found') error(404, 'Not found');
	if (!result.ok) {
		return result.field
			? refuse(form, { [result.field]: [result.message] })
			: refuse(form, {}, result.message, 409);
	}
	return {
		done,
		bookingId: result.bookingId,
		days: result.days,
		warnings: result.warnings.map((w) => warningText(w, formatDay(w.day)))
	};
}

export const actions: Actions = {
	book: async ({ request, url }) => {
		const member = requirePermission({ job: ['schedule'] });
		const parsed = await parseForm(request, bookSchema);
		if (!parsed.ok) return parsed.failure;
		const { jobId, ...input } = parsed.data;
		await requireJob(member, jobId);
		const actor = { id: member.user.id, storeName: member.store.name, origin: url.origin };
		const result = await inStore(member.store.id, (tx) => bookJob(tx, jobId, input, actor));
		return answer(parsed.form, result, 'Booked. The installer and the customer are e-mailed.');
	},
	move: async ({ request, url }) => {
		const member = requirePermission({ job: ['schedule'] });
		const parsed = await parseForm(request, moveSchema);
		if (!parsed.ok) return parsed.failure;
		const { bookingId, ...input } = parsed.data;
		const actor = { id: member.user.id, storeName: member.store.name, origin: url.origin };
		const result = await inStore(member.store.id, (tx) => moveBooking(tx, bookingId, input, actor));
		return answer(parsed.form, result, 'Moved. The new dates are e-mailed.');
	},
	cancel: async ({ request, url }) => {
		const member = requirePermission({ job: ['schedule'] });
		const parsed = await parseForm(request, cancelSchema);
		if (!parsed.ok) return fail(400, { message: 'Choose a booking to cancel' });
		const actor = { id: member.user.id, storeName: member.store.name, origin: url.origin };
		const result = await inStore(member.store.id, (tx) =>
			cancelBooking(tx, parsed.data.bookingId, actor)
		);
		return answer(parsed.form, result, 'Cancelled. The job is back to sold.');
	}
};
