import { z } from 'zod';
import { optionalMoneyField, textField } from '$lib/input/zod';
import { email, id, optionalText, requiredText } from './fields';

/** At most this many adjustment lines on one change order. */
export const MAX_ADJUSTMENT_LINES = 20;
/** An adjustment moves the price or the pay by at most this much (100,000.00 in the currency). */
export const MAX_ADJUSTMENT_MINOR = 10_000_000;

const signedMoney = (currency: string, label: string) =>
	optionalMoneyField(currency, {
		label,
		min: -MAX_ADJUSTMENT_MINOR,
		max: MAX_ADJUSTMENT_MINOR
	});

/**
 * A manager's adjustment lines (`adjustments.0.description`, `.amount`, `.pay`): a row left
 * blank is dropped; a row with anything in it needs its description and an amount or a pay.
 */
export const adjustSchema = (currency: string) =>
	z.object({
		adjustments: z
			.array(
				z
					.object({
						description: textField.pipe(z.string().max(200, 'Keep it under 200 characters')),
						amount: signedMoney(currency, 'the amount (negative for a credit)'),
						pay: signedMoney(currency, 'the installer’s pay')
					})
					.optional(),
				{ error: 'Send the adjustment lines as a list' }
			)
			.max(MAX_ADJUSTMENT_LINES, `At most ${MAX_ADJUSTMENT_LINES} adjustment lines`)
			.optional()
			.transform((rows, ctx) => {
				const kept: { description: string; amountCents: number; payCents: number }[] = [];
				(rows ?? []).forEach((row, i) => {
					if (!row) return;
					const blank = !row.description && row.amount === undefined && row.pay === undefined;
					if (blank) return;
					if (!row.description) {
						ctx.addIssue({
							code: 'custom',
							path: [i, 'description'],
							message: 'Say what the adjustment is for'
						});
						return;
					}
					if (row.amount === undefined && row.pay === undefined) {
						ctx.addIssue({
							code: 'custom',
							path: [i, 'amount'],
							message: 'Enter an amount or a pay change'
						});
						return;
					}
					kept.push({
						description: row.description,
						amountCents: row.amount ?? 0,
						payCents: row.pay ?? 0
					});
				});
				return kept;
			})
	});

export const sendChangeOrderSchema = z.object({ to: email });

export const managerDeclineSchema = z.object({
	reason: requiredText('Say why it is declined: the installer and the store will read it', 1000)
});

/** A typed name: at least two characters, one message when it is missing. */
const typedName = (message: string) =>
	z.string({ error: message }).trim().min(2, message).max(100, 'Keep it under 100 characters');

export const customerApproveSchema = z.object({
	changeOrderId: id,
	name: typedName('Type your full name to approve')
});

export const customerDeclineSchema = z.object({
	changeOrderId: id,
	reason: optionalText(1000)
});

export const payChangeOrderSchema = z.object({ changeOrderId: id });

export const signOffSchema = z.object({
	name: typedName('Type your full name to sign off the work')
});
