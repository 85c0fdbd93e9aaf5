import PgBoss from 'pg-boss';
import { taskTiming } from './timing';

/**
 * The app's pg-boss. It never changes the schema (`migrate: false`): migration 0007 made it, and
 * the app's database role may not. Sending needs no start: `send` runs its INSERT on the
 * connection it is given (the caller's transaction) or on this instance's own pool.
 */
let boss: PgBoss | undefined;

export function appBoss(): PgBoss {
	boss ??= new PgBoss({
		connectionString: process.env.DATABASE_URL ?? '',
		application_name: 'flushline-tasks',
		max: 3,
		migrate: false,
		// An attempt whose worker died (a server killed mid-task) is found by this pass once it
		// has run longer than its kind allows, and retried: within about a minute and a half
		// for an e-mail (60 s to expire, at most 30 s to be noticed, then its retry delay).
		maintenanceIntervalSeconds: taskTiming().maintenanceSeconds,
		// Failed and finished tasks leave the queue's own tables after a week; the store's `task`
		// rows stay as the record.
		archiveCompletedAfterSeconds: 60 * 60 * 12,
		deleteAfterDays: 7
	});
	return boss;
}
