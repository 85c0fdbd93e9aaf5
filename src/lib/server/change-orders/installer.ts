import * as changeOrders from '../db/queries/change-orders';
import type { StoreTx } from '../db/tenant';

/**
 * What the installer's phone shows of a job's change orders (`ChangeOrderDecision.svelte`): the
 * number, where it stands and the installer's own pay difference; never a price, tax or total.
 * The caller has already checked the job is assigned to this installer (`readForViewer`).
 */
export async function installerDecisions(tx: StoreTx, jobId: string) {
	const rows = await changeOrders.decisionsForInstaller(tx, jobId);
	return rows.map((r) => ({
		number: r.number,
		status: r.status,
		payDeltaCents: r.payDeltaCents,
		currency: r.currency
	}));
}
