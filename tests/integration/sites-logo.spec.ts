import { inStore } from '$lib/server/db/tenant';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import * as sites from '$lib/server/db/queries/sites';
import { readProfile } from '$lib/server/db/queries/stores';
import { readLogo, removeLogo, saveLogo } from '$lib/server/logo';
import { localDisk } from '$lib/server/storage';
import { siteSchema } from '$lib/schemas/site';
import { afterAll, describe, expect, it } from 'vitest';
import { makeCustomer, makeJob, makeSite, makeStore } from './factories';

const home = {
	label: 'Lake house',
	address: '3 Reedbank Row',
	town: 'Testville',
	postcode: 'TV1 2AB',
	builtYear: 1974,
	subfloor: 'board',
	notes: 'Crawl space access from the garage.'
};

describe('sites', () => {
	it('are created, listed, changed and deleted for a customer', async () => {
		const store = await makeStore('Site Floors');
		const customer = await makeCustomer(store.id);
		const first = await makeSite(store.id, customer.id);
		const second = await inStore(store.id, (tx) => sites.create(tx, customer.id, home));
		expect(second).toMatchObject(home);
		const listed = await inStore(store.id, (tx) => sites.listWithJobCounts(tx, customer.id));
		expect(listed.map((s) => [s.label, s.jobs])).toEqual([
			['Home', 0],
			['Lake house', 0]
		]);
		const changed = await inStore(store.id, (tx) =>
			sites.update(tx, second!.id, {
				notes: 'Dog in the yard',
				builtYear: null
			})
		);
		expect(changed).toMatchObject({
			notes: 'Dog in the yard',
			builtYear: null,
			address: home.address
		});
		expect(await inStore(store.id, (tx) => sites.remove(tx, first.id))).toBe('deleted');
		expect(
			(await inStore(store.id, (tx) => sites.listForCustomer(tx, customer.id))).map((s) => s.id)
		).toEqual([second!.id]);
	});

	it('with jobs are kept', async () => {
		const store = await makeStore('Kept Floors');
		const customer = await makeCustomer(store.id);
		const site = await makeSite(store.id, customer.id);
		const job = await makeJob(store.id, store.owner.id, customer.id);
		expect(await inStore(store.id, (tx) => sites.setJobSite(tx, job.id, site.id))).toBe('saved');
		expect((await inStore(store.id, (tx) => sites.forJob(tx, job.id)))?.id).toBe(site.id);
		expect(
			(await inStore(store.id, (tx) => sites.listWithJobCounts(tx, customer.id)))[0].jobs
		).toBe(1);
		expect(await inStore(store.id, (tx) => sites.remove(tx, site.id))).toBe('has_jobs');
		expect(await inStore(store.id, (tx) => sites.read(tx, site.id))).toBeDefined();
	});

	it('of another customer cannot hold a job', async () => {
		const store = await makeStore('Other Floors');
		const job = await makeJob(store.id, store.owner.id);
		const stranger = await makeCustomer(store.id, 'Someone Else');
		const theirSite = await makeSite(store.id, stranger.id);
		expect(await inStore(store.id, (tx) => sites.setJobSite(tx, job.id, theirSite.id))).toBe(
			'other_customer'
		);
		expect(await inStore(store.id, (tx) => sites.forJob(tx, job.id))).toBeUndefined();
	});

	it('of another store cannot be read, listed, changed, deleted or used', async () => {
		const a = await makeStore('A Sites');
		const b = await makeStore('B Sites');
		const theirCustomer = await makeCustomer(b.id);
		const theirSite = await makeSite(b.id, theirCustomer.id);
		const myJob = await makeJob(a.id, a.owner.id);
		expect(await inStore(a.id, (tx) => sites.read(tx, theirSite.id))).toBeUndefined();
		expect(await inStore(a.id, (tx) => sites.listForCustomer(tx, theirCustomer.id))).toEqual([]);
		expect(
			await inStore(a.id, (tx) => sites.update(tx, theirSite.id, { address: 'Taken' }))
		).toBeUndefined();
		expect(await inStore(a.id, (tx) => sites.remove(tx, theirSite.id))).toBe('not_found');
		expect(await inStore(a.id, (tx) => sites.create(tx, theirCustomer.id, home))).toBeUndefined();
		expect(await inStore(a.id, (tx) => sites.setJobSite(tx, myJob.id, theirSite.id))).toBe(
			'not_found'
		);
		expect((await inStore(b.id, (tx) => sites.read(tx, theirSite.id)))?.address).toBe(
			'9 Test Lane'
		);
	});

	it('forms refuse an empty address and an impossible year by their fields', () => {
		const r = siteSchema.safeParse({ address: ' ', builtYear: '19622' });
		expect(r.success).toBe(false);
		const paths = r.error!.issues.map((i) => i.path.join('.')).sort();
		expect(paths).toEqual(['address', 'builtYear']);
		expect(siteSchema.parse({ address: '1 Elm St', builtYear: '' }).builtYear).toBeNull();
	});
});

