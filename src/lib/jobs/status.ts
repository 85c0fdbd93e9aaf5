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

/** Open jobs: not yet finished or given up. */
export function isOpen(status: JobStatus): boolean {
	return status !== 'closed' && status !== 'cancelled';
}

/** `J-1001`: how people say a job's number. */
export function jobLabel(number: number): string {
	return `J-${number}`;
}
