import type { JobStatus } from './status';
import type { ChangeOrderStatus } from './change-order-status';
import { changeOrderLabel } from './change-order-status';

/** Where a job stands, as its next step needs to know (read on the server, one transaction). */
export interface JobFacts {
	id: string;
	status: JobStatus;
	/** The measure has at least one room whose size can be read. */
	measured: boolean;
	/** The newest version of the quote, if any. */
	quote: {
		version: number;
		status: 'draft' | 'sent' | 'accepted' | 'changes_requested' | 'superseded' | 'withdrawn';
	} | null;
	/** From the job's ledger (0 when the viewer does not read money: the step is then theirs to miss). */
	depositDueCents: number;
	balanceDueCents: number;
	/** A live booking on the schedule. */
	booked: boolean;
	/** The change order still in the works (submitted or with the customer), if any. */
	openChangeOrder: {
		number: number;
		status: Extract<ChangeOrderStatus, 'submitted' | 'reviewed'>;
	} | null;
	/** The customer signed off the completion. */
	signedOff: boolean;
}

/** What the viewer may do, from their grants (asked on the server with `can`). */
export interface JobPowers {
	/** `job: update`: measure the rooms. */
	measure: boolean;
	/** `quote: create`. */
	buildQuote: boolean;
	/** `quote: send`. */
	sendQuote: boolean;
	/** `payment: record`: take the deposit or the balance. */
	takePayment: boolean;
	/** `job: schedule`: book the install, move or close the job. */
	schedule: boolean;
	/** `changeOrder: review`. */
	reviewChangeOrder: boolean;
	/** `quote: read`: open the quote while the customer has it. */
	readQuote: boolean;
}

export type NextStep =
	| 'measure'
	| 'build_quote'
	| 'send_quote'
	| 'await_answer'
	| 'take_deposit'
	| 'book_install'
	| 'await_install'
	| 'review_change_order'
	| 'await_change_order'
	| 'await_report'
	| 'collect_balance'
	| 'await_sign_off'
	| 'close'
	| 'done'
	| 'cancelled';

export interface NextAction {
	step: NextStep;
	/** The one big button: what to press and where it goes; null when the viewer has nothing to press. */
	action: { label: string; href: string } | null;
	/** One plain sentence on where the job stands and who acts next. */
	note: string;
}

/** Steps someone at the store does, and the power it takes; the others wait on someone else. */
const NEEDS: Partial<Record<NextStep, keyof JobPowers>> = {
	measure: 'measure',
	build_quote: 'buildQuote',
	send_quote: 'sendQuote',
	take_deposit: 'takePayment',
	book_install: 'schedule',
	review_change_order: 'reviewChangeOrder',
	collect_balance: 'takePayment',
	close: 'schedule',
	await_answer: 'readQuote',
	await_install: 'schedule',
	await_change_order: 'reviewChangeOrder'
};

/** Said instead of the button when the viewer may not take the step. */
const SOMEONE_ELSE: Partial<Record<NextStep, string>> = {
	measure: 'Next: the rooms are measured by someone who edits jobs.',
	build_quote: 'Next: the quote is built by someone who makes quotes.',
	send_quote: 'Next: the quote is sent by someone who sends quotes.',
	take_deposit: 'Next: the deposit is taken by someone who records payments.',
	book_install: 'Next: the install is booked by whoever runs the schedule.',
	review_change_order: 'Next: the change order is reviewed by a manager.',
	collect_balance: 'Next: the balance is collected by someone who records payments.',
	close: 'Next: the job is closed by whoever runs the schedule.'
};

const PRE_SALE = new Set<JobStatus>(['draft', 'quoted', 'accepted']);

