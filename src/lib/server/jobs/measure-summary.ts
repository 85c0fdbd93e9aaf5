import { areaText } from '$lib/measure/format';
import { summarize } from '$lib/measure/summary';
import * as measures from '../db/queries/measures';
import * as tradeSettings from '../db/queries/settings';
import type { StoreTx } from '../db/tenant';

/**
 * The job's measure in a line (rooms, floor area, last save), or null when nothing was measured.
 * With the store's settings not valid it says so (`settingsInvalid`) instead of a summary.
 */
export async function measureSummary(tx: StoreTx, jobId: string) {
	const stored = await measures.read(tx, jobId);
	if (!stored) return null;
	const checked = await tradeSettings.readChecked(tx);
	if (!checked.ok) return { settingsInvalid: true as const };
	const trade = checked.trade;
	const summary = summarize(stored.draft, trade.settings);
	return {
		...summary,
		area: areaText(summary.areaSqFt, trade.settings),
		updatedAt: stored.updatedAt,
		updatedByName: stored.updatedByName
	};
}
