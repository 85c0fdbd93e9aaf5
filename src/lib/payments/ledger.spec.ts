import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	ledger,
	paymentState,
	refundable,
	statusAfterRefunds,
	type LedgerPayment,
	type LedgerRefund
} from './ledger';

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

	it('counts partial refunds against what was paid, and neither pending nor failed payments; a refunded deposit is not due again', () => {
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
			depositDueCents: 0,
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
			overpaidCents: 5_000
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

	it('counts every refund line given, never one refused', () => {
		const l = ledger({
			quoteTotalCents: 10_000,
			depositCents: 0,
			payments: [pay(10_000, { refundedCents: 3_000 })],
			refunds: [
				{ amountCents: 1_000, reason: 'other', status: 'succeeded' },
				{ amountCents: 2_000, reason: 'overcharge', status: 'pending' },
				{ amountCents: 9_000, reason: 'other', status: 'failed' }
			]
		});
		expect(l.refundLinesCents).toBe(3_000);
	});

	it('has nothing to refund on a pending or failed payment', () => {
		expect(refundable(pay(5_000, { status: 'pending' }))).toBe(0);
		expect(refundable(pay(5_000, { status: 'failed' }))).toBe(0);
	});
});

// Issue 9, item 11. The rule checked: balance = owed − paid + refunded − credits (common practice
// in bookkeeping for customer accounts: a refund gives money back, a credit lowers what is owed).
describe('refunds by reason', () => {
	const refund = (
		amountCents: number,
		reason: LedgerRefund['reason'],
		status: LedgerRefund['status'] = 'succeeded'
	): LedgerRefund => ({ amountCents, reason, status });

	it('an overcharge refund of $150 on a $651.16 deposit is a credit: the balance and deposit do not move', () => {
		const before = ledger({
			quoteTotalCents: 217_053,
			depositCents: 65_116,
			payments: [pay(65_116)]
		});
		const after = ledger({
			quoteTotalCents: 217_053,
			depositCents: 65_116,
			payments: [pay(65_116, { status: 'succeeded', refundedCents: 15_000 })],
			refunds: [refund(15_000, 'overcharge')]
		});
		expect(after.balanceDueCents).toBe(before.balanceDueCents);
		expect(after).toMatchObject({
			refundedCents: 15_000,
			overchargeCreditCents: 15_000,
			creditsCents: 15_000,
			depositDueCents: 0,
			closed: false
		});
		expect(paymentState({ status: 'succeeded', amountCents: 65_116, refundedCents: 15_000 })).toBe(
			'partly_refunded'
		);
	});

	it('a cancellation refund closes the job’s money: nothing is due, deposit or balance', () => {
		const l = ledger({
			quoteTotalCents: 217_053,
			depositCents: 65_116,
			payments: [pay(65_116, { status: 'refunded', refundedCents: 65_116 })],
			refunds: [refund(65_116, 'cancellation')]
		});
		expect(l).toMatchObject({
			balanceDueCents: 0,
			depositDueCents: 0,
			closed: true,
			closingCreditCents: 217_053,
			overpaidCents: 0
		});
		// A cancelled job owes nothing more, refund or not.
		expect(
			ledger({ quoteTotalCents: 1_000, depositCents: 300, payments: [], cancelled: true })
		).toMatchObject({ balanceDueCents: 0, depositDueCents: 0, closed: true });
	});

	it('another refund is money given back: owed again, but never the deposit', () => {
		const l = ledger({
			quoteTotalCents: 100_000,
			depositCents: 30_000,
			payments: [pay(30_000, { refundedCents: 5_000 })],
			refunds: [refund(5_000, 'other')]
		});
		expect(l).toMatchObject({ balanceDueCents: 75_000, depositDueCents: 0, creditsCents: 0 });
	});

	it('a failed refund counts for nothing; a pending one counts as made', () => {
		const base = { quoteTotalCents: 10_000, depositCents: 0, payments: [pay(10_000)] };
		expect(ledger({ ...base, refunds: [refund(2_000, 'overcharge', 'failed')] })).toMatchObject({
			creditsCents: 0,
			balanceDueCents: 0
		});
		expect(ledger({ ...base, refunds: [refund(2_000, 'cancellation', 'failed')] }).closed).toBe(
			false
		);
		expect(
			ledger({ ...base, refunds: [refund(2_000, 'overcharge', 'pending')] }).creditsCents
		).toBe(2_000);
	});

	it('a payment is partly refunded until nothing is left on it', () => {
		const p = { status: 'succeeded' as const, amountCents: 5_000 };
		expect(paymentState({ ...p, refundedCents: 0 })).toBe('paid');
		expect(paymentState({ ...p, refundedCents: 4_999 })).toBe('partly_refunded');
		expect(paymentState({ ...p, status: 'refunded', refundedCents: 5_000 })).toBe('refunded');
		expect(statusAfterRefunds(5_000, 4_999)).toBe('succeeded');
		expect(statusAfterRefunds(5_000, 5_000)).toBe('refunded');
		expect(paymentState({ ...p, status: 'pending', refundedCents: 0 })).toBe('pending');
	});
});

