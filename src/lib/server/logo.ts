import { createHash } from 'node:crypto';
import sharp from 'sharp';
import { readProfile, saveLogoKey } from './db/queries/stores';
import { imageWork, ImagesBusy } from './images';
import { inStore, type StoreTx } from './db/tenant';
import { storage, type Storage, type StoredFile } from './storage';

/** The largest logo accepted, before resizing. */
export const LOGO_MAX_BYTES = 2 * 1024 * 1024;
/** Logos are kept at most this wide: enough for a page header and a PDF. */
export const LOGO_MAX_WIDTH = 600;

export type LogoResult =
	{ ok: true; bytes: Buffer; type: 'image/png' | 'image/jpeg' } | { ok: false; message: string };

const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const JPEG = Buffer.from([0xff, 0xd8, 0xff]);

/** PNG or JPEG by the file's first bytes (its name and stated type are not trusted). */
export function sniffImage(bytes: Buffer): 'png' | 'jpeg' | null {
	if (bytes.subarray(0, PNG.length).equals(PNG)) return 'png';
	if (bytes.subarray(0, JPEG.length).equals(JPEG)) return 'jpeg';
	return null;
}

/**
 * Checks an uploaded logo by its content and makes the copy we keep: turned upright, at most
 * 600 px wide, every metadata block (EXIF, GPS, ICC comments) dropped, in its own format.
 */
export async function prepareLogo(bytes: Buffer): Promise<LogoResult> {
	if (bytes.length === 0) return { ok: false, message: 'Choose a PNG or JPEG file' };
	if (bytes.length > LOGO_MAX_BYTES) {
		return { ok: false, message: 'The logo is over 2 MB: save it smaller and try again' };
	}
	const format = sniffImage(bytes);
	if (!format) return { ok: false, message: 'The file is not a PNG or JPEG image' };
	try {
		const out = await imageWork(() => {
			const image = sharp(bytes, { limitInputPixels: 50_000_000, failOn: 'error' })
				.rotate()
				.resize({ width: LOGO_MAX_WIDTH, withoutEnlargement: true });
			return format === 'png'
				? image.png({ compressionLevel: 9 }).toBuffer()
				: image.jpeg({ quality: 85, mozjpeg: true }).toBuffer();
		});
		return { ok: true, bytes: out, type: format === 'png' ? 'image/png' : 'image/jpeg' };
	} catch (err) {
		if (err instanceof ImagesBusy) {
			return { ok: false, message: 'The server is busy with other images: try again in a moment' };
		}
		return { ok: false, message: 'The image could not be read: it may be damaged' };
	}
}

/**
 * Saves a new logo for the store and drops the old file once the new key is committed. Nothing
 * changes when the file is refused.
 */
export async function saveLogo(
	storeId: string,
	upload: Buffer,
	files: Storage = storage()
): Promise<{ ok: true; key: string } | { ok: false; message: string }> {
	const logo = await prepareLogo(upload);
	if (!logo.ok) return logo;
	const hash = createHash('sha256').update(logo.bytes).digest('hex').slice(0, 16);
	const key = `${storeId}/logo-${hash}.${logo.type === 'image/png' ? 'png' : 'jpg'}`;
	await files.put(key, logo.bytes, logo.type);
	const previous = await inStore(storeId, async (tx) => {
		const before = (await readProfile(tx)).logoKey ?? null;
		await saveLogoKey(tx, key);
		return before;
	});
	if (previous && previous !== key) await files.delete(previous);
	return { ok: true, key };
}

/** Removes the store's logo (the key first, then the file). */
export async function removeLogo(storeId: string, files: Storage = storage()) {
	const previous = await inStore(storeId, async (tx) => {
		const before = (await readProfile(tx)).logoKey ?? null;
		await saveLogoKey(tx, null);
		return before;
	});
	if (previous) await files.delete(previous);
}

/**
 * The store's logo bytes and media type, for its pages, PDFs and the customer's link; undefined
 * when it has none. Reads only the key saved for that store.
 */
export async function readLogo(
	tx: StoreTx,
	files: Storage = storage()
): Promise<StoredFile | undefined> {
	const key = (await readProfile(tx)).logoKey;
	if (!key || !key.startsWith(`${tx.storeId}/`)) return undefined;
	return files.get(key);
}