describe('the store logo', () => {
	const dirs: string[] = [];
	async function disk() {
		const dir = await mkdtemp(path.join(os.tmpdir(), 'flushline-files-'));
		dirs.push(dir);
		return { dir, files: localDisk(dir) };
	}
	afterAll(async () => {
		await Promise.all(dirs.map((d) => rm(d, { recursive: true, force: true })));
	});

	it('refuses a file that is not a PNG or JPEG, whatever its name, and keeps nothing', async () => {
		const store = await makeStore('Logo Floors');
		const { dir, files } = await disk();
		const text = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"></svg>');
		expect(await saveLogo(store.id, text, files)).toEqual({
			ok: false,
			message: 'The file is not a PNG or JPEG image'
		});
		// PNG's signature with nothing readable behind it.
		const fake = Buffer.concat([
			Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
			Buffer.from('not an image')
		]);
		expect((await saveLogo(store.id, fake, files)).ok).toBe(false);
		expect(await saveLogo(store.id, Buffer.alloc(0), files)).toMatchObject({ ok: false });
		expect((await inStore(store.id, (tx) => readProfile(tx))).logoKey ?? null).toBeNull();
		expect(await readdir(dir)).toEqual([]);
	});

	it('keeps a PNG at most 600 px wide without its metadata, and removes it', async () => {
		const store = await makeStore('Logo Floors');
		const { files } = await disk();
		const big = await sharp({
			create: { width: 1200, height: 400, channels: 4, background: '#a9652c' }
		})
			.png()
			.withMetadata({ exif: { IFD0: { Copyright: 'Invented Owner' } } })
			.toBuffer();
		expect((await sharp(big).metadata()).exif).toBeDefined();
		const saved = await saveLogo(store.id, big, files);
		if (!saved.ok) throw new Error(saved.message);
		expect(saved.key).toMatch(new RegExp(`^${store.id}/logo-[0-9a-f]{16}\\.png$`));
		const logo = await inStore(store.id, (tx) => readLogo(tx, files));
		expect(logo?.type).toBe('image/png');
		const meta = await sharp(logo!.bytes).metadata();
		expect([meta.width, meta.height, meta.format]).toEqual([600, 200, 'png']);
		expect(meta.exif).toBeUndefined();

		const jpeg = await sharp({
			create: { width: 300, height: 300, channels: 3, background: '#fff' }
		})
			.jpeg()
			.toBuffer();
		const replaced = await saveLogo(store.id, jpeg, files);
		expect(replaced.ok && replaced.key.endsWith('.jpg')).toBe(true);
		expect(await files.get(saved.key)).toBeUndefined();
		expect(
			(await sharp((await inStore(store.id, (tx) => readLogo(tx, files)))!.bytes).metadata()).width
		).toBe(300);

		await removeLogo(store.id, files);
		expect(await inStore(store.id, (tx) => readLogo(tx, files))).toBeUndefined();
	});

	it('of another store is not read through this store', async () => {
		const a = await makeStore('A Logo');
		const b = await makeStore('B Logo');
		const { files } = await disk();
		const png = await sharp({ create: { width: 10, height: 10, channels: 3, background: '#000' } })
			.png()
			.toBuffer();
		await saveLogo(b.id, png, files);
		expect(await inStore(a.id, (tx) => readLogo(tx, files))).toBeUndefined();
		expect(await inStore(b.id, (tx) => readLogo(tx, files))).toBeDefined();
	});
});
