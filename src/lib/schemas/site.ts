import { z } from 'zod';
import { readNumber } from '$lib/input';
import { requiredText } from './fields';

const text = (max: number) => z.string().trim().max(max, `Keep it under ${max} characters`);

/** The year a house was built, typed as text: empty is unknown (null). */
const builtYear = z.union([z.string(), z.number(), z.null()]).transform((v, ctx) => {
	const s = v === null ? '' : String(v).trim();
	if (!s) return null;
	const next = new Date().getFullYear() + 1;
	const n = readNumber(s, { label: 'the year', min: 1600, max: next, integer: true });
	if (!n.ok) {
		ctx.addIssue({
			code: 'custom',
			message: `Type the year the house was built, from 1600 to ${next}, or leave it empty`
		});
		return z.NEVER;
	}
	return n.value;
});

const fields = {
	label: text(60),
	address: requiredText('Enter the street address', 200),
	town: text(100),
	postcode: text(20),
	builtYear,
	subfloor: text(120),
	notes: text(2000)
};

/** A customer's site: where the floors go, with what is known about the house. */
export const siteSchema = z.object({
	label: fields.label.default(''),
	address: fields.address,
	town: fields.town.default(''),
	postcode: fields.postcode.default(''),
	builtYear: builtYear.optional().transform((v) => v ?? null),
	subfloor: fields.subfloor.default(''),
	notes: fields.notes.default('')
});

export type SiteFormInput = z.output<typeof siteSchema>;

/** `PATCH /api/v1/sites/:id`: only the fields sent change (no defaults fill the others). */
export const sitePatchSchema = z.object({
	label: fields.label.optional(),
	address: fields.address.optional(),
	town: fields.town.optional(),
	postcode: fields.postcode.optional(),
	builtYear: fields.builtYear.optional(),
	subfloor: fields.subfloor.optional(),
	notes: fields.notes.optional()
});

/** The site a job is at: one of its customer's sites, or none. */
export const jobSiteSchema = z.object({
	siteId: z
		.string()
		.trim()
		.max(64)
		.optional()
		.transform((v) => v || null)
});
