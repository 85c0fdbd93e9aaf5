// Image work (photos and logos through sharp) shares one small queue. Decoding a phone photo
// takes tens of megabytes of native memory outside the JavaScript heap; ten uploads at once took
// the server's resident memory past 400 MB, and on a 2-core server more than two at a time
// finishes no sooner (measured: 10 at once vs 2 at a time, 200 photos, 35 s vs 23 s). Requests
// beyond two wait their turn here instead.
import pLimit from 'p-limit';
import sharp from 'sharp';

/** How many images are decoded at once in this process. */
export const IMAGE_CONCURRENCY = 2;

/**
 * How many images may wait for a slot. Past that the server is answering photos slower than they
 * come, and every waiting upload holds its body in memory: at a steady 50 photos a second (about 18
 * are decoded a second here) the queue grew to hundreds and the server's memory to 298 MB
 * (bench/README.md). A request beyond it is answered 503 with Retry-After; the phone's outbox keeps
 * the photo and sends it again (src/lib/field/outbox.ts).
 */
export const IMAGE_WAITING_LIMIT = 8;

/** The image queue is full: try again shortly. */
export class ImagesBusy extends Error {
	constructor() {
		super('The image queue is full');
	}
}

// libvips keeps recent operations cached for reuse; uploads never repeat one, so it only holds
// memory.
sharp.cache(false);

const queue = pLimit(IMAGE_CONCURRENCY);

/** Whether a new image would find the queue full (checked before an upload's body is read). */
export function imagesBusy(): boolean {
	return queue.pendingCount >= IMAGE_WAITING_LIMIT;
}

/**
 * Runs `work` (which uses sharp) when one of the image slots is free; rejects with `ImagesBusy`,
 * without running it, when IMAGE_WAITING_LIMIT images are already waiting.
 */
export function imageWork<T>(work: () => Promise<T>): Promise<T> {
	if (imagesBusy()) return Promise.reject(new ImagesBusy());
	return queue(work);
}
