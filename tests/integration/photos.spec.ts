// Site photos through the app: refused unless the bytes are an image (whatever the name or the
// declared type says), within the size limit; turned upright by EXIF orientation and stored with
// no metadata (no GPS); a resend stored once; served only to members who may see the job.
import { PHOTO_MAX_BYTES } from '$lib/schemas/field';
import { fieldPhoto, jobCompletion } from '$lib/server/db/schema';
import { pool } from '$lib/server/db';
import { readInStore } from '$lib/server/db/tenant';
import {
	PHOTO_FILES_CHECK_SECONDS,
	processPhoto,
	putPhotoFiles,
	readPhotoForChangeOrder
} from '$lib/server/field/photos';
import { storage } from '$lib/server/storage';
import { handlers } from '$lib/server/tasks/handlers';
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApp, type App, type Visitor } from './app-server';
import { addMember, makeStore, type TestStore } from './factories';
import { clientId, makeFieldWork, makeInstaller } from './field-factories';
import { makeBookedJob } from './field-jobs';

type PhotoFiles = { clientId: string; fileKey: string; thumbKey: string };

let app: App;
let store: TestStore;
let otherStore: TestStore;
let booked: Awaited<ReturnType<typeof makeBookedJob>>;
let theirs: Awaited<ReturnType<typeof makeBookedJob>>;
let installer: Visitor;
let stranger: Visitor;
let manager: Visitor;
let otherInstaller: Visitor;

beforeAll(async () => {
	app = await startApp();
	store = await makeStore('Ashgrove Flooring');
	otherStore = await makeStore('Penhallow Carpets');
	booked = await makeBookedJob(store);
	theirs = await makeBookedJob(otherStore);
	installer = await app.signIn(booked.installer.user.email);
	stranger = await app.signIn((await makeInstaller(store)).user.email);
	manager = await app.signIn((await addMember(store.id, 'manager', 'Maud Fenn')).email);
	otherInstaller = await app.signIn(theirs.installer.user.email);
	for (const [who, job] of [
		[installer, booked.job.id],
		[otherInstaller, theirs.job.id]
	] as const) {
		const answer = await who.action(`/field/jobs/${job}?/checkIn`, {});
		if (answer.status !== 200) throw new Error(`check-in: ${answer.status} ${answer.text}`);
	}
}, 240_000);

afterAll(async () => {
	await app?.close();
});

/** A landscape JPEG 80×40 with EXIF orientation 6 (shown rotated 90°) and a GPS position. */
async function phoneJpeg() {
	return sharp({ create: { width: 80, height: 40, channels: 3, background: '#26323d' } })
		.jpeg()
		.withMetadata({ orientation: 6 })
		.withExifMerge({
			IFD0: { Make: 'Phone', Model: 'Site Cam' },
			IFD3: {
				GPSLatitudeRef: 'N',
				GPSLatitude: '51/1 30/1 0/1',
				GPSLongitudeRef: 'W',
				GPSLongitude: '0/1 7/1 0/1'
			}
		})
		.toBuffer();
}

function upload(
	who: Visitor,
	jobId: string,
	bytes: Uint8Array,
	fields: Record<string, string> = {},
	name = 'photo.jpg',
	type = 'image/jpeg'
) {
	const form = new FormData();
	form.set('file', new Blob([new Uint8Array(bytes)], { type }), name);
	form.set('clientId', fields.clientId ?? clientId());
	for (const [k, v] of Object.entries(fields)) form.set(k, v);
	return who.request(`/api/v1/field/jobs/${jobId}/photos`, { method: 'POST', body: form });
}