describe('the ledger’s properties', () => {
	const cents = (max: number) => fc.integer({ min: 0, max });
	const reason = fc.constantFrom<LedgerRefund['reason']>('overcharge', 'cancellation', 'other');
	const refundStatus = fc.constantFrom<LedgerRefund['status']>('pending', 'succeeded', 'failed');
	/** Payments with refunds made against them, never more than each payment. */
	const job = fc
		.record({
			quote: cents(50_000_000),
			depositShare: fc.integer({ min: 0, max: 100 }),
			changeOrders: fc.integer({ min: -1_000_000, max: 5_000_000 }),
			cancelled: fc.boolean(),
			payments: fc.array(
				fc.record({
					amount: fc.integer({ min: 1, max: 10_000_000 }),
					status: fc.constantFrom<LedgerPayment['status']>('pending', 'succeeded', 'failed'),
					purpose: fc.constantFrom<LedgerPayment['purpose']>('deposit', 'balance'),
					refunds: fc.array(
						fc.record({ share: fc.integer({ min: 1, max: 100 }), reason, status: refundStatus }),
						{ maxLength: 4 }
					)
				}),
				{ maxLength: 6 }
			)
		})
		.map((j) => {
			const payments: LedgerPayment[] = [];
			const refunds: LedgerRefund[] = [];
			for (const p of j.payments) {
				let left = p.status === 'succeeded' ? p.amount : 0;
				let given = 0;
				for (const r of p.refunds) {
					const amount = Math.min(left, Math.max(1, Math.floor((p.amount * r.share) / 100)));
					if (amount <= 0) break;
					refunds.push({ amountCents: amount, reason: r.reason, status: r.status });
					if (r.status !== 'failed') {
						left -= amount;
						given += amount;
					}
				}
				payments.push({
					purpose: p.purpose,
					status: p.status === 'succeeded' ? statusAfterRefunds(p.amount, given) : p.status,
					amountCents: p.amount,
					refundedCents: given,
					feeCents: null
				});
			}
			return {
				quoteTotalCents: j.quote,
				depositCents: Math.floor((j.quote * j.depositShare) / 100),
				changeOrdersCents: j.changeOrders,
				cancelled: j.cancelled,
				payments,
				refunds
			};
		});

	it('balance = owed − paid + refunded − credits, to the cent', () => {
		fc.assert(
			fc.property(job, (input) => {
				const l = ledger(input);
				expect(l.balanceCents).toBe(
					l.owedCents - l.receivedCents + l.refundedCents - l.creditsCents
				);
				expect(l.balanceDueCents - l.overpaidCents).toBe(l.balanceCents);
				expect(Math.min(l.balanceDueCents, l.overpaidCents)).toBe(0);
				for (const v of Object.values(l)) {
					if (typeof v === 'number') expect(Number.isSafeInteger(v)).toBe(true);
				}
			})
		);
	});

	it('refunds never exceed what was paid, on each payment and in all', () => {
		fc.assert(
			fc.property(job, (input) => {
				const l = ledger(input);
				expect(l.refundedCents).toBeLessThanOrEqual(l.receivedCents);
				expect(l.netPaidCents).toBeGreaterThanOrEqual(0);
				for (const p of input.payments) {
					expect(p.refundedCents).toBeLessThanOrEqual(p.amountCents);
					expect(refundable(p)).toBeGreaterThanOrEqual(0);
				}
			})
		);
	});

	it('an overcharge refund never moves the balance; a refund never makes the deposit due', () => {
		fc.assert(
			fc.property(job, fc.integer({ min: 1, max: 100 }), (input, share) => {
				const i = input.payments.findIndex((p) => refundable(p) > 0);
				if (i < 0) return;
				const before = ledger(input);
				const p = input.payments[i];
				const amount = Math.max(1, Math.floor((refundable(p) * share) / 100));
				const given = p.refundedCents + amount;
				const payments = input.payments.map((q, k) =>
					k === i
						? { ...q, refundedCents: given, status: statusAfterRefunds(q.amountCents, given) }
						: q
				);
				for (const r of ['overcharge', 'other', 'cancellation'] as const) {
					const after = ledger({
						...input,
						payments,
						refunds: [...input.refunds, refund(amount, r)]
					});
					expect(after.depositDueCents).toBeLessThanOrEqual(before.depositDueCents);
					if (r === 'overcharge') expect(after.balanceCents).toBe(before.balanceCents);
					if (r === 'cancellation') expect(after.balanceDueCents).toBe(0);
				}
			})
		);
	});

	it('a credit that leaves less than the deposit: paying what is owed settles the deposit', () => {
		// Found by the property above: a $2.99 quote with a 2¢ deposit and a $2.98 credit owes
		// 1¢; once that 1¢ is paid and then refunded, the deposit is not due again.
		const input = {
			quoteTotalCents: 299,
			depositCents: 2,
			changeOrdersCents: -298,
			cancelled: false,
			payments: [
				{
					purpose: 'deposit' as const,
					status: 'refunded' as const,
					amountCents: 1,
					refundedCents: 1,
					feeCents: null
				}
			],
			refunds: [refund(1, 'other')]
		};
		const after = ledger(input);
		expect(after.balanceDueCents).toBe(1);
		expect(after.depositDueCents).toBe(0);
		expect(ledger({ ...input, payments: [], refunds: [] }).depositDueCents).toBe(1);
	});

	function refund(amountCents: number, reason: LedgerRefund['reason']): LedgerRefund {
		return { amountCents, reason, status: 'succeeded' };
	}
});
