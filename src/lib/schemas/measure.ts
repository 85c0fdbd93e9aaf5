import { z } from 'zod';
import { measureDraftSchema } from '../measure/draft';

/** A save of the site measure: the whole draft, on top of the version the editor started from. */
export const measureSaveSchema = z.object({
	baseVersion: z
		.number({ error: 'Send the version the changes were made on (0 for a new measure)' })
		.int()
		.min(0)
		// The version is a PostgreSQL integer.
		.max(2_147_483_647),
	draft: measureDraftSchema
});

export type MeasureSave = z.infer<typeof measureSaveSchema>;
