import { z } from 'zod';
import { email, optionalEmail, phone, requiredText } from './fields';
import { DEFAULT_TIME_ZONE, isTimeZone, timeZoneSchema } from '../time-zone';
import { PAPERS_MAX } from '../papers/store-papers';

export const ROLE_VALUES = ['owner', 'manager', 'sales', 'installer'] as const;

export const createStoreSchema = z.object({
	name: requiredText("Enter the store's name", 80),
	/** Filled by the browser with its own zone (where the store is being set up); UTC without it. */
	timeZone: z
		.string()
		.optional()
		.transform((v) => (isTimeZone(v) ? v : DEFAULT_TIME_ZONE))
});

export const storeProfileSchema = z.object({
	name: requiredText("Enter the store's name", 80),
	address: z.string().trim().max(200, 'Keep it under 200 characters').default(''),
	town: z.string().trim().max(100, 'Keep it under 100 characters').default(''),
	phone: phone.transform((v) => v ?? ''),
	email: optionalEmail.transform((v) => v ?? ''),
	timeZone: timeZoneSchema
});

const papersText = (max: number) =>
	z
		.string()
		.trim()
		.max(max, `Keep it under ${max.toLocaleString('en-US')} characters`)
		.default('');

/** The store's words on its customer papers; blank keeps the default wording. */
export const storePapersSchema = z.object({
	nextSteps: papersText(PAPERS_MAX.nextSteps),
	cancellation: papersText(PAPERS_MAX.cancellation),
	terms: papersText(PAPERS_MAX.terms)
});

export const inviteSchema = z.object({
	email,
	role: z.enum(ROLE_VALUES, { error: 'Choose a role' })
});

export const memberRoleSchema = z.object({
	memberId: z.string().min(1),
	role: z.enum(ROLE_VALUES, { error: 'Choose a role' })
});
