import { z } from 'zod';
import { optionalEmail, optionalText, phone, requiredText } from './fields';

export const customerSchema = z.object({
	name: requiredText("Enter the customer's name", 120),
	email: optionalEmail,
	phone,
	notes: z.string().trim().max(2000, 'Keep notes under 2000 characters').default('')
});

export type CustomerInput = z.infer<typeof customerSchema>;

/**
 * A partial change through the API: only the fields sent are changed. Built without defaults
 * (a default would fill a field left out and overwrite what was saved).
 */
export const customerPatchSchema = z
	.object({
		name: requiredText("Enter the customer's name", 120),
		email: optionalEmail,
		phone,
		notes: z.string().trim().max(2000, 'Keep notes under 2000 characters')
	})
	.partial()
	.transform((patch) =>
		Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined))
	);

export const CUSTOMER_SORTS = ['name', 'created', 'updated'] as const;

export const customerListSchema = z.object({
	q: optionalText(100),
	sort: z.enum(CUSTOMER_SORTS).default('name'),
	dir: z.enum(['asc', 'desc']).default('asc'),
	page: z.coerce.number().int().min(1).max(100_000).default(1),
	pageSize: z.coerce.number().int().min(1).max(100).default(25)
});

export type CustomerListQuery = z.infer<typeof customerListSchema>;
