// Rows of the installer's half (issue 10) written straight into its tables, for the database
// rules' spec and the tenancy spec. The feature modules' own factories (booking, reporting,
// change orders, statements through their workflows) come with them.
import {
	changeOrder as priceChangeOrder,
	soldQuantities,
	type QuantityItem
} from '$lib/estimating';
import {
	booking,
	changeOrder,
	fieldItem,
	fieldPhoto,
	fieldReport,
	installerProfile,
	installerStatement,
	installerStatementLine,
	installerTimeOff,
	jobCompletion,
	payment
} from '$lib/server/db/schema';
import { inStore } from '$lib/server/db/tenant';
import { and, eq } from 'drizzle-orm';
import { addMember, makePaidJob, unique, type TestStore } from './factories';

/** An id as a phone makes one. */
export const clientId = () => crypto.randomUUID();

/** An installer of the store with a profile: crew of two, vinyl plank, Sundays off. */
export async function makeInstaller(store: TestStore) {
	const user = await addMember(store.id, 'installer', 'An installer');
	const profile = await inStore(store.id, async (tx) => {
		const [row] = await tx
			.insert(installerProfile)
			.values({
				organizationId: store.id,
				userId: user.id,
				crewSize: 2,
				floorKinds: ['vinyl_plank', 'laminate'],
				sqFtPerDay: { vinyl_plank: 450 },
				payRates: [{ ref: { type: 'prep', kind: 'hole_repair' }, payCents: 5_500 }],
				daysOff: [7]
			})
			.returning();
		return row;
	});
	return { user, profile };
}

/**
 * A sold job booked for an installer, checked in, with one more subfloor hole found than was
 * sold (an item, its photo, a reading and a note), priced into a change order the customer
 * approved and paid in the store, completed and signed off, and the installer's statement with
 * the job's install pay and the extra, paid.
 */
