import { describe, expect, it } from 'vitest';
import { canMove, isOpen, JOB_STATUSES, jobLabel, nextStatuses } from './status';

// The job's states and moves as PRODUCT.md ("States") defines them.
describe('job status', () => {
	it('walks the sale from draft to closed one step at a time', () => {
		const path = [
			'draft',
			'quoted',
			'accepted',
			'sold',
			'scheduled',
			'in_progress',
			'completed',
			'closed'
		] as const;
		for (let i = 0; i < path.length - 1; i++) {
			expect(canMove(path[i], path[i + 1])).toBe(true);
		}
	});

	it('never skips a step forward', () => {
		expect(canMove('draft', 'sold')).toBe(false);
		expect(canMove('accepted', 'scheduled')).toBe(false);
		expect(canMove('quoted', 'completed')).toBe(false);
	});

	it('cancels from any state before completed, and not after', () => {
		for (const s of ['draft', 'quoted', 'accepted', 'sold', 'scheduled', 'in_progress'] as const) {
			expect(canMove(s, 'cancelled')).toBe(true);
		}
		for (const s of ['completed', 'closed', 'cancelled'] as const) {
			expect(canMove(s, 'cancelled')).toBe(false);
		}
	});

	it('ends at closed and cancelled', () => {
		expect(nextStatuses('closed')).toEqual([]);
		expect(nextStatuses('cancelled')).toEqual([]);
		expect(isOpen('closed')).toBe(false);
		expect(isOpen('cancelled')).toBe(false);
		expect(JOB_STATUSES.filter(isOpen)).toHaveLength(7);
	});

	it('lets a quote go back to draft for changes, and a booking be undone', () => {
		expect(canMove('quoted', 'draft')).toBe(true);
		expect(canMove('scheduled', 'sold')).toBe(true);
	});

	it('names jobs J- and their number', () => {
		expect(jobLabel(1001)).toBe('J-1001');
	});
});
