// Jobs on site for the change-order and sign-off specs: a store with its own Stripe account and a
// customer with an address, its job sold (cash deposit, 1.00 refunded as an overcharge), assigned
// to an installer with their own hole-repair pay, checked in, and the report's rows written as the
// installer's phone writes them.
import {
	changeOrder as priceChangeOrder,
	refKey,
	soldQuantities,
	type EstimateInput,
	type EstimateResult,
	type ItemRef
} from '$lib/estimating';
import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import { saveStripeAccount } from '$lib/server/db/queries/settings';
import {
	changeOrder,
	fieldItem,
	fieldPhoto,
	fieldReport,
	jobCompletion,
	type ChangeOrderInput
} from '$lib/server/db/schema';
import { inStore } from '$lib/server/db/tenant';
import { storage } from '$lib/server/storage';
import { newAccount } from './card-jobs';
import { makePaidJob, makeStore, unique, type TestStore } from './factories';
import { clientId, makeInstaller } from './field-factories';

export const CUSTOMER_EMAIL = 'site-customer@test.example';

/** A sold job, booked for an installer and checked in: in progress, with an empty report. */
export async function jobOnSite(name = 'Site Floors') {
	const store = await makeStore(name);
	const account = newAccount();
	await inStore(store.id, (tx) => saveStripeAccount(tx, account));
	const made = await makePaidJob(store);
	const { user: installer, profile } = await makeInstaller(store);
	const report = await inStore(store.id, async (tx) => {
		await customers.update(tx, made.customer.id, { email: CUSTOMER_EMAIL });
		if ((await jobs.assign(tx, made.job.id, installer.id, store.owner.id)) !== 'assigned')
			throw new Error('not assigned');
		for (const to of ['scheduled', 'in_progress'] as const) {
			const moved = await jobs.move(tx, made.job.id, to, store.owner.id);
			if (!moved.ok) throw new Error(`job not moved to ${to}`);
		}
		const [row] = await tx
			.insert(fieldReport)
			.values({
				organizationId: store.id,
				jobId: made.job.id,
				checkedInAt: new Date(),
				checkedInBy: installer.id
			})
			.returning();
		return row;
	});
	return { store, account, installer, profile, report, ...made };
}

export type OnSite = Awaited<ReturnType<typeof jobOnSite>>;

/** The quantity the accepted quote sold of an item (0 when none), and the room it was sold in. */
export function soldOf(site: OnSite, ref: ItemRef) {
	const key = refKey(ref);
	const lines = site.quote.result.lines.filter((l) => refKey(l.ref) === key);
	return {
		qty: lines.reduce((s, l) => s + l.qty, 0),
		roomId: lines[0] ? (lines[0].roomId ?? null) : site.quote.input.job.rooms[0].id
	};
}

/** Writes found items (the whole amount found), as the phone sends them. */
export async function recordFound(
	site: OnSite,
	items: { ref: ItemRef; qty: number; unit: string; roomId: string | null }[]
) {
	return inStore(site.store.id, (tx) =>
		tx
			.insert(fieldItem)
			.values(
				items.map((it) => ({
					organizationId: site.store.id,
					reportId: site.report.id,
					clientId: clientId(),
					kind: 'found' as const,
					roomId: it.roomId,
					ref: it.ref,
					refKey: refKey(it.ref),
					qty: it.qty,
					unit: it.unit as 'each',
					recordedBy: site.installer.id,
					recordedAt: new Date()
				}))
			)
			.returning()
	);
}

/** Bytes standing in for a photo the server re-encoded (the file store checks no content). */
export const PHOTO_BYTES = Buffer.from([
	0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46
]);

/** A photo in the file store and its row: a report photo tied to a found item, or a completion photo. */
export async function recordPhoto(
	site: OnSite,
	item: { clientId: string; roomId: string | null },
	purpose: 'report' | 'completion' = 'report'
) {
	const fileKey = `${site.store.id}/photos/${unique('p')}.jpg`;
	const thumbKey = `${site.store.id}/photos/${unique('t')}.jpg`;
	await storage().put(fileKey, PHOTO_BYTES, 'image/jpeg');
	await storage().put(thumbKey, PHOTO_BYTES.subarray(0, 4), 'image/jpeg');
	const [row] = await inStore(site.store.id, (tx) =>
		tx
			.insert(fieldPhoto)
			.values({
				organizationId: site.store.id,
				jobId: site.job.id,
				clientId: clientId(),
				purpose,
				roomId: item.roomId,
				itemClientId: purpose === 'report' ? item.clientId : null,
				fileKey,
				thumbKey,
				mediaType: 'image/jpeg',
				byteSize: 1000,
				width: 40,
				height: 30,
				uploadedBy: site.installer.id
			})
			.returning()
	);
	return row;
}

/** The installer's side of completion, as the field workflow writes it: the job completed. */
export async function completeJob(site: OnSite, notes = 'Walked the kitchen with the customer') {
	return inStore(site.store.id, async (tx) => {
		const moved = await jobs.move(tx, site.job.id, 'completed', site.installer.id);
		if (!moved.ok) throw new Error('job not completed');
		const [row] = await tx
			.insert(jobCompletion)
			.values({
				organizationId: site.store.id,
				jobId: site.job.id,
				completedAt: new Date(),
				completedBy: site.installer.id,
				walkthroughNotes: notes
			})
			.returning();
		return row;
	});
}

export type { TestStore };

/**
 * A change order awaiting review on a sold job (one more subfloor hole than was sold), its rows
 * written straight in, for suites that only need one to exist (the hostile-input suite).
 */
export async function seedChangeOrder(
	store: TestStore,
	made: {
		job: { id: string };
		quote: { currency: string; input: EstimateInput; result: EstimateResult };
	}
) {
	const sold = soldQuantities(made.quote.result);
	const found = [
		...sold,
		{
			roomId: made.quote.input.job.rooms[0].id,
			ref: { type: 'prep', kind: 'hole_repair' } as const,
			qty: 1
		}
	];
	const input: ChangeOrderInput = {
		sold,
		found,
		priceBook: made.quote.input.priceBook,
		settings: made.quote.input.settings
	};
	const result = priceChangeOrder(input);
	return inStore(store.id, async (tx) => {
		const [report] = await tx
			.insert(fieldReport)
			.values({ organizationId: store.id, jobId: made.job.id, checkedInAt: new Date() })
			.returning();
		const [row] = await tx
			.insert(changeOrder)
			.values({
				organizationId: store.id,
				jobId: made.job.id,
				reportId: report.id,
				number: 1,
				input,
				result,
				currency: made.quote.currency,
				subtotalCents: result.subtotalCents,
				taxCents: result.taxCents,
				totalCents: result.totalCents,
				payDeltaCents: result.payDeltaCents
			})
			.returning();
		return row;
	});
}
