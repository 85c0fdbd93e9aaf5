import * as jobs from '$lib/server/db/queries/jobs';
import * as payments from '$lib/server/db/queries/payments';
import { fieldErrors, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { refundCard } from '$lib/server/payments';
import { parseMoney } from '$lib/schemas/money';
import { formatMoney } from '$lib/format';
import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

const recordSchema = z.object({
	purpose: z.enum(['deposit', 'balance'], { error: 'Choose what the payment is for' }),
	method: z.enum(['cash', 'cheque', 'card_terminal', 'bank_transfer'], {
		error: 'Choose how it was paid'
	}),
	amount: z.string(),
	reference: z.string().trim().max(120, 'Keep it under 120 characters').default('')
});
const refundSchema = z.object({
	paymentId: z.string().min(1),
	amount: z.string(),
	reason: z.enum(['cancellation', 'overcharge', 'other'], { error: 'Choose a reason' }),
	note: z.string().trim().max(500, 'Keep the note under 500 characters').default('')
});

export const load: PageServerLoad = async ({ params }) => {
	const { store, user, role } = requirePermission({ payment: ['read'] });
	const job = await jobs.read(store.id, params.id, { userId: user.id, role });
	if (!job) error(404, 'Not found');
	const money = await payments.moneyFor(store.id, job.id);
	return {
		job,
		money,
		canRecord: can(role, { payment: ['record'] }),
		canRefund: can(role, { payment: ['refund'] }),
		showFees: can(role, { report: ['read'] })
	};
};

async function readForm(request: Request) {
	const form = await request.formData();
	return { form, fields: Object.fromEntries(form) as Record<string, string> };
}

export const actions: Actions = {
	record: async ({ request, params }) => {
		const { store, user } = requirePermission({ payment: ['record'] });
		const { form, fields } = await readForm(request);
		const parsed = recordSchema.safeParse(fields);
		const amount = parseMoney(fields.amount ?? '');
		const errors = parsed.success ? {} : fieldErrors(parsed.error);
		if (!amount.ok) errors.amount = [amount.message];
		else if (amount.cents === 0) errors.amount = ['Enter the amount received'];
		if (parsed.success && parsed.data.method !== 'cash' && !parsed.data.reference) {
			errors.reference = ['Write down the cheque number, slip or transfer reference'];
		}
		if (Object.keys(errors).length || !parsed.success || !amount.ok) return refuse(form, errors);
		const result = await payments.recordInStore(
			store.id,
			params.id,
			{ ...parsed.data, amountCents: amount.cents },
			user.id
		);
		if (!result.ok) {
			if (result.reason === 'not_found') error(404, 'Not found');
			if (result.reason === 'no_accepted_quote')
				return refuse(form, {}, 'The job has no accepted quote to pay yet.', 409);
			const money = await payments.moneyFor(store.id, params.id);
			return refuse(form, {
				amount: [`More than is due: ${formatMoney(money.ledger.balanceDueCents, money.currency)}`]
			});
		}
		return { recorded: true };
	},
	refund: async ({ request }) => {
		const { store, user } = requirePermission({ payment: ['refund'] });
		const { fields } = await readForm(request);
		const parsed = refundSchema.safeParse(fields);
		const amount = parseMoney(fields.amount ?? '');
		const errors = parsed.success ? {} : fieldErrors(parsed.error);
		if (!amount.ok) errors.amount = [amount.message];
		else if (amount.cents === 0) errors.amount = ['Enter the amount to give back'];
		const refundFor = fields.paymentId ?? '';
		if (Object.keys(errors).length || !parsed.success || !amount.ok) {
			return fail(400, {
				refundFor,
				values: { amount: fields.amount ?? '', note: fields.note ?? '' },
				errors
			});
		}
		const input = { amountCents: amount.cents, reason: parsed.data.reason, note: parsed.data.note };
		const refused = (status: number, message: string) =>
			fail(status, {
				refundFor,
				values: { amount: fields.amount, note: fields.note },
				errors: { amount: [message] }
			});
		const inStore = await payments.refundInStore(store.id, parsed.data.paymentId, input, user.id);
		if (inStore.ok) return { refunded: true };
		// A card payment goes back through Stripe, to the card it came from.
		const result =
			inStore.reason === 'card'
				? await refundCard(store.id, parsed.data.paymentId, input, user.id)
				: inStore;
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
