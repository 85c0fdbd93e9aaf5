import { jobLabel } from '$lib/jobs/status';
import { formatMoney } from '$lib/format';
import { addDays, today } from '$lib/schedule/days';
import * as desk from '../db/queries/desk';
import { BALANCES_MAX, balancesFor } from '../db/queries/payments';
import type { StoreTx } from '../db/tenant';
import type { JobScope } from '../object-access';
import { can, type Grants } from '../permissions';

/**
 * The desk as the store's day: what needs someone now, grouped by who acts next, each line
 * saying what to do and opening the place to do it. Whoever runs the schedule sees the store's
 * day; anyone else at the desk (a salesperson) sees the jobs they sell.
 */

/** Who acts next on a line. */
export type Actor = 'you' | 'customer' | 'site';

export interface DayLine {
	key: string;
	href: string;
	/** J-1042 · Kitchen and hall — Ada Brook */
	job: string;
	/** What to do, in a few words. */
	todo: string;
	/** How long it has waited, in whole days (0: today). */
	waitingDays: number;
}

export interface DayGroup {
	kind: string;
	actor: Actor;
	title: string;
	/** Shown when there is nothing of this kind. */
	empty: string;
	/** How many there are, counted as far as the desk counts (`DESK_COUNT_MAX`). */
	total: number;
	/** Whether there are more than `total`: shown as 1,000+. */
	totalCapped: boolean;
	lines: DayLine[];
}

export interface SiteWeekRow {
	/** The row's key on the page: its first booking's id (a member's id is not the page's). */
	key: string;
	installerName: string;
	jobs: { key: string; href: string; job: string; days: string }[];
}

export interface StoreDay {
	/** Whether this is the store's day or the viewer's own jobs. */
	wholeStore: boolean;
	groups: DayGroup[];
	/** Installs on this week, by installer (Monday to Sunday in the store's time zone). */
	week: {
		from: string;
		to: string;
		rows: SiteWeekRow[];
		/** The week has more bookings than the desk lists (the schedule has them all). */
		more: boolean;
	} | null;
}

/** The most completed jobs whose balance is worked out for the desk (one ledger each). */
const BALANCE_SCAN = Math.min(40, BALANCES_MAX);

const DAY_MS = 86_400_000;

function daysSince(when: Date, now: Date): number {
	return Math.max(0, Math.floor((now.getTime() - when.getTime()) / DAY_MS));
}

/** Monday and Sunday of the week holding `day` (YYYY-MM-DD), as YYYY-MM-DD. */
export function weekOf(day: string): { from: string; to: string } {
	const d = new Date(`${day}T00:00:00Z`);
	const monday = new Date(d.getTime() - ((d.getUTCDay() + 6) % 7) * DAY_MS);
	const sunday = new Date(monday.getTime() + 6 * DAY_MS);
	return { from: monday.toISOString().slice(0, 10), to: sunday.toISOString().slice(0, 10) };
}

/**
 * Made once: a formatter costs far more to make than to use (made per call, the week's 200
 * bookings took 25 ms of the desk's server time).
 */
const dayFormat = new Intl.DateTimeFormat('en-US', {
	weekday: 'short',
	month: 'short',
	day: 'numeric',
	timeZone: 'UTC'
});

/** A store date (YYYY-MM-DD) as people read it: Mon, Dec 7. */
function dayText(day: string): string {
	return dayFormat.format(new Date(`${day}T00:00:00Z`));
}

const jobText = (j: { number: number; title: string; customerName: string }) =>
	`${jobLabel(j.number)} · ${j.title} — ${j.customerName}`;

function lines(
	rows: desk.DeskJob[],
	now: Date,
	href: (j: desk.DeskJob) => string,
	todo: (j: desk.DeskJob, waited: number) => string
): DayLine[] {
	return rows.map((j) => {
		const waited = daysSince(j.since, now);
		return {
			key: j.id,
			href: href(j),
			job: jobText(j),
			todo: todo(j, waited),
			waitingDays: waited
		};
	});
}

const ago = (days: number) =>
	days === 0 ? 'today' : days === 1 ? 'a day ago' : `${days.toLocaleString('en-US')} days ago`;

