import { fail } from '@sveltejs/kit';
import type { z } from 'zod';
import { formFields, readFields } from '$lib/input';

export type FieldErrors = Record<string, string[]>;

/** What a form gets back when it is refused: what was typed (never passwords) and each field's problems. */
export interface FormFailure {
	values: Record<string, string>;
	errors: FieldErrors;
	/** A message for the whole form, not one field. */
	message?: string;
}

const SECRET_FIELDS = /password|confirm|token/i;

/**
 * The typed values of a form, to show again after a refusal; secrets are dropped, and so are
 * names no form of ours has (`__proto__`, see `fieldPath`).
 */
export function typedValues(form: FormData): Record<string, string> {
	const values = formFields(form);
	for (const key of Object.keys(values)) if (SECRET_FIELDS.test(key)) delete values[key];
	return values;
}

/** zod issues keyed by their field path (`rooms.0.width`). */
export function fieldErrors(error: z.ZodError): FieldErrors {
	const errors: FieldErrors = {};
	for (const issue of error.issues) {
		const key = issue.path.join('.') || '_form';
		(errors[key] ??= []).push(issue.message);
	}
	return errors;
}

/**
 * Parses a form with a zod schema. Fields named by path (`deposit.minimum`) are read into nested
 * objects by `readFields`, which refuses names that would reach a prototype. On failure the
 * action returns `fail(400, ...)` with the typed values and the field errors (or a message for
 * the whole form), so nothing the user typed is lost.
 */
export async function parseForm<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<
	| { ok: true; data: z.output<S>; form: FormData }
	| { ok: false; failure: ReturnType<typeof refuse> }
> {
	const form = await request.formData();
	const fields = readFields(form);
	if (!fields.ok) return { ok: false, failure: refuse(form, {}, fields.message) };
	const result = schema.safeParse(fields.value);
	if (result.success) return { ok: true, data: result.data, form };
	return { ok: false, failure: refuse(form, fieldErrors(result.error)) };
}

/** `fail(400)` with the form's typed values, field errors and an optional message. */
export function refuse(form: FormData, errors: FieldErrors = {}, message?: string, status = 400) {
	const body: FormFailure = { values: typedValues(form), errors, message };
	return fail(status, body);
}
