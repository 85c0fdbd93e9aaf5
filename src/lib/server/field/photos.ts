// Site photos: checked by what the bytes are (never the name or the declared type), turned
// upright by their EXIF orientation, re-encoded without any metadata (so no location leaves the
// phone's file), thumbnailed, kept in the file store, and tied to the job, a room and an item.
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { and, eq } from 'drizzle-orm';
import { PHOTO_MAX_BYTES } from '$lib/schemas/field';
import * as field from '../db/queries/field';
import { changeOrder } from '../db/schema';
import { inStore, readInStore, type StoreTx, type StoreWriteTx } from '../db/tenant';
import { imageWork, ImagesBusy } from '../images';
import { log } from '../log';
import { storage, type StoredFile } from '../storage';
import { enqueue } from '../tasks';

export { PHOTO_MAX_BYTES };

/** The answer while the image queue is full: the phone keeps the photo and sends it again. */
export const BUSY = 'The server is busy with other photos: this one will be sent again shortly.';

/** What the server takes, by content. HEIC is not among them: the phone sends JPEG. */
const ACCEPTED = new Set(['image/jpeg', 'image/png', 'image/webp']);

/** The longest side kept, and the thumbnail's. */
const LONGEST_SIDE = 2000;
const THUMB_SIDE = 360;
/** Pixels sharp will decode at most (a "decompression bomb" is refused). */
const MAX_PIXELS = 60_000_000;

export type PhotoRefusal = { ok: false; status: 400 | 413 | 415 | 503; message: string };

export interface ProcessedPhoto {
	ok: true;
	image: Buffer;
	thumb: Buffer;
	width: number;
	height: number;
}

const mb = (bytes: number) => `${(bytes / 1_000_000).toFixed(1)} MB`;

/**
 * The upload made safe to keep: refused unless its bytes are a JPEG, PNG or WebP image of at most
 * `PHOTO_MAX_BYTES`; otherwise rotated upright, at most 2000 px on its longest side, re-encoded
 * as JPEG with no metadata at all (EXIF, GPS, XMP, ICC dropped), and a thumbnail.
 */
export async function processPhoto(bytes: Uint8Array): Promise<ProcessedPhoto | PhotoRefusal> {
	if (bytes.byteLength === 0) return { ok: false, status: 400, message: 'The photo is empty.' };
	if (bytes.byteLength > PHOTO_MAX_BYTES) {
		return {
			ok: false,
			status: 413,
			message: `The photo is ${mb(bytes.byteLength)}; the most is ${mb(PHOTO_MAX_BYTES)}. Send it smaller.`
		};
	}
	const type = await fileTypeFromBuffer(bytes);
	if (!type || !ACCEPTED.has(type.mime)) {
		return {
			ok: false,
			status: 415,
			message: 'That file is not a photo we can take: send a JPEG, PNG or WebP picture.'
		};
	}
	try {
		const source = () => sharp(bytes, { limitInputPixels: MAX_PIXELS, failOn: 'error' }).rotate();
		const { image, info, thumb } = await imageWork(async () => {
			// sharp writes no metadata unless asked (`withMetadata`), so EXIF and GPS are gone.
			const { data: image, info } = await source()
				.resize({
					width: LONGEST_SIDE,
					height: LONGEST_SIDE,
					fit: 'inside',
					withoutEnlargement: true
				})
				.jpeg({ quality: 82, mozjpeg: true })
				.toBuffer({ resolveWithObject: true });
			const thumb = await source()
				.resize({ width: THUMB_SIDE, height: THUMB_SIDE, fit: 'inside', withoutEnlargement: true })
				.jpeg({ quality: 70 })
				.toBuffer();
			return { image, info, thumb };
		});
		return { ok: true, image, thumb, width: info.width, height: info.height };
	} catch (err) {
		if (err instanceof ImagesBusy) return { ok: false, status: 503, message: BUSY };
		log.info({ err: String(err) }, 'photo refused: not decodable');
		return {
			ok: false,
			status: 415,
			message: 'That photo could not be read: it may be damaged. Take it again.'
		};
	}
}

export interface PhotoMeta {
	clientId: string;
	purpose: 'report' | 'completion';
	roomId: string | null;
	itemClientId: string | null;
	caption: string;
	takenAt: Date | null;
}

/** The folder of the store's photos in the file store. */
const photosOf = (storeId: string) => `${storeId}/photos/`;

/** Where a photo's files go: under the store's folder, named by a fresh id. */
function keysFor(storeId: string, jobId: string) {
	const name = crypto.randomUUID();
	return {
		fileKey: `${photosOf(storeId)}${jobId}/${name}.jpg`,
		thumbKey: `${photosOf(storeId)}${jobId}/${name}-thumb.jpg`
	};
}

/**
 * How long after its files are written a photo's row must exist, or the files go (see
 * `checkPhotoFiles`). An upload writes its row within seconds of its files.
 */
export const PHOTO_FILES_CHECK_SECONDS = 3600;

/**
 * Writes the processed files (outside any transaction); `forget` removes them again. First, in a
 * transaction of its own, it queues the check that removes them in an hour unless a photo row
 * (of this client id) names them: a server that dies between the files and the row, or a row's
 * transaction that fails unheard, leaves no file behind for good.
 */
