import { error } from '@sveltejs/kit';
import type { FieldPhotoRow } from '../db/queries/change-orders';
import { log } from '../log';
import { storage } from '../storage';

/**
 * The bytes of a site photo the caller has already allowed: the thumbnail with `?size=thumb`,
 * else the stored (re-encoded) photo. A file missing from the store is 404.
 */
export async function photoResponse(photo: FieldPhotoRow, url: URL): Promise<Response> {
	const key = url.searchParams.get('size') === 'thumb' ? photo.thumbKey : photo.fileKey;
	let file;
	try {
		file = await storage().get(key);
	} catch (e) {
		log.error({ err: e, photoId: photo.id }, 'A site photo could not be read');
		error(404, 'Not found');
	}
	if (!file) error(404, 'Not found');
	return new Response(new Uint8Array(file.bytes), {
		headers: {
			'content-type': file.type,
			'cache-control': 'private, max-age=300',
			'x-content-type-options': 'nosniff'
		}
	});
}
