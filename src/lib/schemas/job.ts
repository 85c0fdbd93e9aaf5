import { z } from 'zod';
import { JOB_STATUSES } from '../jobs/status';
import { id, optionalText, requiredText } from './fields';

export const jobCreateSchema = z.object({
	customerId: id.describe('The customer the job is for (of the same store)'),
	title: requiredText('Give the job a short title, such as "Kitchen and hall"', 120),
	notes: z.string().trim().max(4000, 'Keep notes under 4000 characters').default('')
});

export const jobUpdateSchema = z.object({
	title: requiredText('Give the job a short title', 120).optional(),
	notes: z.string().trim().max(4000, 'Keep notes under 4000 characters').optional()
});

export const jobMoveSchema = z.object({
	to: z.enum(JOB_STATUSES, { error: 'Choose a status' }),
	note: z.string().trim().max(500, 'Keep the note under 500 characters').default('')
});

export const jobAssignSchema = z.object({
	installerId: optionalText(64)
});

export const JOB_SORTS = ['number', 'status', 'updated', 'customer'] as const;

export const jobListSchema = z.object({
	q: optionalText(100),
	status: z.enum(JOB_STATUSES).optional(),
	sort: z.enum(JOB_SORTS).default('number'),
	dir: z.enum(['asc', 'desc']).default('desc'),
	page: z.coerce.number().int().min(1).max(100_000).default(1),
	pageSize: z.coerce.number().int().min(1).max(100).default(25)
});

export type JobListQuery = z.infer<typeof jobListSchema>;
