// The S3-compatible file store against a local S3 server (s3rver, from npm): the same answers as
// the local-disk driver — a put is read back whole with its media type, a missing key is
// undefined, a delete of a missing key is no error, bad keys never reach the bucket.
// (The app serves files through its own access checks; the bucket needs no public read. s3rver
// does not enforce bucket policies, so privacy is the deployment's, see README.)
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { CreateBucketCommand, S3Client } from '@aws-sdk/client-s3';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { localDisk, type Storage } from './storage';
import { s3Storage } from './storage-s3';

const BUCKET = 'flushline-test';
// s3rver's own fixed local credentials.
const CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

let server: S3rver;
let dir: string;
let endpoint: string;
let files: Storage;
let disk: Storage;

beforeAll(async () => {
	dir = mkdtempSync(path.join(tmpdir(), 'flushline-s3-'));
	server = new S3rver({ port: 0, address: '127.0.0.1', silent: true, directory: dir });
	const { port } = await server.run();
	endpoint = `http://127.0.0.1:${port}`;
	const client = new S3Client({
		region: 'us-east-1',
		endpoint,
		forcePathStyle: true,
		credentials: CREDENTIALS
	});
	await client.send(new CreateBucketCommand({ Bucket: BUCKET }));
	files = s3Storage({
		bucket: BUCKET,
		region: 'us-east-1',
		endpoint,
		prefix: 'app/',
		...CREDENTIALS
	});
	disk = localDisk(path.join(dir, 'disk'));
});

afterAll(async () => {
	await server?.close();
	rmSync(dir, { recursive: true, force: true });
});

const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex');

describe('the S3 file store', () => {
	it('reads back what it stored, byte for byte, with its media type', async () => {
		const bytes = Buffer.concat([PNG, Buffer.alloc(300_000, 7)]);
		await files.put('store-1/photos/a.png', bytes, 'image/png');
		const read = await files.get('store-1/photos/a.png');
		expect(read?.type).toBe('image/png');
		expect(read?.bytes.equals(bytes)).toBe(true);
	});

	it('answers like the local disk for a missing key and a missing delete', async () => {
		expect(await files.get('store-1/none.jpg')).toBeUndefined();
		expect(await disk.get('store-1/none.jpg')).toBeUndefined();
		await expect(files.delete('store-1/none.jpg')).resolves.toBeUndefined();
		await files.put('store-1/gone.jpg', Buffer.from('x'), 'image/jpeg');
		await files.delete('store-1/gone.jpg');
		expect(await files.get('store-1/gone.jpg')).toBeUndefined();
	});

	it('refuses keys that could leave the store folder and types that do not match', async () => {
		for (const bad of ['../x.png', '/abs.png', 'a/../../b.png', 'a//b.png', 'no-extension']) {
			await expect(files.put(bad, PNG, 'image/png')).rejects.toThrow(/Not a storage key/);
			await expect(files.get(bad)).rejects.toThrow(/Not a storage key/);
		}
		await expect(files.put('store-1/x.png', PNG, 'image/jpeg')).rejects.toThrow(/does not match/);
	});
});
