import * as jobs from '$lib/server/db/queries/jobs';
import * as payments from '$lib/server/db/queries/payments';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { fieldErrors, parseForm, refuse, type FieldErrors } from '$lib/server/forms';
import { seesCardFees, visibleMoney } from '$lib/server/figures';
import { requirePermission } from '$lib/server/guards';
import { requireJob, requireObjects } from '$lib/server/object-access';
import { can } from '$lib/server/permissions';
import { recordInStore } from '$lib/server/payments/record';
import { refundCard, refundInStore } from '$lib/server/payments/refunds';
import { formFields } from '$lib/input';
import { moneyField } from '$lib/input/zod';
import { formatMoney } from '$lib/format';
import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

/** An amount typed in the job's currency, to its smallest unit, above zero. */
const amountField = (what: string, currency: string) =>
	moneyField(currency, { label: what }).refine((minor) => minor > 0, `Enter ${what}`);

const recordSchema = (currency: string) =>
	z
		.object({
			purpose: z.enum(['deposit', 'balance'], { error: 'Choose what the payment is for' }),
			method: z.enum(['cash', 'cheque', 'card_terminal', 'bank_transfer'], {
				error: 'Choose how it was paid'
			}),
			amount: amountField('the amount received', currency),
			reference: z.string().trim().max(120, 'Keep it under 120 characters').default('')
		})
		.refine((v) => v.method === 'cash' || v.reference, {
			path: ['reference'],
			message: 'Write down the cheque number, slip or transfer reference'
		});
const refundSchema = (currency: string) =>
	z.object({
		paymentId: z.string().min(1),
		amount: amountField('the amount to give back', currency),
		reason: z.enum(['cancellation', 'overcharge', 'other'], { error: 'Choose a reason' }),
		note: z.string().trim().max(500, 'Keep the note under 500 characters').default('')
	});

export const load: PageServerLoad = async ({ params }) => {
	const { store, grants, scope } = requirePermission({ payment: ['read'] });
	const { job, money } = await readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		if (!job) error(404, 'Not found');
		return { job, money: await payments.moneyFor(tx, job.id) };
	});
	return {
		job,
		money: visibleMoney(grants, money),
		canRecord: can(grants, { payment: ['record'] }),
		canRefund: can(grants, { payment: ['refund'] }),
		showFees: seesCardFees(grants)
	};
};

export const actions: Actions = {
	record: async ({ request, params }) => {
		const member = requirePermission({ payment: ['record'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const { currency } = await readInStore(store.id, (tx) => payments.moneyFor(tx, params.id));
		const parsed = await parseForm(request, recordSchema(currency));
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
	refund: async ({ request, params }) => {
		const member = requirePermission({ payment: ['refund'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const fields = formFields(await request.formData());
		// Each payment has its own refund form: the answer says which one it is for.
		const refundFor = fields.paymentId ?? '';
		const values = {
			amount: fields.amount ?? '',
			note: fields.note ?? '',
			reason: fields.reason ?? ''
		};
		// The amount is typed in the payment's own currency.
		const money = await readInStore(store.id, (tx) => payments.moneyFor(tx, params.id));
		const currency = money.payments.find((p) => p.id === refundFor)?.currency ?? money.currency;
		const parsed = refundSchema(currency).safeParse(fields);
		if (!parsed.success) return fail(400, { refundFor, values, errors: fieldErrors(parsed.error) });
		await requireObjects(member, 'payment', [parsed.data.paymentId]);
		const input = {
			amountCents: parsed.data.amount,
			reason: parsed.data.reason,
			note: parsed.data.note
		};
		const refused = (status: number, message: string) =>
			fail(status, { refundFor, values, errors: { amount: [message] } as FieldErrors });
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
