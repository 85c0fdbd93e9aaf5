import { siteSchema, type SiteFormInput } from '$lib/schemas/site';
import * as sites from '../db/queries/sites';
import type { StoreTx, StoreWriteTx } from '../db/tenant';
import { fieldErrors, type FieldErrors } from '../forms';

/** Where a new job goes: nowhere yet, one of the customer's sites, or a new address. */
export type SiteChoice =
	{ kind: 'none' } | { kind: 'existing'; siteId: string } | { kind: 'new'; input: SiteFormInput };

const NEW_SITE_FIELDS = ['label', 'address', 'town', 'postcode', 'builtYear', 'subfloor', 'notes'];

/**
 * Reads the site part of a job form: `siteId` is empty (none), `new` (the `newSite.*` fields) or a
 * site's id. Field errors are keyed by the form's own names (`newSite.address`).
 */
export function readSiteChoice(
	form: FormData
): { ok: true; choice: SiteChoice } | { ok: false; errors: FieldErrors } {
	const siteId = String(form.get('siteId') ?? '').trim();
	if (!siteId) return { ok: true, choice: { kind: 'none' } };
	if (siteId !== 'new') return { ok: true, choice: { kind: 'existing', siteId } };
	const typed = Object.fromEntries(
		NEW_SITE_FIELDS.map((k) => [k, form.get(`newSite.${k}`) ?? undefined])
	);
	const parsed = siteSchema.safeParse(typed);
	if (!parsed.success) {
		const errors: FieldErrors = {};
		for (const [k, v] of Object.entries(fieldErrors(parsed.error))) errors[`newSite.${k}`] = v;
		return { ok: false, errors };
	}
	return { ok: true, choice: { kind: 'new', input: parsed.data } };
}

/** Whether an existing site may hold a job of this customer (same store, same customer). */
export async function siteFits(tx: StoreTx, customerId: string, choice: SiteChoice) {
	if (choice.kind !== 'existing') return true;
	const site = await sites.read(tx, choice.siteId);
	return !!site && site.customerId === customerId;
}

/** Puts a just-created job at the chosen site, creating the site first when it is new. */
export async function placeJob(
	tx: StoreWriteTx,
	job: { id: string; customerId: string },
	choice: SiteChoice
) {
	if (choice.kind === 'none') return;
	const siteId =
		choice.kind === 'existing'
			? choice.siteId
			: (await sites.create(tx, job.customerId, choice.input))?.id;
	if (siteId) await sites.setJobSite(tx, job.id, siteId);
}
