import { describe, expect, it } from 'vitest';
import type { PriceLine } from '$lib/estimating';
import { diffLines } from './quote-diff';

function line(key: string, qty: number, unitCents: number, roomId = 'r1'): PriceLine {
	return {
		id: `${roomId}-${key}`,
		roomId,
		ref: { type: 'prep', kind: 'seam_patch' },
		key,
		group: 'prep',
		description: key,
		basis: 'each',
		qty,
		unitCents,
		amountCents: qty * unitCents,
		taxable: false,
		findingIds: []
	} as PriceLine;
}

describe('what changed between quote versions', () => {
	it('names added, removed and changed lines with the money each moves', () => {
		const before = [line('a', 2, 100), line('b', 1, 500), line('c', 3, 10)];
		const after = [line('a', 2, 100), line('b', 2, 500), line('d', 1, 999)];
		expect(diffLines(before, after).map((c) => [c.description, c.kind, c.deltaCents])).toEqual([
			['b', 'changed', 500],
			['d', 'added', 999],
			['c', 'removed', -30]
		]);
	});

	it('tells the same item in two rooms apart', () => {
		const changes = diffLines(
			[line('a', 1, 100, 'r1')],
			[line('a', 1, 100, 'r1'), line('a', 1, 100, 'r2')]
		);
		expect(changes).toEqual([expect.objectContaining({ roomId: 'r2', kind: 'added' })]);
	});
});
