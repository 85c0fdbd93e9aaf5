import * as statements from '$lib/server/db/queries/statements';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

/** The installer's own statements in the active store, with their lines: their pay only. */
export const load: PageServerLoad = async () => {
	const { store, user } = requirePermission({ installerPay: ['read'] });
	return readInStore(store.id, async (tx) => {
		const mine = await statements.list(tx, { installerId: user.id });
		const withLines = [];
		for (const s of mine.slice(0, 24)) {
			const lines = await statements.lines(tx, s.id);
			withLines.push({
				id: s.id,
				periodStart: s.periodStart,
				periodEnd: s.periodEnd,
				currency: s.currency,
				status: s.status,
				totalCents: s.totalCents,
				paidReference: s.status === 'paid' ? s.paidReference : '',
				lines: lines.map((l) => ({
					id: l.id,
					kind: l.kind,
					jobNumber: l.jobNumber,
					description: l.description,
					reason: l.reason,
					amountCents: l.amountCents
				}))
			});
		}
		return { statements: withLines };
	});
};
