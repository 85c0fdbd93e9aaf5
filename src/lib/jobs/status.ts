/** A job's life, in order (../shared/PRODUCT.md, "States"). */
export const JOB_STATUSES = [
	'draft',
	'quoted',
	'accepted',
	'sold',
	'scheduled',
	'in_progress',
	'completed',
	'closed',
	'cancelled'
] as const;

export type JobStatus = (typeof JOB_STATUSES)[number];

export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
	draft: 'Draft',
	quoted: 'Quoted',
	accepted: 'Accepted',
	sold: 'Sold',
	scheduled: 'Scheduled',
	in_progress: 'In progress',
	completed: 'Completed',
	closed: 'Closed',
	cancelled: 'Cancelled'
};

const forward: Record<JobStatus, JobStatus[]> = {
	draft: ['quoted'],
	// A quote sent back for changes returns to draft for its next version.
	quoted: ['accepted', 'draft'],
	accepted: ['sold'],
	// Un-booking returns a scheduled job to sold.
	sold: ['scheduled'],
	scheduled: ['in_progress', 'sold'],
	in_progress: ['completed'],
	completed: ['closed'],
	closed: [],
	cancelled: []
};

/** `cancelled` is reachable from any state before `completed`. */
const cancellable = new Set<JobStatus>([
	'draft',
	'quoted',
	'accepted',
	'sold',
	'scheduled',
	'in_progress'
]);

/** The states a job may move to from `from`. */
export function nextStatuses(from: JobStatus): JobStatus[] {
	return cancellable.has(from) ? [...forward[from], 'cancelled'] : [...forward[from]];
}

export function canMove(from: JobStatus, to: JobStatus): boolean {
	return nextStatuses(from).includes(to);
}

/** What a move by hand needs to know about the job beyond its state. */
export interface MoveFacts {
	/** A version of its quote is sent and waiting for the customer's answer. */
	quoteSent: boolean;
	/** The customer accepted a version. */
	quoteAccepted: boolean;
	/** Deposit still to pay (from the ledger). */
	depositDue: boolean;
	/** Balance still to pay (from the ledger). */
	balanceDue: boolean;
	/** A live booking on the schedule. */
	booked: boolean;
	/**
	 * The customer signed off the installer's completion; undefined for a job completed without
	 * one (before completions were recorded), which is closed on its balance alone.
	 */
	signedOff?: boolean;
}

export type HandMoveCheck = { ok: true } | { ok: false; message: string };

const label = (s: JobStatus) => JOB_STATUS_LABELS[s].toLowerCase();

/**
 * Whether staff may move a job from `from` to `to` by hand, and why not. A move by hand takes the
 * same steps as the product's own workflows and may skip none: a job becomes quoted only with a
 * sent quote, accepted only by the customer's acceptance, sold only once the deposit is in,
 * scheduled only with a booking, closed only when nothing is left to pay. Cancelling is allowed
 * before completion (it withdraws any open quote).
 */
export function handMove(from: JobStatus, to: JobStatus, facts: MoveFacts): HandMoveCheck {
	if (!canMove(from, to)) {
		return { ok: false, message: `A ${label(from)} job cannot become ${label(to)}.` };
	}
	const refuse = (message: string) => ({ ok: false, message }) as const;
	switch (to) {
		case 'quoted':
			return facts.quoteSent
				? { ok: true }
				: refuse('Send the quote first: sending it makes the job quoted.');
		case 'accepted':
			return facts.quoteAccepted
				? { ok: true }
				: refuse('The customer accepts the quote from their link; that makes the job accepted.');
		case 'sold':
			if (from === 'scheduled' && facts.booked) {
				return refuse('Cancel the booking on the schedule; that returns the job to sold.');
			}
			return facts.quoteAccepted && !facts.depositDue
				? { ok: true }
				: refuse('Record the deposit first: a paid deposit makes the job sold.');
		case 'scheduled':
			return facts.booked
				? { ok: true }
				: refuse('Book an installer on the schedule; the booking makes the job scheduled.');
		case 'closed':
			if (facts.balanceDue) {
				return refuse('Something is still to pay: record the balance before closing the job.');
			}
			return facts.signedOff === false
				? refuse('The customer signs off the finished work from their link before it is closed.')
				: { ok: true };
		default:
			return { ok: true };
	}
}

/** A job whose quote may still be built, changed and sent: the customer has not accepted yet. */
export function canQuote(status: JobStatus): boolean {
	return status === 'draft' || status === 'quoted';
}

/**
 * A job that may be deleted: one never sold (a draft) or given up. Its quotes must also never
 * have been sent: the caller checks that, since it is about quotes, not the job's state.
 */
export function canDelete(status: JobStatus): boolean {
	return status === 'draft' || status === 'cancelled';
}

/** What a customer pays on a job: the deposit to book it, the balance once it is done. */
export type PayablePurpose = 'deposit' | 'balance';

/** What the customer can pay on a job now: the deposit once accepted, the balance once completed. */
export function payableNow(status: JobStatus): PayablePurpose | null {
	if (status === 'accepted') return 'deposit';
	if (status === 'completed') return 'balance';
	return null;
}

/** A deposit that succeeds sells a job the customer accepted (and nothing else). */
export function soldByDeposit(status: JobStatus): boolean {
	return status === 'accepted';
}

/** A job an installer may start on site: one that is booked. */
export function canStartOnSite(status: JobStatus): boolean {
	return canMove(status, 'in_progress');
}

/**
 * What happens on site moves the job (issue 10), each step through `canMove`: booking a sold
 * job schedules it, the installer's first check-in starts it, marking it complete completes it;
 * cancelling the booking returns it to sold.
 */
export const SITE_MOVES = {
	book: { from: 'sold', to: 'scheduled' },
	unbook: { from: 'scheduled', to: 'sold' },
	checkIn: { from: 'scheduled', to: 'in_progress' },
	complete: { from: 'in_progress', to: 'completed' }
} as const satisfies Record<string, { from: JobStatus; to: JobStatus }>;

/** A sold job may be booked, and a scheduled one moved to other days or another installer. */
export function canBook(status: JobStatus): boolean {
	return status === 'sold' || status === 'scheduled';
}

/** The first check-in starts the job; a job of several days is checked in to again each day. */
export function canCheckIn(status: JobStatus): boolean {
	return status === 'scheduled' || status === 'in_progress';
}

/** Prep found, readings, notes and photos are recorded while the work is under way. */
export function canReport(status: JobStatus): boolean {
	return status === 'in_progress';
}

/** A change order is raised from the report while the work is under way. */
export function canRaiseChangeOrder(status: JobStatus): boolean {
	return status === 'in_progress';
}

export function canComplete(status: JobStatus): boolean {
	return status === 'in_progress';
}

/** The customer signs off a completed job (before the store closes it). */
export function canSignOff(status: JobStatus): boolean {
	return status === 'completed';
}

/** Open jobs: not yet finished or given up. */
export function isOpen(status: JobStatus): boolean {
	return status !== 'closed' && status !== 'cancelled';
}

/** `J-1001`: how people say a job's number. */
export function jobLabel(number: number): string {
	return `J-${number}`;
}
