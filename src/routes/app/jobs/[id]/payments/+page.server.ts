import * as jobs from '$lib/server/db/queries/jobs';
import * as payments from '$lib/server/db/queries/payments';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { fieldErrors, parseForm, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { recordInStore } from '$lib/server/payments/record';
import { refundCard, refundInStore } from '$lib/server/payments/refunds';
import { priceField } from '$lib/schemas/price-book';
import { formatMoney } from '$lib/format';
import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

/** Dollars typed, to integer cents above zero. */
const amountField = (what: string) =>
	priceField(what).refine((cents) => cents > 0, `Enter ${what}`);

const recordSchema = z
	.object({
		purpose: z.enum(['deposit', 'balance'], { error: 'Choose what the payment is for' }),
		method: z.enum(['cash', 'cheque', 'card_terminal', 'bank_transfer'], {
			error: 'Choose how it was paid'
		}),
		amount: amountField('the amount received'),
		reference: z.string().trim().max(120, 'Keep it under 120 characters').default('')
	})
	.refine((v) => v.method === 'cash' || v.reference, {
		path: ['reference'],
		message: 'Write down the cheque number, slip or transfer reference'
	});
const refundSchema = z.object({
	paymentId: z.string().min(1),
	amount: amountField('the amount to give back'),
	reason: z.enum(['cancellation', 'overcharge', 'other'], { error: 'Choose a reason' }),
	note: z.string().trim().max(500, 'Keep the note under 500 characters').default('')
});

export const load: PageServerLoad = async ({ params }) => {
	const { store, user, role } = requirePermission({ payment: ['read'] });
	const { job, money } = await readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, { userId: user.id, role });
		if (!job) error(404, 'Not found');
		return { job, money: await payments.moneyFor(tx, job.id) };
	});
	return {
		job,
		money,
		canRecord: can(role, { payment: ['record'] }),
		canRefund: can(role, { payment: ['refund'] }),
		showFees: can(role, { report: ['read'] })
	};
};

export const actions: Actions = {
	record: async ({ request, params }) => {
		const { store, user } = requirePermission({ payment: ['record'] });
		const parsed = await parseForm(request, recordSchema);
		if (!parsed.ok) return parsed.failure;
		const { form } = parsed;
		const { amount, ...input } = parsed.data;
		const { result, money } = await inStore(store.id, async (tx) => {
			const result = await recordInStore(tx, params.id, { ...input, amountCents: amount }, user.id);
			// What is due, for the refusal, as this same transaction saw it.
			const tooMuch = !result.ok && result.reason === 'more_than_due';
			return { result, money: tooMuch ? await payments.moneyFor(tx, params.id) : null };
		});
		if (!result.ok) {
			if (result.reason === 'not_found') error(404, 'Not found');
			if (result.reason === 'no_accepted_quote' || !money)
				return refuse(form, {}, 'The job has no accepted quote to pay yet.', 409);
			return refuse(form, {
				amount: [`More than is due: ${formatMoney(money.ledger.balanceDueCents, money.currency)}`]
			});
		}
		return { recorded: true };
	},
	refund: async ({ request }) => {
		const { store, user } = requirePermission({ payment: ['refund'] });
		const fields = Object.fromEntries(await request.formData()) as Record<string, string>;
		const parsed = refundSchema.safeParse(fields);
		// Each payment has its own refund form: the answer says which one it is for.
		const refundFor = fields.paymentId ?? '';
		const values = { amount: fields.amount ?? '', note: fields.note ?? '' };
		if (!parsed.success) return fail(400, { refundFor, values, errors: fieldErrors(parsed.error) });
		const input = {
			amountCents: parsed.data.amount,
			reason: parsed.data.reason,
			note: parsed.data.note
		};
		const refused = (status: number, message: string) =>
			fail(status, { refundFor, values, errors: { amount: [message] } });
		const { paymentId } = parsed.data;
		const byHand = await inStore(store.id, (tx) => refundInStore(tx, paymentId, input, user.id));
		if (byHand.ok) return { refunded: true };
		// A card payment goes back through Stripe, to the card it came from.
		const result =
			byHand.reason === 'card' ? await refundCard(store.id, paymentId, input, user.id) : byHand;
		if (result.ok) return { refunded: true };
		switch (result.reason) {
			case 'not_found':
				error(404, 'Not found');
			// falls through: error() throws
			case 'nothing_to_refund':
				return refused(409, 'Nothing is left to refund on this payment.');
			case 'more_than_paid':
				return refused(409, 'More than is left on this payment.');
			case 'stripe':
				return refused(
					502,
					`Stripe refused the refund: ${'message' in result ? result.message : ''}`
				);
			default:
				return refused(409, 'This payment cannot be refunded here.');
		}
	}
};
