import type { PriceLine } from '$lib/estimating';

export interface LineChange {
	description: string;
	roomId?: string;
	kind: 'added' | 'removed' | 'changed';
	before?: Pick<PriceLine, 'qty' | 'unitCents' | 'amountCents' | 'basis'>;
	after?: Pick<PriceLine, 'qty' | 'unitCents' | 'amountCents' | 'basis'>;
	deltaCents: number;
}

/** A line is the same item in the same room (or the whole job) from one version to the next. */
const identity = (line: PriceLine) => `${line.roomId ?? ''}|${line.key}`;
const figures = ({ qty, unitCents, amountCents, basis }: PriceLine) => ({
	qty,
	unitCents,
	amountCents,
	basis
});

/** What changed between two versions of a quote, line by line, in the newer version's order. */
export function diffLines(before: PriceLine[], after: PriceLine[]): LineChange[] {
	const old = new Map(before.map((l) => [identity(l), l]));
	const changes: LineChange[] = [];
	for (const line of after) {
		const prev = old.get(identity(line));
		old.delete(identity(line));
		if (!prev) {
			changes.push({
				description: line.description,
				roomId: line.roomId,
				kind: 'added',
				after: figures(line),
				deltaCents: line.amountCents
			});
		} else if (
			prev.qty !== line.qty ||
			prev.unitCents !== line.unitCents ||
			prev.amountCents !== line.amountCents
		) {
			changes.push({
				description: line.description,
				roomId: line.roomId,
				kind: 'changed',
				before: figures(prev),
				after: figures(line),
				deltaCents: line.amountCents - prev.amountCents
			});
		}
	}
	for (const line of old.values()) {
		changes.push({
			description: line.description,
			roomId: line.roomId,
			kind: 'removed',
			before: figures(line),
			deltaCents: -line.amountCents
		});
	}
	return changes;
}
