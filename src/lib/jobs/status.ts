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