export async function putPhotoFiles(
	storeId: string,
	jobId: string,
	photo: ProcessedPhoto,
	clientId: string
) {
	const keys = keysFor(storeId, jobId);
	await inStore(storeId, (tx) =>
		enqueue(
			tx,
			'photo.files',
			{ clientId, ...keys },
			{},
			{ startAfterSeconds: PHOTO_FILES_CHECK_SECONDS }
		)
	);
	await storage().put(keys.fileKey, photo.image, 'image/jpeg');
	await storage().put(keys.thumbKey, photo.thumb, 'image/jpeg');
	return {
		...keys,
		forget: async () => {
			await storage().delete(keys.fileKey);
			await storage().delete(keys.thumbKey);
		}
	};
}

/**
 * The check `putPhotoFiles` queued: keeps the files when the photo of that client id names them,
 * and removes them otherwise (never a key outside the store's own photos). Returns what it did.
 */
export async function checkPhotoFiles(
	storeId: string,
	files: { clientId: string; fileKey: string; thumbKey: string }
): Promise<'kept' | 'removed'> {
	const photo = await readInStore(storeId, (tx) => field.readPhotoByClientId(tx, files.clientId));
	if (photo && photo.fileKey === files.fileKey && photo.thumbKey === files.thumbKey) return 'kept';
	for (const key of [files.fileKey, files.thumbKey]) {
		if (!key.startsWith(photosOf(storeId))) throw new Error(`Not this store's photo: ${key}`);
		await storage().delete(key);
	}
	return 'removed';
}

export type SavePhotoResult =
	| { ok: true; photo: field.FieldPhoto; duplicate: boolean }
	| { ok: false; reason: 'no_item' | 'item_elsewhere' };

/**
 * Records a stored photo for the job. A client id already stored (a resend) answers the stored
 * photo and `duplicate`, so the caller removes the files it just wrote. A report photo tied to an
 * item needs the item first (sent before it), of this job's report.
 */
export async function savePhoto(
	tx: StoreWriteTx,
	jobId: string,
	userId: string,
	meta: PhotoMeta,
	files: { fileKey: string; thumbKey: string; byteSize: number; width: number; height: number }
): Promise<SavePhotoResult> {
	const existing = await field.readPhotoByClientId(tx, meta.clientId);
	if (existing) {
		if (existing.jobId !== jobId) return { ok: false, reason: 'item_elsewhere' };
		return { ok: true, photo: existing, duplicate: true };
	}
	let itemClientId = meta.purpose === 'completion' ? null : meta.itemClientId;
	if (itemClientId) {
		const item = await field.readItemByClientId(tx, itemClientId);
		const report = await field.readReport(tx, jobId);
		if (!item) return { ok: false, reason: 'no_item' };
		if (!report || item.reportId !== report.id) return { ok: false, reason: 'item_elsewhere' };
	} else itemClientId = null;
	const row = await field.insertPhoto(tx, {
		jobId,
		clientId: meta.clientId,
		purpose: meta.purpose,
		roomId: meta.roomId,
		itemClientId,
		fileKey: files.fileKey,
		thumbKey: files.thumbKey,
		mediaType: 'image/jpeg',
		byteSize: files.byteSize,
		width: files.width,
		height: files.height,
		caption: meta.caption,
		takenAt: meta.takenAt,
		uploadedBy: userId
	});
	if (!row) {
		// Another send of the same photo won the race: answer what it stored.
		const stored = await field.readPhotoByClientId(tx, meta.clientId);
		if (!stored || stored.jobId !== jobId) return { ok: false, reason: 'item_elsewhere' };
		return { ok: true, photo: stored, duplicate: true };
	}
	return { ok: true, photo: row, duplicate: false };
}

/** The bytes of a job's photo (or its thumbnail): undefined when the job has no such photo. */
export async function readPhotoFile(
	tx: StoreTx,
	jobId: string,
	photoId: string,
	size: 'full' | 'thumb'
): Promise<StoredFile | undefined> {
	const photo = await field.readPhoto(tx, jobId, photoId);
	if (!photo) return undefined;
	return storage().get(size === 'thumb' ? photo.thumbKey : photo.fileKey);
}

/**
 * For the customer's link (the "change" part calls it after checking the token): a report photo
 * of the change order's job, or undefined. Only photos of the report the change order was made
 * from are shown; completion photos and other jobs' photos are not.
 */
export async function readPhotoForChangeOrder(
	tx: StoreTx,
	changeOrderId: string,
	photoId: string,
	size: 'full' | 'thumb' = 'full'
): Promise<StoredFile | undefined> {
	const [co] = await tx
		.select({ jobId: changeOrder.jobId })
		.from(changeOrder)
		.where(and(eq(changeOrder.organizationId, tx.storeId), eq(changeOrder.id, changeOrderId)));
	if (!co) return undefined;
	const photo = await field.readPhoto(tx, co.jobId, photoId);
	if (!photo || photo.purpose !== 'report') return undefined;
	return storage().get(size === 'thumb' ? photo.thumbKey : photo.fileKey);
}
