import { describe, expect, it } from 'vitest';
import {
	handMove,
	canBook,
	canCheckIn,
	canComplete,
	canDelete,
	canMove,
	canQuote,
	canRaiseChangeOrder,
	canReport,
	canSignOff,
	canStartOnSite,
	isOpen,
	JOB_STATUSES,
	jobLabel,
	nextStatuses,
	payableNow,
	SITE_MOVES,
	soldByDeposit
} from './status';

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

	it('moves on site only by allowed steps: booked, checked in, completed (issue 10)', () => {
		for (const { from, to } of Object.values(SITE_MOVES)) expect(canMove(from, to)).toBe(true);
		const where = (rule: (s: (typeof JOB_STATUSES)[number]) => boolean) =>
			JOB_STATUSES.filter(rule);
		expect(where(canBook)).toEqual(['sold', 'scheduled']);
		expect(where(canCheckIn)).toEqual(['scheduled', 'in_progress']);
		expect(where(canReport)).toEqual(['in_progress']);
		expect(where(canRaiseChangeOrder)).toEqual(['in_progress']);
		expect(where(canComplete)).toEqual(['in_progress']);
		expect(where(canSignOff)).toEqual(['completed']);
		// Each rule's first state is where its move starts.
		expect(canBook(SITE_MOVES.book.from) && canCheckIn(SITE_MOVES.checkIn.from)).toBe(true);
		expect(canComplete(SITE_MOVES.complete.from)).toBe(true);
	});

	it('names jobs J- and their number', () => {
		expect(jobLabel(1001)).toBe('J-1001');
	});

	it('quotes only until the customer accepts', () => {
		expect(JOB_STATUSES.filter(canQuote)).toEqual(['draft', 'quoted']);
	});

	it('takes the deposit once accepted and the balance once completed, nothing else', () => {
		expect(JOB_STATUSES.map((s) => [s, payableNow(s)]).filter(([, p]) => p)).toEqual([
			['accepted', 'deposit'],
			['completed', 'balance']
		]);
		expect(JOB_STATUSES.filter(soldByDeposit)).toEqual(['accepted']);
		// A deposit sells the job: the move it makes is one the state machine allows.
		expect(canMove('accepted', 'sold')).toBe(true);
	});

	it('lets the installer start only a booked job', () => {
		expect(JOB_STATUSES.filter(canStartOnSite)).toEqual(['scheduled']);
	});

	it('deletes only jobs never sold, or given up', () => {
		expect(JOB_STATUSES.filter(canDelete)).toEqual(['draft', 'cancelled']);
	});
});

describe('moves by hand (issue 9, item 9)', () => {
	const none = {
		quoteSent: false,
		quoteAccepted: false,
		depositDue: true,
		balanceDue: true,
		booked: false
	};

	it('need what each step stands for, and skip none', () => {
		expect(handMove('draft', 'quoted', none).ok).toBe(false);
		expect(handMove('draft', 'quoted', { ...none, quoteSent: true }).ok).toBe(true);
		expect(handMove('draft', 'sold', { ...none, quoteAccepted: true, depositDue: false })).toEqual({
			ok: false,
			message: 'A draft job cannot become sold.'
		});
		expect(handMove('quoted', 'accepted', { ...none, quoteSent: true }).ok).toBe(false);
		expect(handMove('accepted', 'sold', { ...none, quoteAccepted: true }).ok).toBe(false);
		expect(
			handMove('accepted', 'sold', { ...none, quoteAccepted: true, depositDue: false }).ok
		).toBe(true);
		expect(handMove('sold', 'scheduled', none).ok).toBe(false);
		expect(handMove('sold', 'scheduled', { ...none, booked: true }).ok).toBe(true);
		expect(handMove('scheduled', 'sold', { ...none, booked: true }).ok).toBe(false);
		expect(handMove('completed', 'closed', none).ok).toBe(false);
		expect(handMove('completed', 'closed', { ...none, balanceDue: false }).ok).toBe(true);
	});

	it('let any job before completion be cancelled, and none after', () => {
		for (const s of JOB_STATUSES) {
			expect(handMove(s, 'cancelled', none).ok).toBe(canMove(s, 'cancelled'));
		}
	});
});
