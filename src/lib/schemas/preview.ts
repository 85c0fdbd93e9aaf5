import { z } from 'zod';
import { estimateInputSchema, priceBookSchema, settingsSchema } from './estimate';

/**
 * `POST /api/v1/estimates/preview`: the whole job; the settings and the price book may be left
 * out, and the store's own are used instead.
 */
export const estimatePreviewSchema = estimateInputSchema.extend({
	settings: settingsSchema
		.optional()
		.describe("The settings to estimate with; left out, the store's saved settings"),
	priceBook: priceBookSchema
		.optional()
		.describe("The price book to estimate with; left out, the store's active price book")
});

export type EstimatePreviewInput = z.infer<typeof estimatePreviewSchema>;
