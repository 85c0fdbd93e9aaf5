import { endpoint } from '$lib/server/api';
import { inStore } from '$lib/server/db/tenant';
import { BUSY, processPhoto, putPhotoFiles, savePhoto } from '$lib/server/field/photos';
import { imagesBusy } from '$lib/server/images';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { canComplete, canReport } from '$lib/jobs/status';
import * as jobs from '$lib/server/db/queries/jobs';
import { photoFieldsSchema } from '$lib/schemas/field';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

function refuse(status: number, message: string, issues: { path: string; message: string }[] = []) {
	return json({ message, issues }, { status });
}

/**
 * A photo from the phone (multipart: `file` and the fields of `photoFieldsSchema`). Checked by
 * its bytes, re-encoded without metadata, kept, and answered with its id; a resend of the same
 * client id answers the stored photo.
 */
export const POST: RequestHandler = endpoint(async ({ params, request }) => {
	const member = requirePermission({ assignedJob: ['report'] });
	await requireJob(member, params.id);
	// A full image queue answers before the body is read: waiting uploads would hold it in memory.
	if (imagesBusy())
		return json({ message: BUSY }, { status: 503, headers: { 'retry-after': '5' } });
	if (!request.headers.get('content-type')?.includes('multipart/form-data')) {
		return refuse(415, 'Send the photo as multipart/form-data with a "file" field');
	}
	const form = await request.formData().catch(() => undefined);
	if (!form) return refuse(400, 'The upload could not be read');
	const file = form.get('file');
	if (!(file instanceof File)) {
		return refuse(400, 'Choose a photo', [{ path: 'file', message: 'Choose a photo' }]);
	}
	const text: Record<string, string> = {};
	for (const key of ['clientId', 'purpose', 'roomId', 'itemClientId', 'caption', 'takenAt']) {
		const v = form.get(key);
		if (typeof v === 'string') text[key] = v;
	}
	const parsed = photoFieldsSchema.safeParse(text);
	if (!parsed.success) {
		return refuse(
			400,
			'Some fields are not valid',
			parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))
		);
	}
	const meta = parsed.data;
	const processed = await processPhoto(new Uint8Array(await file.arrayBuffer()));
	if (!processed.ok && processed.status === 503) {
		return json({ message: BUSY }, { status: 503, headers: { 'retry-after': '5' } });
	}
	if (!processed.ok) {
		return refuse(processed.status, processed.message, [
			{ path: 'file', message: processed.message }
		]);
	}
	const storeId = member.store.id;
	// Files first, then the row that names them: a server that dies, or a database that drops,
	// between the two leaves at most unnamed files (never served), never a row without its file;
	// the check `putPhotoFiles` queues removes such files an hour later. They are not removed here
	// when the transaction fails: its commit may have happened unheard (the check knows).
	const files = await putPhotoFiles(storeId, params.id, processed, meta.clientId);
	const saved = await inStore(storeId, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, member.scope);
		if (!job) return { ok: false, reason: 'not_found' } as const;
		const open = meta.purpose === 'completion' ? canComplete(job.status) : canReport(job.status);
		if (!open) return { ok: false, reason: 'not_now' } as const;
		return savePhoto(
			tx,
			params.id,
			member.user.id,
			{ ...meta, takenAt: meta.takenAt ? new Date(meta.takenAt) : null },
			{
				fileKey: files.fileKey,
				thumbKey: files.thumbKey,
				byteSize: processed.image.byteLength,
				width: processed.width,
				height: processed.height
			}
		);
	});
	if (!saved.ok || saved.duplicate) await files.forget();
	if (!saved.ok) {
		if (saved.reason === 'not_found') error(404, 'Not found');
		if (saved.reason === 'not_now') return refuse(409, 'This job is not under way: no photos now');
		if (saved.reason === 'no_item')
			return refuse(409, 'Send the item this photo belongs to first', [
				{ path: 'itemClientId', message: 'Send the item first' }
			]);
		return refuse(409, 'That id belongs to another job');
	}
	const p = saved.photo;
	return json(
		{
			id: p.id,
			clientId: p.clientId,
			purpose: p.purpose,
			roomId: p.roomId,
			itemClientId: p.itemClientId,
			width: p.width,
			height: p.height,
			duplicate: saved.duplicate
		},
		{ status: saved.duplicate ? 200 : 201 }
	);
});