export async function storeDay(
	tx: StoreTx,
	member: { grants: Grants; user: { id: string }; store: { timeZone: string } },
	now = new Date()
): Promise<StoreDay> {
	const { grants } = member;
	const wholeStore = can(grants, { job: ['schedule'] });
	const scope: JobScope = wholeStore ? { kind: 'store' } : { kind: 'sold', userId: member.user.id };
	const groups: DayGroup[] = [];
	const job = (j: desk.DeskJob) => `/app/jobs/${j.id}`;

	if (can(grants, { quote: ['create'] })) {
		const measure = await desk.toMeasure(tx, scope);
		groups.push({
			kind: 'measure',
			actor: 'you',
			title: 'Measures to do',
			empty: 'Every job has its rooms measured.',
			total: measure.total,
			totalCapped: measure.totalCapped,
			lines: lines(
				measure.rows,
				now,
				(j) => `/app/jobs/${j.id}/measure`,
				(_, d) => `Measure the rooms · job opened ${ago(d)}`
			)
		});
		const quote = await desk.toQuote(tx, scope);
		groups.push({
			kind: 'quote',
			actor: 'you',
			title: 'Quotes to build or send',
			empty: 'No measured job is waiting for its quote.',
			total: quote.total,
			totalCapped: quote.totalCapped,
			lines: lines(
				quote.rows,
				now,
				(j) => `/app/jobs/${j.id}/quote`,
				(_, d) => `Build and send the quote · measured, waiting ${ago(d)}`
			)
		});
	}
	if (can(grants, { job: ['schedule'] })) {
		const book = await desk.toBook(tx, scope);
		groups.push({
			kind: 'book',
			actor: 'you',
			title: 'Installs to book',
			empty: 'Every sold job is booked.',
			total: book.total,
			totalCapped: book.totalCapped,
			lines: lines(book.rows, now, job, (_, d) => `Book an installer · sold ${ago(d)}`)
		});
	}
	if (can(grants, { changeOrder: ['review'] })) {
		const review = await desk.changeOrdersToReview(tx, scope);
		groups.push({
			kind: 'change-orders',
			actor: 'you',
			title: 'Change orders to review',
			empty: 'No change order is waiting for review.',
			total: review.total,
			totalCapped: review.totalCapped,
			lines: lines(
				review.rows,
				now,
				job,
				(_, d) => `Review the installer's findings · sent ${ago(d)}`
			)
		});
	}
	if (can(grants, { payment: ['reconcile'] })) {
		const odd = await desk.paymentMismatches(tx, scope);
		groups.push({
			kind: 'reconcile',
			actor: 'you',
			title: "Payments that don't reconcile",
			empty: 'Every payment matches what it asked for.',
			total: odd.total,
			totalCapped: odd.totalCapped,
			lines: odd.rows.map((p) => ({
				key: p.id,
				href: `/app/jobs/${p.jobId}/payments`,
				job: `${jobLabel(p.number)} · ${p.title}`,
				todo: p.note ?? 'Check this payment against Stripe',
				waitingDays: daysSince(p.since, now)
			}))
		});
	}

	const waiting = await desk.waitingOnCustomer(tx, scope);
	groups.push({
		kind: 'waiting',
		actor: 'customer',
		title: 'Quotes with the customer',
		empty: 'No quote is waiting for an answer.',
		total: waiting.total,
		totalCapped: waiting.totalCapped,
		lines: lines(waiting.rows, now, job, (_, d) =>
			d >= 7 ? `Sent ${ago(d)}: call to follow up` : `Sent ${ago(d)}`
		)
	});
	const deposits = await desk.depositsDue(tx, scope);
	groups.push({
		kind: 'deposits',
		actor: 'customer',
		title: 'Deposits due',
		empty: 'No accepted quote is waiting for its deposit.',
		total: deposits.total,
		totalCapped: deposits.totalCapped,
		lines: lines(
			deposits.rows,
			now,
			(j) => `/app/jobs/${j.id}/payments`,
			(_, d) => `Accepted ${ago(d)}; the deposit is not in`
		)
	});

	// Balances: the one ledger function per completed job (bounded), never a sum of our own; the
	// rows it reads are read for all of them at once.
	const done = await desk.completed(tx, scope, BALANCE_SCAN);
	const balances = await balancesFor(
		tx,
		done.map((j) => j.id)
	);
	const owing: { id: string; dueCents: number; currency: string }[] = [];
	for (const { id } of done) {
		const money = balances.get(id);
		if (money && money.balanceDueCents > 0)
			owing.push({ id, dueCents: money.balanceDueCents, currency: money.currency });
	}
	const owingRows = await desk.deskJobs(
		tx,
		owing.slice(0, desk.DESK_LINES).map((o) => o.id)
	);
	const dueOf = new Map(owing.map((o) => [o.id, o]));
	groups.push({
		kind: 'balances',
		actor: 'customer',
		title: 'Balances due',
		empty: 'No finished job owes a balance.',
		total: owing.length,
		// Only the oldest completed jobs are worked out: past them, there may be more.
		totalCapped: done.length >= BALANCE_SCAN && owing.length > 0,
		lines: lines(
			owingRows,
			now,
			(j) => `/app/jobs/${j.id}/payments`,
			(j, d) => {
				const o = dueOf.get(j.id)!;
				return `${formatMoney(o.dueCents, o.currency)} due · finished ${ago(d)}`;
			}
		)
	});

	let week: StoreDay['week'] = null;
	if (can(grants, { job: ['read'] })) {
		const { from, to } = weekOf(today(member.store.timeZone, now));
		const { bookings: booked, more } = await desk.bookingsBetween(tx, scope, from, to);
		const byInstaller = new Map<string, SiteWeekRow>();
		for (const b of booked) {
			const row = byInstaller.get(b.installerId) ?? {
				key: b.id,
				installerName: b.installerName ?? 'An installer no longer in the store',
				jobs: []
			};
			const last = addDays(b.startsOn, b.days - 1);
			row.jobs.push({
				key: b.id,
				href: `/app/jobs/${b.jobId}`,
				job: jobText(b),
				days: b.days === 1 ? dayText(b.startsOn) : `${dayText(b.startsOn)} to ${dayText(last)}`
			});
			byInstaller.set(b.installerId, row);
		}
		week = { from: dayText(from), to: dayText(to), rows: [...byInstaller.values()], more };
	}
	return { wholeStore, groups, week };
}
