// The sign-in limits' store in PostgreSQL (9.5) and the store's time zone setting (8.9), against
// the real test database.
import { inStore, readInStore } from '$lib/server/db/tenant';
import { createAuthLimits } from '$lib/server/auth-limits';
import { pool } from '$lib/server/db';
import { readMembership, readStore, saveTimeZone } from '$lib/server/db/queries/stores';
import { describe, expect, it } from 'vitest';
import { auth, makeStore, makeUser, unique } from './factories';

describe('sign-in limits in PostgreSQL', () => {
	const settings = { perAccount: 2, perAddress: 3, windowSeconds: 60 };

	it('count per account and per address, shared by every limiter on the table', async () => {
		const account = `${unique('limit')}@test.example`;
		const address = `203.0.113.${Math.floor(Math.random() * 250)}`;
		const first = createAuthLimits(pool, settings);
		const second = createAuthLimits(pool, settings); // another server
		expect(await first.attempt('sign-in', { account, address })).toEqual({ ok: true });
		expect(await second.attempt('sign-in', { account, address })).toEqual({ ok: true });
		const refused = await first.attempt('sign-in', { account, address });
		expect(refused.ok).toBe(false);
		if (!refused.ok) expect(refused.retryAfterSeconds).toBeGreaterThan(0);
		// Another kind for the same account has its own count, but the address is spent.
		expect((await second.attempt('reset', { account })).ok).toBe(true);
		expect((await second.attempt('reset', { account: 'other@test.example', address })).ok).toBe(
			false
		);
	});

	it('clear an account after a success, and keep no address or e-mail as typed', async () => {
		const account = `${unique('clear')}@test.example`;
		const limits = createAuthLimits(pool, settings);
		await limits.attempt('sign-in', { account });
		await limits.attempt('sign-in', { account });
		expect((await limits.attempt('sign-in', { account })).ok).toBe(false);
		await limits.succeeded('sign-in', account.toUpperCase());
		expect((await limits.attempt('sign-in', { account })).ok).toBe(true);
		const { rows } = await pool.query<{ key: string }>('select key from auth_limit');
		expect(rows.length).toBeGreaterThan(0);
		expect(rows.some((r) => r.key.includes('@') || r.key.includes('203.0.113'))).toBe(false);
	});
});

describe('the store\u2019s time zone', () => {
	it('is UTC until set, comes with the membership, and is kept when changed', async () => {
		const store = await makeStore('Zone Floors');
		expect((await readMembership(store.owner.id, store.id))?.store.timeZone).toBe('UTC');
		await inStore(store.id, (tx) => saveTimeZone(tx, 'America/Chicago'));
		expect((await readMembership(store.owner.id, store.id))?.store.timeZone).toBe(
			'America/Chicago'
		);
		expect((await readInStore(store.id, (tx) => readStore(tx)))?.timeZone).toBe('America/Chicago');
	});

	it('can be given when the store is created', async () => {
		const owner = await makeUser('Zone owner');
		const org = await auth.api.createOrganization({
			body: { name: 'Tokyo Floors', slug: unique('zone'), userId: owner.id, timeZone: 'Asia/Tokyo' }
		});
		expect((await readMembership(owner.id, org!.id))?.store.timeZone).toBe('Asia/Tokyo');
	});
});
