/**
 * The queue's clock, shortened by the environment for tests that kill servers and stop services
 * (tests/server/faults.spec.ts); production leaves these unset and uses each kind's own settings
 * (./kinds.ts) and a maintenance pass every 30 seconds.
 *
 * - `FLUSHLINE_TASK_EXPIRE_SECONDS`: how long one attempt may run before it counts as dead.
 * - `FLUSHLINE_TASK_RETRY_DELAY_SECONDS`: the first retry's delay (doubled for each one after).
 * - `FLUSHLINE_TASK_MAINTENANCE_SECONDS`: how often pg-boss looks for attempts that died.
 */
function seconds(name: string): number | undefined {
	const raw = process.env[name];
	if (raw === undefined || raw === '') return undefined;
	const value = Number(raw);
	if (!Number.isInteger(value) || value < 1 || value > 86_400) {
		throw new Error(`${name} must be a whole number of seconds from 1 to 86400`);
	}
	return value;
}

/** pg-boss's maintenance (expiring dead attempts, archiving) runs this often in production. */
export const MAINTENANCE_SECONDS = 30;

export function taskTiming() {
	return {
		expireSeconds: seconds('FLUSHLINE_TASK_EXPIRE_SECONDS'),
		retryDelaySeconds: seconds('FLUSHLINE_TASK_RETRY_DELAY_SECONDS'),
		maintenanceSeconds: seconds('FLUSHLINE_TASK_MAINTENANCE_SECONDS') ?? MAINTENANCE_SECONDS
	};
}