export async function makeFieldWork(store: TestStore) {
	const sold = await makePaidJob(store);
	const { user: installer, profile } = await makeInstaller(store);
	const { job, quote } = sold;
	const roomId = quote.input.job.rooms[0].id;
	const holeRef = { type: 'prep', kind: 'hole_repair' } as const;
	const soldItems = soldQuantities(quote.result);
	const found: QuantityItem[] = [...soldItems, { roomId, ref: holeRef, qty: 1 }];
	const priced = priceChangeOrder({
		sold: soldItems,
		found,
		priceBook: quote.input.priceBook,
		settings: quote.input.settings
	});
	if (!priced.ok) throw new Error(`change order not priced: ${JSON.stringify(priced.errors)}`);

	return inStore(store.id, async (tx) => {
		const [timeOff] = await tx
			.insert(installerTimeOff)
			.values({
				organizationId: store.id,
				installerId: installer.id,
				startsOn: '2027-01-04',
				endsOn: '2027-01-08',
				note: 'Away'
			})
			.returning();
		const [booked] = await tx
			.insert(booking)
			.values({
				organizationId: store.id,
				jobId: job.id,
				installerId: installer.id,
				startsOn: '2026-12-14',
				days: Math.max(1, quote.result.schedule.days),
				proposedDays: quote.result.schedule.days,
				proposal: quote.result.schedule,
				bookedBy: store.owner.id
			})
			.returning();
		const [report] = await tx
			.insert(fieldReport)
			.values({
				organizationId: store.id,
				jobId: job.id,
				checkedInAt: new Date(),
				checkedInBy: installer.id
			})
			.returning();
		const [hole] = await tx
			.insert(fieldItem)
			.values({
				organizationId: store.id,
				reportId: report.id,
				clientId: clientId(),
				kind: 'found',
				roomId,
				ref: holeRef,
				refKey: 'prep:hole_repair',
				qty: 1,
				unit: 'each',
				note: 'Rotted patch by the sink',
				recordedBy: installer.id,
				recordedAt: new Date()
			})
			.returning();
		const [reading] = await tx
			.insert(fieldItem)
			.values({
				organizationId: store.id,
				reportId: report.id,
				clientId: clientId(),
				kind: 'reading',
				roomId,
				readingKind: 'flatness',
				reading: { spanIn: 120, gapIn: 0.125, kind: 'low' },
				recordedBy: installer.id,
				recordedAt: new Date()
			})
			.returning();
		const [photo] = await tx
			.insert(fieldPhoto)
			.values({
				organizationId: store.id,
				jobId: job.id,
				clientId: clientId(),
				purpose: 'report',
				roomId,
				itemClientId: hole.clientId,
				fileKey: `photos/${store.id}/${unique('photo')}.jpg`,
				thumbKey: `photos/${store.id}/${unique('thumb')}.jpg`,
				mediaType: 'image/jpeg',
				byteSize: 182_000,
				width: 1600,
				height: 1200,
				uploadedBy: installer.id
			})
			.returning();
		const [co] = await tx
			.insert(changeOrder)
			.values({
				organizationId: store.id,
				jobId: job.id,
				reportId: report.id,
				number: 1,
				input: {
					sold: soldItems,
					found,
					priceBook: quote.input.priceBook,
					settings: quote.input.settings
				},
				result: priced,
				currency: quote.currency,
				subtotalCents: priced.subtotalCents,
				taxCents: priced.taxCents,
				totalCents: priced.totalCents,
				payDeltaCents: priced.payDeltaCents,
				createdBy: installer.id
			})
			.returning();
		const where = and(eq(changeOrder.organizationId, store.id), eq(changeOrder.id, co.id));
		await tx
			.update(changeOrder)
			.set({ status: 'reviewed', reviewedAt: new Date(), reviewedBy: store.owner.id })
			.where(where);
		const [approved] = await tx
			.update(changeOrder)
			.set({ status: 'approved', decidedAt: new Date(), decidedName: 'A Customer' })
			.where(where)
			.returning();
		const [paid] = await tx
			.insert(payment)
			.values({
				organizationId: store.id,
				jobId: job.id,
				changeOrderId: co.id,
				purpose: 'change_order',
				method: 'cash',
				status: 'succeeded',
				currency: co.currency,
				amountCents: co.totalCents,
				succeededAt: new Date(),
				recordedBy: store.owner.id
			})
			.returning();
		const [completion] = await tx
			.insert(jobCompletion)
			.values({
				organizationId: store.id,
				jobId: job.id,
				completedAt: new Date(),
				completedBy: installer.id,
				walkthroughNotes: 'Customer checked the kitchen threshold',
				signedAt: new Date(),
				signedName: 'A Customer'
			})
			.returning();
		const [statement] = await tx
			.insert(installerStatement)
			.values({
				organizationId: store.id,
				installerId: installer.id,
				periodStart: '2026-12-01',
				periodEnd: '2026-12-31',
				currency: quote.currency
			})
			.returning();
		const lines = await tx
			.insert(installerStatementLine)
			.values([
				{
					organizationId: store.id,
					statementId: statement.id,
					installerId: installer.id,
					kind: 'install' as const,
					jobId: job.id,
					amountCents: quote.result.installerPayCents
				},
				{
					organizationId: store.id,
					statementId: statement.id,
					installerId: installer.id,
					kind: 'extra' as const,
					jobId: job.id,
					changeOrderId: co.id,
					amountCents: co.payDeltaCents
				}
			])
			.returning();
		const [paidStatement] = await tx
			.update(installerStatement)
			.set({
				status: 'paid',
				paidAt: new Date(),
				paidBy: store.owner.id,
				paidReference: 'Transfer 0001'
			})
			.where(
				and(
					eq(installerStatement.organizationId, store.id),
					eq(installerStatement.id, statement.id)
				)
			)
			.returning();
		return {
			...sold,
			installer,
			profile,
			timeOff,
			booking: booked,
			report,
			hole,
			reading,
			photo,
			changeOrder: approved,
			changeOrderPayment: paid,
			completion,
			statement: paidStatement,
			lines
		};
	});
}
