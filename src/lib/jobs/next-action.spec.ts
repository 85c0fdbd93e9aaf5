import { describe, expect, it } from 'vitest';
import { nextAction, nextStep, type JobFacts, type JobPowers } from './next-action';

const fresh: JobFacts = {
	id: 'j1',
	status: 'draft',
	measured: false,
	quote: null,
	depositDueCents: 0,
	balanceDueCents: 0,
	booked: false,
	openChangeOrder: null,
	signedOff: false
};

const everything: JobPowers = {
	measure: true,
	buildQuote: true,
	sendQuote: true,
	takePayment: true,
	schedule: true,
	reviewChangeOrder: true,
	readQuote: true
};

/** A salesperson's powers: measure, quote and send; no payments taken, no schedule. */
const sales: JobPowers = {
	...everything,
	takePayment: false,
	schedule: false,
	reviewChangeOrder: false
};

const at = (patch: Partial<JobFacts>): JobFacts => ({ ...fresh, ...patch });

describe('the next step of a job', () => {
	it('walks the job from measure to close', () => {
		const walk: [Partial<JobFacts>, string][] = [
			[{}, 'measure'],
			[{ measured: true }, 'build_quote'],
			[{ measured: true, quote: { version: 1, status: 'draft' } }, 'send_quote'],
			[{ status: 'quoted', measured: true, quote: { version: 1, status: 'sent' } }, 'await_answer'],
			[
				{
					status: 'accepted',
					measured: true,
					quote: { version: 1, status: 'accepted' },
					depositDueCents: 45_000
				},
				'take_deposit'
			],
			[{ status: 'sold', quote: { version: 1, status: 'accepted' } }, 'book_install'],
			[{ status: 'scheduled', booked: true }, 'await_install'],
			[{ status: 'in_progress', booked: true }, 'await_report'],
			[
				{ status: 'in_progress', openChangeOrder: { number: 1, status: 'submitted' } },
				'review_change_order'
			],
			[
				{ status: 'in_progress', openChangeOrder: { number: 1, status: 'reviewed' } },
				'await_change_order'
			],
			[{ status: 'completed', balanceDueCents: 120_000 }, 'collect_balance'],
			[{ status: 'completed' }, 'await_sign_off'],
			[{ status: 'completed', signedOff: true }, 'close'],
			[{ status: 'closed', signedOff: true }, 'done'],
			[{ status: 'cancelled', measured: true }, 'cancelled']
		];
		for (const [patch, step] of walk) expect([patch, nextStep(at(patch))]).toEqual([patch, step]);
	});

	it('builds the next version when the customer sent the quote back', () => {
		const back = at({
			status: 'draft',
			measured: true,
			quote: { version: 2, status: 'changes_requested' }
		});
		const next = nextAction(back, everything);
		expect(next.step).toBe('build_quote');
		expect(next.action).toEqual({ label: 'Build quote version 3', href: '/app/jobs/j1/quote' });
		expect(next.note).toMatch(/asked for changes/);
	});

	it('gives each step its own place to act', () => {
		expect(nextAction(fresh, everything).action?.href).toBe('/app/jobs/j1/measure');
		expect(
			nextAction(at({ status: 'sold', quote: { version: 1, status: 'accepted' } }), everything)
				.action
		).toEqual({ label: 'Book the install', href: '/app/schedule?job=j1' });
		expect(
			nextAction(
				at({ status: 'in_progress', openChangeOrder: { number: 3, status: 'submitted' } }),
				everything
			).action
		).toEqual({ label: 'Review CO-3', href: '/app/jobs/j1/change-orders/3' });
		expect(nextAction(at({ status: 'completed', balanceDueCents: 1 }), everything).action).toEqual({
			label: 'Collect the balance',
			href: '/app/jobs/j1/payments'
		});
	});

	it('offers no button for a step the viewer may not take, and says who takes it', () => {
		const sold = at({ status: 'sold', quote: { version: 1, status: 'accepted' } });
		const next = nextAction(sold, sales);
		expect(next).toEqual({
			step: 'book_install',
			action: null,
			note: 'Next: the install is booked by whoever runs the schedule.'
		});
		const deposit = at({
			status: 'accepted',
			quote: { version: 1, status: 'accepted' },
			depositDueCents: 100
		});
		expect(nextAction(deposit, sales).action).toBeNull();
		// What a salesperson may do is still theirs.
		expect(nextAction(at({ measured: true }), sales).action?.label).toBe('Build the quote');
	});

	it('has no button while the job waits on the site or is over', () => {
		for (const f of [
			at({ status: 'in_progress' }),
			at({ status: 'completed' }),
			at({ status: 'closed' }),
			at({ status: 'cancelled' })
		]) {
			expect(nextAction(f, everything).action).toBeNull();
			expect(nextAction(f, everything).note.length).toBeGreaterThan(10);
		}
	});
});
