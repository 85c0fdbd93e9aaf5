// Image work (photos and logos through sharp) shares one small queue. Decoding a phone photo
// takes tens of megabytes of native memory outside the JavaScript heap; ten uploads at once took
// the server's resident memory past 400 MB, and on a 2-core server more than two at a time
// finishes no sooner (measured: 10 at once vs 2 at a time, 200 photos, 35 s vs 23 s). Requests
// beyond two wait their turn here instead.
import pLimit from 'p-limit';
import sharp from 'sharp';

/** How many images are decoded at once in this process. */
export const IMAGE_CONCURRENCY = 2;

// libvips keeps recent operations cached for reuse; uploads never repeat one, so it only holds
// memory.
sharp.cache(false);

const queue = pLimit(IMAGE_CONCURRENCY);

/** Runs `work` (which uses sharp) when one of the image slots is free. */
export function imageWork<T>(work: () => Promise<T>): Promise<T> {
	return queue(work);
}
