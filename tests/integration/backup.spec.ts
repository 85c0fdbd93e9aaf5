// Backups (issue 13, item 6): `npm run db:backup` dumps the database and copies the file store;
// `npm run db:restore` wipes a database, restores both, and checks every table's row count and
// every file against the backup's manifest. Restored here into a database of its own, so the
// test database other files use is left alone.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { config } from '$lib/server/config';
import { storage } from '$lib/server/storage';
import { makePaidJob, makeStore } from './factories';

const RESTORED = 'flushline_restore_check';
const scratch = mkdtempSync(path.join(tmpdir(), 'flushline-backup-'));
const adminUrl = (database: string) => {
	const url = new URL(process.env.DATABASE_URL!);
	url.username = 'postgres';
	url.pathname = `/${database}`;
	return url.href;
};

function npmScript(args: string[], env: Record<string, string>) {
	const run = spawnSync(process.execPath, ['scripts/backup.js', ...args], {
		env: { ...process.env, ...env },
		encoding: 'utf8',
		timeout: 120_000
	});
	return { code: run.status, out: `${run.stdout}\n${run.stderr}` };
}

afterAll(async () => {
	const admin = new pg.Client({ connectionString: adminUrl('postgres') });
	await admin.connect();
	await admin.query(`drop database if exists ${RESTORED} with (force)`);
	await admin.end();
	rmSync(scratch, { recursive: true, force: true });
});

describe('a backup', { timeout: 180_000 }, () => {
	it('is restored into a wiped database with every row and every file', async () => {
		const store = await makeStore('Fernhollow Floors');
		const paid = await makePaidJob(store);
		const key = `${store.id}/logo-backup-check.png`;
		const logo = Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex');
		await storage().put(key, logo, 'image/png');

		const folder = path.join(scratch, 'backup');
		const made = npmScript(['backup', folder], { FLUSHLINE_DATA_DIR: config.dataDir });
		expect(made.code, made.out).toBe(0);
		const manifest = JSON.parse(readFileSync(path.join(folder, 'manifest.json'), 'utf8'));
		expect(manifest.rows['public.job']).toBeGreaterThan(0);
		expect(manifest.files.map((f: { name: string }) => f.name)).toContain(key);

		const restoredData = path.join(scratch, 'restored-data');
		const restored = npmScript(['restore', folder, '--into', RESTORED], {
			FLUSHLINE_DATA_DIR: restoredData
		});
		expect(restored.code, restored.out).toBe(0);
		expect(restored.out).toMatch(/every one checked/);

		// The job, its payment and the logo, as they were.
		const db = new pg.Client({ connectionString: adminUrl(RESTORED) });
		await db.connect();
		try {
			const job = await db.query('select number, status from job where id = $1', [paid.job.id]);
			expect(job.rows).toEqual([{ number: paid.job.number, status: 'sold' }]);
			const money = await db.query(
				'select amount_cents, refunded_cents from payment where id = $1',
				[paid.payment.id]
			);
			expect(money.rows).toEqual([{ amount_cents: paid.payment.amountCents, refunded_cents: 100 }]);
			// Row security came back with the tables.
			const forced = await db.query(
				"select relforcerowsecurity from pg_class where relname = 'job' and relkind = 'r'"
			);
			expect(forced.rows[0].relforcerowsecurity).toBe(true);
		} finally {
			await db.end();
		}
		expect(readFileSync(path.join(restoredData, 'files', key))).toEqual(logo);
	});

	it('refuses a restore whose manifest does not match, and says what differs', () => {
		const folder = path.join(scratch, 'backup');
		const manifest = JSON.parse(readFileSync(path.join(folder, 'manifest.json'), 'utf8'));
		manifest.rows['public.job'] += 1;
		const tampered = path.join(scratch, 'tampered');
		spawnSync('cp', ['-r', folder, tampered]);
		spawnSync('sh', ['-c', `cat > ${tampered}/manifest.json`], { input: JSON.stringify(manifest) });
		const restored = npmScript(['restore', tampered, '--into', RESTORED], {
			FLUSHLINE_DATA_DIR: path.join(scratch, 'tampered-data')
		});
		expect(restored.code).toBe(1);
		expect(restored.out).toMatch(/public\.job: \d+ rows, the backup has \d+/);
	});
});
