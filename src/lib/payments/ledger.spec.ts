import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ledger, refundable, type LedgerPayment } from './ledger';

const pay = (amountCents: number, extra: Partial<LedgerPayment> = {}): LedgerPayment => ({
	purpose: 'deposit',
	status: 'succeeded',
	amountCents,
	refundedCents: 0,
	feeCents: null,
	...extra
});

describe('a job’s ledger', () => {
	it('owes the quote less what was paid, and the deposit first', () => {
		const l = ledger({ quoteTotalCents: 236_461, depositCents: 70_938, payments: [] });
		expect(l).toMatchObject({ balanceDueCents: 236_461, depositDueCents: 70_938, netPaidCents: 0 });
		const after = ledger({
			quoteTotalCents: 236_461,
			depositCents: 70_938,
			payments: [pay(70_938, { feeCents: 2_087 })]
		});
		expect(after).toMatchObject({ balanceDueCents: 165_523, depositDueCents: 0, feesCents: 2_087 });
	});

	it('counts partial refunds against what was paid, and neither pending nor failed payments', () => {
		const l = ledger({
			quoteTotalCents: 100_000,
			depositCents: 30_000,
			payments: [
				pay(30_000, { status: 'refunded', refundedCents: 10_000 }),
				pay(50_000, { status: 'pending' }),
				pay(20_000, { status: 'failed' })
			]
		});
		expect(l).toMatchObject({
			receivedCents: 30_000,
			refundedCents: 10_000,
			netPaidCents: 20_000,
			balanceDueCents: 80_000,
			depositDueCents: 10_000,
			pendingCents: 50_000
		});
	});

	it('adds approved change orders, credits included, and shows an overpayment as credit', () => {
		expect(
			ledger({
				quoteTotalCents: 50_000,
				depositCents: 0,
				changeOrdersCents: -5_000,
				payments: [pay(50_000)]
			})
		).toMatchObject({
			owedCents: 45_000,
			balanceDueCents: 0,
			creditCents: 5_000
		});
	});

	it('refuses money that is not whole cents, and refunds above their payment', () => {
		expect(() => ledger({ quoteTotalCents: 1, depositCents: 0, payments: [pay(10.5)] })).toThrow(
			/integers/
		);
		expect(() =>
			ledger({ quoteTotalCents: 1, depositCents: 0, payments: [pay(10, { refundedCents: 11 })] })
		).toThrow(/exceed/);
	});

	it('never lets refunds exceed what was paid (property)', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 1, max: 10_000_000 }),
				fc.integer({ min: 0, max: 10_000_000 }),
				(amount, refunded) => {
					const r = Math.min(amount, refunded);
					const p = pay(amount, { refundedCents: r, status: r ? 'refunded' : 'succeeded' });
					expect(refundable(p)).toBe(amount - r);
					expect(
						ledger({ quoteTotalCents: amount, depositCents: 0, payments: [p] }).balanceDueCents
					).toBe(r);
				}
			)
		);
	});

	it('has nothing to refund on a pending or failed payment', () => {
		expect(refundable(pay(5_000, { status: 'pending' }))).toBe(0);
		expect(refundable(pay(5_000, { status: 'failed' }))).toBe(0);
	});
});
