/**
 * What the installer's phone sends: items of the field report (prep found, readings, notes) in
 * batches, each with the id the phone made for it, and the fields of a photo upload. Shared by
 * the phone's outbox and the server, so both bound the same things.
 */
import { z } from 'zod';
import { numberField, textField } from '$lib/input/zod';

/** An id made on the phone (a UUID, or anything of the same alphabet): 8–64 characters. */
export const clientIdSchema = z
	.string()
	.regex(/^[A-Za-z0-9_-]{8,64}$/, 'An id made on the phone: 8 to 64 letters, digits, - or _');

/** A room of the measure, by its id; none for the whole job. */
const roomIdSchema = z
	.string()
	.regex(/^[A-Za-z0-9_-]{1,64}$/, 'A room of the job')
	.nullable();

export { READING_KIND_VALUES, READING_LABELS } from '$lib/field/readings';

const flatness = z.object({
	spanIn: z.number().min(12, 'At least a 12 in straightedge').max(240, 'At most 20 ft'),
	gapIn: z.number().min(0).max(6, 'At most 6 in'),
	kind: z.enum(['low', 'high']).optional()
});
const percent = z.object({ pct: z.number().min(0).max(100, 'A percentage up to 100') });
const dish = z.object({
	gainGrams: z.number().min(0).max(1000),
	areaSqFt: z.number().min(0.01).max(10),
	hours: z.number().min(1).max(240)
});

const common = {
	clientId: clientIdSchema,
	roomId: roomIdSchema.default(null),
	note: z.string().trim().max(2000, 'Keep the note under 2000 characters').default(''),
	/** The server's version this edit started from; absent for a new item. */
	baseVersion: z.number().int().min(1).max(1_000_000).optional(),
	deleted: z.boolean().default(false),
	/** When it was recorded, by the phone's clock. */
	recordedAt: z.iso.datetime({ offset: true })
};

export const fieldItemSchema = z.discriminatedUnion('kind', [
	z.object({
		...common,
		kind: z.literal('found'),
		/** The quote's item, as `refKey` names it (`prep:hole_repair`). */
		refKey: z.string().regex(/^[a-z_]+:[A-Za-z0-9_.:-]{1,100}$/, 'An item of the quote'),
		qty: z.number().min(0, 'Zero or more').max(1_000_000, 'At most 1,000,000')
	}),
	z.discriminatedUnion('readingKind', [
		z.object({
			...common,
			kind: z.literal('reading'),
			readingKind: z.literal('flatness'),
			reading: flatness
		}),
		z.object({
			...common,
			kind: z.literal('reading'),
			readingKind: z.literal('rh'),
			reading: percent
		}),
		z.object({
			...common,
			kind: z.literal('reading'),
			readingKind: z.literal('calcium_chloride'),
			reading: dish
		}),
		z.object({
			...common,
			kind: z.literal('reading'),
			readingKind: z.literal('wood_mc_subfloor'),
			reading: percent
		}),
		z.object({
			...common,
			kind: z.literal('reading'),
			readingKind: z.literal('wood_mc_flooring'),
			reading: percent
		})
	]),
	z.object({
		...common,
		kind: z.literal('note'),
		note: z
			.string()
			.trim()
			.min(1, 'Write the note')
			.max(2000, 'Keep the note under 2000 characters')
	})
]);

export type FieldItemInput = z.output<typeof fieldItemSchema>;

/** At most this many items in one send; a phone with more sends them in turns. */
export const MAX_ITEMS_PER_SEND = 100;

export const fieldItemsSchema = z.object({
	items: z
		.array(fieldItemSchema)
		.min(1, 'Send at least one item')
		.max(MAX_ITEMS_PER_SEND, `At most ${MAX_ITEMS_PER_SEND} items at once`)
});

/** The fields sent with a photo (multipart form), besides the file. */
export const photoFieldsSchema = z.object({
	clientId: clientIdSchema,
	purpose: z.enum(['report', 'completion']).default('report'),
	roomId: textField.pipe(z.string().max(64, 'A room of the job')).transform((v) => v || null),
	itemClientId: textField.transform((v) => v || null).pipe(clientIdSchema.nullable()),
	caption: textField.pipe(z.string().max(500, 'Keep the caption under 500 characters')),
	takenAt: textField.transform((v) => v || null).pipe(z.iso.datetime({ offset: true }).nullable())
});

/** The biggest photo the server takes, in bytes: the phone resizes to about 2000 px first. */
export const PHOTO_MAX_BYTES = 2_500_000;

/** The customer's walk-through notes when the job is marked complete. */
export const completeSchema = z.object({
	walkthroughNotes: textField.pipe(z.string().max(4000, 'Keep the notes under 4000 characters'))
});

/**
 * What the "What you found" form posts when the page runs without JavaScript: one amount found
 * for a room and item, under the id the page made for this form (a resubmission is stored once).
 */
export const recordFoundSchema = z.object({
	clientId: clientIdSchema,
	roomId: textField.pipe(z.string().max(64, 'A room of the job')).transform((v) => v || null),
	refKey: textField.pipe(
		z.string().regex(/^[a-z_]+:[A-Za-z0-9_.:-]{1,100}$/, 'Choose what you found')
	),
	amount: numberField({ label: 'the amount found', max: 1_000_000 }),
	note: textField.pipe(z.string().max(2000, 'Keep the note under 2000 characters'))
});