describe('refusals', () => {
	it('refuses a file that is not an image, with a message', async () => {
		const answer = await upload(
			installer,
			booked.job.id,
			new TextEncoder().encode('hello there'),
			{},
			'notes.txt',
			'text/plain'
		);
		expect(answer.status).toBe(415);
		expect(answer.json()).toMatchObject({ message: expect.stringMatching(/not a photo/) });
	});

	it('refuses a PDF renamed and declared as a JPEG', async () => {
		const pdf = new TextEncoder().encode('%PDF-1.7\n1 0 obj << /Type /Catalog >> endobj\n%%EOF');
		const answer = await upload(installer, booked.job.id, pdf, {}, 'kitchen.jpg', 'image/jpeg');
		expect(answer.status).toBe(415);
	});

	it(`refuses a photo over ${PHOTO_MAX_BYTES} bytes, saying the limit`, async () => {
		const big = new Uint8Array(PHOTO_MAX_BYTES + 1);
		big.set(await phoneJpeg());
		const answer = await upload(installer, booked.job.id, big);
		expect(answer.status).toBe(413);
		expect(answer.json()).toMatchObject({ message: expect.stringMatching(/2\.5 MB/) });
	});

	it('refuses a photo tied to an item not sent yet, and bad fields by name', async () => {
		const early = await upload(installer, booked.job.id, await phoneJpeg(), {
			itemClientId: clientId()
		});
		expect(early.status).toBe(409);
		const bad = await upload(installer, booked.job.id, await phoneJpeg(), { clientId: 'x' });
		expect(bad.status).toBe(400);
		expect(JSON.stringify(bad.json())).toMatch(/clientId/);
	});
});

describe('what is stored', () => {
	let photoId = '';
	const id = clientId();

	it('applies the orientation and strips EXIF and GPS, and stores a resend once', async () => {
		const answer = await upload(installer, booked.job.id, await phoneJpeg(), {
			clientId: id,
			roomId: 'r1'
		});
		expect(answer.status).toBe(201);
		const body = answer.json() as { id: string; width: number; height: number };
		photoId = body.id;
		// Orientation 6: the 80×40 landscape is stored upright as 40×80.
		expect([body.width, body.height]).toEqual([40, 80]);
		const again = await upload(installer, booked.job.id, await phoneJpeg(), {
			clientId: id,
			roomId: 'r1'
		});
		expect(again.status).toBe(200);
		expect(again.json()).toMatchObject({ id: photoId, duplicate: true });
		const rows = await readInStore(store.id, (tx) =>
			tx.select().from(fieldPhoto).where(eq(fieldPhoto.clientId, id))
		);
		expect(rows).toHaveLength(1);

		const served = await fetch(
			`${app.origin}/api/v1/field/jobs/${booked.job.id}/photos/${photoId}`,
			{
				headers: { cookie: installer.cookie }
			}
		);
		expect(served.status).toBe(200);
		expect(served.headers.get('content-type')).toBe('image/jpeg');
		const bytes = Buffer.from(await served.arrayBuffer());
		const meta = await sharp(bytes).metadata();
		expect([meta.width, meta.height]).toEqual([40, 80]);
		expect(meta.exif).toBeUndefined();
		expect(meta.orientation).toBeUndefined();
		// The phone's file had a GPS block (EXIF tag 0x8825, either byte order); the stored one has
		// no EXIF block at all (checked above), so no position either.
		const sent = (await sharp(await phoneJpeg()).metadata()).exif!;
		const gpsTag = (b: Buffer) =>
			b.includes(Buffer.from([0x88, 0x25])) || b.includes(Buffer.from([0x25, 0x88]));
		expect(gpsTag(sent)).toBe(true);
		expect(bytes.includes(Buffer.from('Site Cam'))).toBe(false);
		const thumb = await fetch(
			`${app.origin}/api/v1/field/jobs/${booked.job.id}/photos/${photoId}?size=thumb`,
			{ headers: { cookie: installer.cookie } }
		);
		expect(thumb.status).toBe(200);
	});

	it('removes files whose row never came, an hour on, and keeps a stored photo’s', async () => {
		// Each upload queued its check before writing its files, to run an hour later.
		const queued = await pool.query<{ data: { payload: PhotoFiles }; wait: number }>(
			`select data, extract(epoch from start_after - created_on)::int as wait from pgboss.job
			 where name = 'tasks' and data->>'kind' = 'photo.files' and data->>'storeId' = $1
			   and data->'payload'->>'clientId' = $2`,
			[store.id, id]
		);
		// The photo and its resend: two checks, one per set of files written.
		expect(queued.rows).toHaveLength(2);
		for (const row of queued.rows) {
			expect(row.wait).toBeGreaterThanOrEqual(PHOTO_FILES_CHECK_SECONDS - 5);
		}
		const [stored] = await readInStore(store.id, (tx) =>
			tx.select().from(fieldPhoto).where(eq(fieldPhoto.clientId, id))
		);
		const check = (files: PhotoFiles) =>
			handlers['photo.files'](files, context, undefined as never);
		const context = { storeId: store.id, taskId: null, queueId: 'test', attempt: 1 };
		// The stored photo's check keeps its files; the resend's (removed at once) finds nothing.
		for (const row of queued.rows) await check(row.data.payload);
		expect(await storage().get(stored.fileKey)).toBeDefined();
		expect(await storage().get(stored.thumbKey)).toBeDefined();

		// A server that died after writing the files, before the row: its check removes them.
		const processed = await processPhoto(await phoneJpeg());
		if (!processed.ok) throw new Error(processed.message);
		const lost = clientId();
		const files = await putPhotoFiles(store.id, booked.job.id, processed, lost);
		expect(await storage().get(files.fileKey)).toBeDefined();
		await check({ clientId: lost, fileKey: files.fileKey, thumbKey: files.thumbKey });
		expect(await storage().get(files.fileKey)).toBeUndefined();
		expect(await storage().get(files.thumbKey)).toBeUndefined();
		// Never a key outside the store's own photos, whatever a task carries.
		await expect(
			check({ clientId: lost, fileKey: `${otherStore.id}/photos/x/y.jpg`, thumbKey: 'a.jpg' })
		).rejects.toThrow(/Not this store/);
	});

	it('serves it to the store staff, and 404 to an unassigned installer and another store', async () => {
		const path = `/api/v1/field/jobs/${booked.job.id}/photos/${photoId}`;
		expect((await manager.request(path)).status).toBe(200);
		expect((await stranger.request(path)).status).toBe(404);
		expect((await otherInstaller.request(path)).status).toBe(404);
		// Another store's photo through their own job's address: still 404.
		expect(
			(await otherInstaller.request(`/api/v1/field/jobs/${theirs.job.id}/photos/${photoId}`)).status
		).toBe(404);
		// An installer of another store cannot upload to this job either.
		expect((await upload(otherInstaller, booked.job.id, await phoneJpeg())).status).toBe(404);
	});

	it("reads a change order's report photo for the customer's link, and only that", async () => {
		const work = await makeFieldWork(store);
		const { storage } = await import('$lib/server/storage');
		await storage().put(work.photo.fileKey, await phoneJpeg(), 'image/jpeg');
		const file = await readInStore(store.id, (tx) =>
			readPhotoForChangeOrder(tx, work.changeOrder.id, work.photo.id)
		);
		expect(file?.type).toBe('image/jpeg');
		// A photo of another job is not the change order's.
		const other = await readInStore(store.id, (tx) =>
			readPhotoForChangeOrder(tx, work.changeOrder.id, photoId)
		);
		expect(other).toBeUndefined();
	});
});

