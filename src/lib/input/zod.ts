/**
 * The readers of this module as zod fields, for form schemas: each takes the text a form posts
 * (or nothing) and gives the value, or a field issue with the reader's message. Browser-safe.
 */
import { z } from 'zod';
import type { LengthUnit } from '$lib/estimating';
import { readLength, readVolume, type LengthOptions } from './length';
import { readMoney, readPercentBps, type MoneyOptions } from './money';
import { readNumber, type NumberOptions, type Read } from './number';

/** A text field, trimmed; missing is empty. */
export const textField = z
	.string()
	.optional()
	.transform((v) => (v ?? '').trim());

/** A required field read by `read`: empty gets the reader's own "Enter …" message. */
export function requiredField<T>(read: (text: string) => Read<T>) {
	return textField.transform((v, ctx) => {
		const r = read(v);
		if (!r.ok) {
			ctx.addIssue({ code: 'custom', message: r.message });
			return z.NEVER;
		}
		return r.value;
	});
}

/** A field read by `read` that may be left empty (`undefined`). */
export function optionalField<T>(read: (text: string) => Read<T>) {
	return textField.transform((v, ctx) => {
		if (!v) return undefined;
		const r = read(v);
		if (!r.ok) {
			ctx.addIssue({ code: 'custom', message: r.message });
			return z.NEVER;
		}
		return r.value;
	});
}

/** A number by `readNumber`. */
export const numberField = (options: NumberOptions) => requiredField((v) => readNumber(v, options));

/** A number by `readNumber`, or `undefined` when empty. */
export const optionalNumberField = (options: NumberOptions) =>
	optionalField((v) => readNumber(v, options));

/** An amount in `currency`, to its smallest unit, by `readMoney`. */
export const moneyField = (currency: string, options: MoneyOptions) =>
	requiredField((v) => readMoney(v, currency, options));

/** An amount in `currency` by `readMoney`, or `undefined` when empty. */
export const optionalMoneyField = (currency: string, options: MoneyOptions) =>
	optionalField((v) => readMoney(v, currency, options));

/** A percentage to basis points, by `readPercentBps`. */
export const percentBpsField = (label: string) => requiredField((v) => readPercentBps(v, label));

/** A length to inches, by `readLength` (plain numbers in `unit`); empty is `undefined`. */
export const optionalLengthField = (unit: LengthUnit, options: LengthOptions) =>
	optionalField((v) => readLength(v, unit, options));

/** A volume to cubic inches, by `readVolume`; empty is `undefined`. */
export const optionalVolumeField = optionalField(readVolume);
