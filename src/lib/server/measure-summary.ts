import { areaText } from '$lib/measure/format';
import { summarize } from '$lib/measure/summary';
import * as measures from './db/queries/measures';
import * as tradeSettings from './db/queries/settings';

/** The job's measure in a line (rooms, floor area, last save), or null when nothing was measured. */
export async function measureSummary(storeId: string, jobId: string) {
	const [stored, trade] = await Promise.all([
		measures.read(storeId, jobId),
		tradeSettings.read(storeId)
	]);
	if (!stored) return null;
	const summary = summarize(stored.draft, trade.settings);
	return {
		...summary,
		area: areaText(summary.areaSqFt, trade.settings),
		updatedAt: stored.updatedAt,
		updatedByName: stored.updatedByName
	};
}
