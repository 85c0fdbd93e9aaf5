// The job page as one story: what happened, top to bottom, and the one thing to do next. Every
// figure is shaped here for the member (./figures): margin, installer pay and the engine's days
// only with `cost: read`; card fees only with `cardFee: read`; photos only for those who review
// what the installer found. The next step is chosen from the whole job, whatever the viewer
// may read, and says no amount.
import { nextAction, type JobFacts, type JobPowers } from '$lib/jobs/next-action';
import { changeOrderLabel } from '$lib/jobs/change-order-status';
import { JOB_STATUS_LABELS } from '$lib/jobs/status';
import { formatMoney } from '$lib/format';
import * as bookings from '../db/queries/bookings';
import * as changeOrders from '../db/queries/change-orders';
import * as completions from '../db/queries/completions';
import * as field from '../db/queries/field';
import * as jobs from '../db/queries/jobs';
import * as payments from '../db/queries/payments';
import * as quotes from '../db/queries/quotes';
import type { StoreTx } from '../db/tenant';
import { seesCosts, visibleLedger } from '../figures';
import { can, type Grants } from '../permissions';
import { measureSummary } from './measure-summary';
import { factsFrom } from './move';

export type ViewedJob = NonNullable<Awaited<ReturnType<typeof jobs.readForViewer>>>;

/** One line of the job's timeline: when, what, and who (null: the customer's link or the system). */
export interface StoryEvent {
	key: string;
	at: Date;
	what: string;
	who: string | null;
	note: string;
}

const PAID_FOR = {
	deposit: 'Deposit',
	balance: 'Balance',
	change_order: 'Change order payment'
} as const;

/** The most site photos shown as thumbnails on the job page. */
const THUMBS = 8;

const DAY_MS = 86_400_000;

/** The last day of a booking that starts on `startsOn` (YYYY-MM-DD) and lasts `days` days. */
export function lastDayOf(startsOn: string, days: number): string {
	const start = new Date(`${startsOn}T00:00:00Z`).getTime();
	return new Date(start + (Math.max(1, days) - 1) * DAY_MS).toISOString().slice(0, 10);
}

function eventText(e: Awaited<ReturnType<typeof jobs.events>>[number]): string {
	switch (e.kind) {
		case 'created':
			return 'Job started';
		case 'status':
			return e.fromStatus && e.toStatus
				? `${JOB_STATUS_LABELS[e.fromStatus]} → ${JOB_STATUS_LABELS[e.toStatus]}`
				: 'State changed';
		case 'assigned':
			return e.note ? 'Installer assigned' : 'Installer removed';
		case 'booking':
			return 'Booking';
		case 'check_in':
			return 'Installer checked in';
		case 'change_order':
			return 'Change order';
		default:
			return 'Note';
	}
}

/**
 * Everything the job page shows, as this member may see it, read in the caller's transaction;
 * and, apart (`moveFacts`, not for the page's data), what the moves by hand are checked against,
 * from the same reads (`moveFacts` in ../jobs/move.ts reads them on its own for a move).
 */