/** Which step comes next, from the job's state alone. */
export function nextStep(f: JobFacts): NextStep {
	if (f.status === 'cancelled') return 'cancelled';
	if (f.status === 'closed') return 'done';
	if (PRE_SALE.has(f.status)) {
		const q = f.quote;
		if (q?.status === 'accepted') return f.depositDueCents > 0 ? 'take_deposit' : 'book_install';
		if (q?.status === 'sent') return 'await_answer';
		if (q?.status === 'draft') return 'send_quote';
		// No quote yet, or the last one was sent back, replaced or withdrawn.
		return f.measured ? 'build_quote' : 'measure';
	}
	if (f.openChangeOrder?.status === 'submitted') return 'review_change_order';
	if (f.openChangeOrder?.status === 'reviewed') return 'await_change_order';
	switch (f.status) {
		case 'sold':
			return f.booked ? 'await_install' : 'book_install';
		case 'scheduled':
			return 'await_install';
		case 'in_progress':
			return 'await_report';
		case 'completed':
			if (f.balanceDueCents > 0) return 'collect_balance';
			return f.signedOff ? 'close' : 'await_sign_off';
	}
	return 'done';
}

/**
 * The job's next step as one button for this viewer, chosen on the server: measure → build the
 * quote → send it → take the deposit → book the install → review what the installer found →
 * collect the balance → close. A step the viewer may not take is said, not offered.
 */
export function nextAction(f: JobFacts, can: JobPowers): NextAction {
	const step = nextStep(f);
	const base = `/app/jobs/${f.id}`;
	const co = f.openChangeOrder;
	const offers: Record<NextStep, { label: string; href: string; note: string } | { note: string }> =
		{
			measure: {
				label: 'Measure the rooms',
				href: `${base}/measure`,
				note: 'Nothing is measured yet: the quote is built from the rooms.'
			},
			build_quote: {
				label: f.quote ? `Build quote version ${f.quote.version + 1}` : 'Build the quote',
				href: `${base}/quote`,
				note:
					f.quote?.status === 'changes_requested'
						? 'The customer asked for changes: adjust the measure, then build the next version.'
						: 'The rooms are measured: the quote can be built.'
			},
			send_quote: {
				label: `Send quote version ${f.quote?.version ?? 1}`,
				href: `${base}/quote`,
				note: 'The quote is built but the customer has not seen it.'
			},
			await_answer: {
				label: 'Open the sent quote',
				href: `${base}/quote`,
				note: 'Waiting for the customer to accept the quote from their link.'
			},
			take_deposit: {
				label: 'Take the deposit',
				href: `${base}/payments`,
				note: 'The customer accepted the quote; the deposit is still to pay.'
			},
			book_install: {
				label: 'Book the install',
				href: `/app/schedule?job=${f.id}`,
				note: 'The job is sold: book an installer and the days.'
			},
			await_install: {
				label: 'See the booking',
				href: `/app/schedule?job=${f.id}`,
				note: 'Booked: the installer checks in on the first day.'
			},
			review_change_order: {
				label: co ? `Review ${changeOrderLabel(co.number)}` : 'Review the change order',
				href: co ? `${base}/change-orders/${co.number}` : base,
				note: 'The installer found different prep than was sold: review it before the customer sees it.'
			},
			await_change_order: {
				label: co ? `Open ${changeOrderLabel(co.number)}` : 'Open the change order',
				href: co ? `${base}/change-orders/${co.number}` : base,
				note: 'Waiting for the customer to approve the change order from their link.'
			},
			await_report: {
				note: 'The installer is on site; their report comes in from their phone.'
			},
			collect_balance: {
				label: 'Collect the balance',
				href: `${base}/payments`,
				note: 'The job is complete; the balance is still to pay.'
			},
			await_sign_off: {
				note: 'Paid in full; waiting for the customer to sign off the work from their link.'
			},
			close: {
				label: 'Close the job',
				href: '#move',
				note: 'Signed off and paid in full: nothing is left but to close it.'
			},
			done: { note: 'Closed: nothing is left to do.' },
			cancelled: { note: 'Cancelled: its history and any money are kept below.' }
		};
	const offer = offers[step];
	const needs = NEEDS[step];
	if (!('label' in offer)) return { step, action: null, note: offer.note };
	if (needs && !can[needs]) {
		return { step, action: null, note: SOMEONE_ELSE[step] ?? offer.note };
	}
	return { step, action: { label: offer.label, href: offer.href }, note: offer.note };
}
