import { canCheckIn, canComplete, canReport } from '$lib/jobs/status';
import { clientIdSchema, completeSchema, recordFoundSchema } from '$lib/schemas/field';
import { processPhoto, putPhotoFiles, savePhoto } from '$lib/server/field/photos';
import * as field from '$lib/server/db/queries/field';
import { inStore, readInStore } from '$lib/server/db/tenant';
import {
	checkIn,
	completeJob,
	phoneItem,
	recordItems,
	submitReport
} from '$lib/server/field/report';
import { readWorkOrder, reportChoices } from '$lib/server/field/work-order';
import { installerDecisions } from '$lib/server/change-orders/installer';
import { parseForm } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const { store, scope } = requirePermission({ assignedJob: ['read'] });
	const found = await readInStore(store.id, async (tx) => {
		const order = await readWorkOrder(tx, params.id, scope);
		if (!order) return undefined;
		const report = await field.readReport(tx, params.id);
		const choices = await reportChoices(tx, params.id);
		return {
			order,
			report: report
				? {
						checkedInAt: report.checkedInAt,
						submittedAt: report.submittedAt,
						items: (await field.listItems(tx, report.id)).map(phoneItem)
					}
				: null,
			choices: {
				rooms: choices.rooms,
				items: [...choices.items.values()].map((c) => ({
					refKey: c.refKey,
					label: c.label,
					unit: c.unit
				})),
				sold: Object.fromEntries(choices.sold)
			},
			photos: await field.listPhotos(tx, params.id),
			completion: await field.readCompletion(tx, params.id),
			// Where the extras stand, with the installer's own pay difference; never a price.
			decisions: await installerDecisions(tx, params.id)
		};
	});
	if (!found) error(404, 'Not found');
	const status = found.order.job.status;
	return {
		...found,
		// The id the "What you found" form carries without JavaScript: a resubmission is one item.
		formClientId: crypto.randomUUID(),
		can: {
			checkIn: canCheckIn(status),
			report: canReport(status) && Boolean(found.report),
			complete: canComplete(status)
		}
	};
};

export const actions: Actions = {
	checkIn: async ({ params }) => {
		const member = requirePermission({ assignedJob: ['report'] });
		await requireJob(member, params.id);
		const result = await inStore(member.store.id, (tx) => checkIn(tx, params.id, member.user.id));
		if (!result.ok) {
			if (result.reason === 'not_found') error(404, 'Not found');
			return fail(409, { message: 'This job is not booked for work on site yet.' });
		}
		return { checkedIn: true };
	},
	/**
	 * One amount found, posted by the page without JavaScript (with it, the phone's outbox sends
	 * items to /api/v1/field/jobs/[id]/items). An item already recorded for the room is edited on
	 * top of its current version: this form always starts from what the server has.
	 */
	record: async ({ params, request }) => {
		const member = requirePermission({ assignedJob: ['report'] });
		await requireJob(member, params.id);
		const parsed = await parseForm(request, recordFoundSchema);
		if (!parsed.ok) return parsed.failure;
		const { clientId, roomId, refKey, amount, note } = parsed.data;
		const result = await inStore(member.store.id, async (tx) => {
			const report = await field.readReport(tx, params.id);
			const live = report ? await field.readLiveFound(tx, report.id, roomId, refKey) : undefined;
			const mine = await field.readItemByClientId(tx, clientId);
			const base = mine ?? (live && live.clientId !== clientId ? live : undefined);
			return recordItems(tx, params.id, member.user.id, [
				{
					clientId: base?.clientId ?? clientId,
					kind: 'found',
					roomId,
					refKey,
					qty: amount,
					note,
					deleted: false,
					recordedAt: new Date().toISOString(),
					...(base ? { baseVersion: base.version } : {})
				}
			]);
		});
		if (!result.ok) {
			if (result.reason === 'not_found') error(404, 'Not found');
			return fail(409, {
				message: result.reason === 'no_report' ? 'Check in first.' : 'The report is closed.'
			});
		}
		const [answer] = result.answers;
		if (answer.status === 'refused' || answer.status === 'conflict') {
			return fail(409, {
				message: answer.message,
				values: { roomId: roomId ?? '', refKey, amount: String(amount), note },
				errors: {}
			});
		}
		return { recorded: true };
	},
	submit: async ({ params }) => {
		const member = requirePermission({ assignedJob: ['report'] });
		await requireJob(member, params.id);
		const result = await inStore(member.store.id, (tx) =>
			submitReport(tx, params.id, member.user.id)
		);
		if (!result.ok) {
			if (result.reason === 'not_found') error(404, 'Not found');
			if (result.reason === 'no_report') return fail(409, { message: 'Check in first.' });
			return fail(409, { message: 'This job is not under way: the report is closed.' });
		}
		return { submitted: true, change: result.change };
	},
	/**
	 * Marks the job complete. Without JavaScript the finished floor's photo comes with the form
	 * (multipart, under the id the page made for it); with it, the photo went through the outbox.
	 */
	complete: async ({ params, request }) => {
		const member = requirePermission({ assignedJob: ['report'] });
		await requireJob(member, params.id);
		const parsed = await parseForm(request, completeSchema);
		if (!parsed.ok) return parsed.failure;
		const notes = parsed.data.walkthroughNotes;
		const refuse = (status: number, message: string, field?: string) =>
			fail(status, {
				message,
				values: { walkthroughNotes: notes },
				errors: field ? { [field]: [message] } : {}
			});
		const file = parsed.form.get('photo');
		const photoId = clientIdSchema.safeParse(parsed.form.get('photoClientId'));
		let files: Awaited<ReturnType<typeof putPhotoFiles>> | undefined;
		let size = { byteSize: 0, width: 0, height: 0 };
		if (file instanceof File && file.size > 0) {
			if (!photoId.success) return refuse(400, 'Reload the page and add the photo again.', 'photo');
			const processed = await processPhoto(new Uint8Array(await file.arrayBuffer()));
			if (!processed.ok) return refuse(processed.status, processed.message, 'photo');
			files = await putPhotoFiles(member.store.id, params.id, processed, photoId.data);
			size = {
				byteSize: processed.image.byteLength,
				width: processed.width,
				height: processed.height
			};
		}
		const result = await inStore(member.store.id, async (tx) => {
			if (files && photoId.success) {
				const saved = await savePhoto(
					tx,
					params.id,
					member.user.id,
					{
						clientId: photoId.data,
						purpose: 'completion',
						roomId: null,
						itemClientId: null,
						caption: '',
						takenAt: null
					},
					{ fileKey: files.fileKey, thumbKey: files.thumbKey, ...size }
				);
				if (!saved.ok) return { ok: false, reason: 'not_found' } as const;
				if (saved.duplicate) await files.forget();
			}
			return completeJob(tx, params.id, member.user.id, notes);
		});
		if (!result.ok) {
			await files?.forget();
			if (result.reason === 'not_found') error(404, 'Not found');
			return result.reason === 'no_photo'
				? refuse(409, 'Add at least one photo of the finished floor first.', 'photo')
				: refuse(409, 'This job cannot be marked complete now.');
		}
		return { completed: true };
	}
};