export async function jobStory(tx: StoreTx, job: ViewedJob, grants: Grants) {
	const may = {
		quotes: can(grants, { quote: ['read'] }),
		money: can(grants, { payment: ['read'] }),
		review: can(grants, { changeOrder: ['review'] }),
		schedule: can(grants, { job: ['schedule'] }),
		costs: seesCosts(grants)
	};
	const measure = await measureSummary(tx, job.id);
	const versions = await quotes.list(tx, job.id);
	const money = await payments.moneyFor(tx, job.id);
	const booking = await bookings.liveForJob(tx, job.id);
	const report = await field.readReport(tx, job.id);
	const items = report ? (await field.listItems(tx, report.id)).filter((i) => !i.deletedAt) : [];
	const photos = await field.listPhotos(tx, job.id);
	const orders = await changeOrders.listForJob(tx, job.id);
	const completion = await completions.read(tx, job.id);
	const history = await jobs.events(tx, job.id);

	const open = orders.find((c) => c.status === 'submitted' || c.status === 'reviewed');
	const newest = versions[0];
	const facts: JobFacts = {
		id: job.id,
		status: job.status,
		measured: Boolean(
			measure && !('settingsInvalid' in measure) && measure.rooms > measure.unreadable
		),
		quote: newest ? { version: newest.version, status: newest.status } : null,
		depositDueCents: money.ledger.depositDueCents,
		balanceDueCents: money.ledger.balanceDueCents,
		booked: Boolean(booking),
		openChangeOrder:
			open && (open.status === 'submitted' || open.status === 'reviewed')
				? { number: open.number, status: open.status }
				: null,
		signedOff: Boolean(completion?.signedAt)
	};
	const powers: JobPowers = {
		measure: can(grants, { job: ['update'] }),
		buildQuote: can(grants, { quote: ['create'] }),
		sendQuote: can(grants, { quote: ['send'] }),
		takePayment: can(grants, { payment: ['record'] }),
		schedule: may.schedule,
		reviewChangeOrder: may.review,
		readQuote: may.quotes
	};

	// The figures the store keeps to itself: from the quote the work is sold on (else the newest).
	let storeFigures = null;
	if (may.costs && newest) {
		const basis = versions.find((v) => v.status === 'accepted') ?? newest;
		const full = await quotes.read(tx, basis.id);
		// A stored result always has them; a row written some other way is left unshown, not a 500.
		const m = full?.result?.margin;
		if (full && m && full.result.schedule) {
			const approved = orders.filter((c) => c.status === 'approved');
			storeFigures = {
				quoteVersion: full.version,
				currency: full.currency,
				revenueCents: m.revenueCents,
				costCents: m.costCents,
				costComplete: m.costComplete,
				installerPayCents: full.result.installerPayCents,
				marginCents: m.marginCents,
				marginBps: m.marginBps,
				/** The installer's pay difference on approved change orders. */
				payExtrasCents: approved.reduce((s, c) => s + c.payDeltaCents, 0),
				engineDays: full.result.schedule.days,
				workHours: full.result.schedule.workHours,
				cureHours: full.result.schedule.cureHours,
				proposedDays: booking?.proposedDays ?? null
			};
		}
	}

	const timeline: StoryEvent[] = history.map((e) => ({
		key: `e-${e.id}`,
		at: e.createdAt,
		what: eventText(e),
		who: e.actorName,
		note: e.kind === 'status' || e.kind === 'booking' || e.kind === 'note' ? e.note : ''
	}));
	if (may.money) {
		for (const p of money.payments) {
			if (p.status !== 'succeeded' && p.status !== 'refunded') continue;
			timeline.push({
				key: `p-${p.id}`,
				at: p.succeededAt ?? p.createdAt,
				what: `${PAID_FOR[p.purpose]} received: ${formatMoney(p.amountCents, p.currency)}`,
				who: p.recordedByName,
				note: ''
			});
		}
		for (const r of money.refunds) {
			if (r.status !== 'succeeded') continue;
			timeline.push({
				key: `r-${r.id}`,
				at: r.createdAt,
				what: `Refunded: ${formatMoney(r.amountCents, money.currency)}`,
				who: null,
				note: ''
			});
		}
	}
	if (report?.submittedAt) {
		timeline.push({
			key: 'report',
			at: report.submittedAt,
			what: 'Installer sent the site report',
			who: null,
			note: ''
		});
	}
	if (completion) {
		timeline.push({
			key: 'completed',
			at: completion.completedAt,
			what: 'Marked complete on site',
			who: null,
			note: ''
		});
		if (completion.signedAt) {
			timeline.push({
				key: 'signed',
				at: completion.signedAt,
				what: `Signed off by ${completion.signedName}`,
				who: null,
				note: ''
			});
		}
	}
	timeline.sort((a, b) => a.at.getTime() - b.at.getTime() || a.key.localeCompare(b.key));

	const reportPhotos = photos.filter((p) => p.purpose === 'report');

	const story = {
		next: nextAction(facts, powers),
		measure,
		quotes: may.quotes
			? versions.map((v) => ({
					version: v.version,
					status: v.status,
					currency: v.currency,
					totalCents: v.totalCents,
					depositCents: v.depositCents,
					sentAt: v.sentAt,
					acceptedAt: v.acceptedAt,
					createdAt: v.createdAt
				}))
			: null,
		money: may.money
			? {
					currency: money.currency,
					ledger: visibleLedger(grants, money.ledger),
					count: money.payments.length
				}
			: null,
		booking: booking
			? {
					installerName: booking.installerName,
					startsOn: booking.startsOn,
					endsOn: lastDayOf(booking.startsOn, booking.days),
					days: booking.days,
					arrivesAt: booking.arrivesAt
				}
			: null,
		report: report
			? {
					checkedInAt: report.checkedInAt,
					submittedAt: report.submittedAt,
					found: items.filter((i) => i.kind === 'found').length,
					readings: items.filter((i) => i.kind === 'reading').length,
					notes: items.filter((i) => i.kind === 'note').length
				}
			: null,
		photos: {
			report: reportPhotos.length,
			completion: photos.length - reportPhotos.length,
			// Whoever sees the job sees its site photos (the page's load asks `job: read`).
			thumbs: photos.slice(0, THUMBS).map((p) => ({
				id: p.id,
				caption: p.caption,
				purpose: p.purpose,
				href: `/app/jobs/${job.id}/photos/${p.id}`
			}))
		},
		changeOrders: may.review
			? orders.map((c) => ({
					number: c.number,
					label: changeOrderLabel(c.number),
					status: c.status,
					currency: c.currency,
					totalCents: c.totalCents,
					createdAt: c.createdAt
				}))
			: null,
		completion: completion
			? {
					completedAt: completion.completedAt,
					signedAt: completion.signedAt,
					signedName: completion.signedName
				}
			: null,
		timeline,
		storeFigures
	};
	const moveFacts = factsFrom({
		quoteStatuses: versions.map((v) => v.status),
		ledger: money.ledger,
		booked: Boolean(booking),
		completion
	});
	return { story, moveFacts };
}