describe('completion without JavaScript', () => {
	function complete(bytes: Uint8Array, photoClientId: string, name = 'done.jpg') {
		const form = new FormData();
		form.set('walkthroughNotes', 'Walked it with the customer');
		form.set('photoClientId', photoClientId);
		form.set('photo', new Blob([new Uint8Array(bytes)], { type: 'image/jpeg' }), name);
		return installer.request(`/field/jobs/${booked.job.id}?/complete`, {
			method: 'POST',
			headers: { accept: 'application/json', 'x-sveltekit-action': 'true' },
			body: form
		});
	}

	it('refuses a photo that is not one, beside the field, and completes nothing', async () => {
		const answer = await complete(new TextEncoder().encode('not a photo'), clientId(), 'a.jpg');
		expect(answer.text).toMatch(/"type":"failure","status":415/);
		expect(answer.text).toMatch(/not a photo we can take/);
		const rows = await readInStore(store.id, (tx) =>
			tx.select().from(jobCompletion).where(eq(jobCompletion.jobId, booked.job.id))
		);
		expect(rows).toEqual([]);
	});

	it('takes the photo with the form; sent twice, one photo and one completion', async () => {
		const id = clientId();
		for (let i = 0; i < 2; i++) {
			const answer = await complete(await phoneJpeg(), id);
			expect(answer.text).toMatch(/"type":"success"/);
		}
		const [done, photos] = await readInStore(store.id, async (tx) => [
			await tx.select().from(jobCompletion).where(eq(jobCompletion.jobId, booked.job.id)),
			await tx
				.select()
				.from(fieldPhoto)
				.where(and(eq(fieldPhoto.jobId, booked.job.id), eq(fieldPhoto.purpose, 'completion')))
		]);
		expect(done).toHaveLength(1);
		expect(photos.map((p) => [p.clientId, p.width, p.height])).toEqual([[id, 40, 80]]);
	});
});
