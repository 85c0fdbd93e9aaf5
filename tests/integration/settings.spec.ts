// Saved trade settings that fail the engine's schema: an error logged with the store and shown to
// the owner, never the engine's defaults in their place (a store's taxes must not vanish from new
// quotes); the owner fixes them, or puts the defaults back for just what is wrong.
import { log } from '$lib/server/log';
import { grantsOf } from '$lib/server/permissions';
import { defaultSettings } from '$lib/estimating';
import * as quotes from '$lib/server/db/queries/quotes';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { storeSettings } from '$lib/server/db/schema';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { runCalculator } from '$lib/server/estimates';
import { buildQuote } from '$lib/server/quotes/build';
import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import { eq, sql } from 'drizzle-orm';
import { describe, expect, it, vi } from 'vitest';
import { makeJob, makeQuotedJob, makeStore, TEST_ORIGIN } from './factories';

let current: Partial<RequestEvent> | undefined;
vi.mock('$app/server', () => ({ getRequestEvent: () => current }));
const settingsPage = await import('../../src/routes/app/settings/+page.server');

/** Spoils one saved setting, as a bad hand edit or an old release might have. */
async function spoil(storeId: string) {
	await inStore(storeId, (tx) =>
		tx
			.update(storeSettings)
			.set({
				settings: sql`jsonb_set(${storeSettings.settings}, '{deposit,percentBps}', '"lots"')`
			})
			.where(eq(storeSettings.organizationId, storeId))
	);
}

function asOwner(store: { id: string; name: string; owner: { id: string } }) {
	const url = new URL(`${TEST_ORIGIN}/app/settings`);
	current = {
		url,
		params: {},
		request: new Request(url, { method: 'POST', body: new FormData() }),
		locals: {
			user: store.owner as App.Locals['user'],
			session: { id: 'session' } as App.Locals['session'],
			store: { id: store.id, name: store.name, slug: 'test', logo: null, timeZone: 'UTC' },
			role: 'owner',
			grants: grantsOf('owner'),
			denied: null
		}
	} as unknown as RequestEvent;
	return current as RequestEvent;
}

describe('saved trade settings that are not valid', () => {
	it('are refused, logged with the store, and never replaced by defaults', async () => {
		const store = await makeStore('Spoiled Floors');
		const { job } = await makeQuotedJob(store);
		await spoil(store.id);
		const errors = vi.spyOn(log, 'error').mockImplementation(() => {});
		try {
			const read = readInStore(store.id, tradeSettings.read);
			await expect(read).rejects.toBeInstanceOf(tradeSettings.InvalidStoreSettings);
			await expect(read).rejects.toThrow(/deposit\.percentBps/);
			expect(JSON.stringify(errors.mock.calls)).toContain(store.id);

			// No new quote is priced with them, and none with defaults instead.
			const before = await readInStore(store.id, (tx) => quotes.list(tx, job.id));
			expect(await inStore(store.id, (tx) => buildQuote(tx, job.id, store.owner.id))).toEqual({
				ok: false,
				reason: 'settings'
			});
			expect(await readInStore(store.id, (tx) => quotes.list(tx, job.id))).toEqual(before);

			// Calculators and the API say so with a 409, not the engine's defaults.
			let refused: unknown;
			try {
				await readInStore(store.id, (tx) =>
					runCalculator(tx, 'cartons', { areaSqFt: 120, coverageSqFt: 20.5, layout: 'straight' })
				);
			} catch (e) {
				refused = e;
			}
			expect(isHttpError(refused) && refused.status).toBe(409);
		} finally {
			errors.mockRestore();
		}
	});

	it('are shown to the owner with what is wrong, and the defaults go back only where wrong', async () => {
		const store = await makeStore('Owner Fixes Floors');
		await makeJob(store.id, store.owner.id);
		await makeQuotedJob(store);
		await spoil(store.id);
		const errors = vi.spyOn(log, 'error').mockImplementation(() => {});
		try {
			const page = (await settingsPage.load(asOwner(store) as never)) as {
				settingsProblem: { issues: { path: string; message: string }[] } | null;
				trade: Record<string, string>;
			};
			expect(page.settingsProblem?.issues.map((i) => i.path)).toEqual(['deposit.percentBps']);
			// The form shows what the store saved (its own tax), not the defaults.
			expect(page.trade['taxes.0.name']).toBe('Test sales tax');

			expect(await settingsPage.actions.restoreDefaults(asOwner(store) as never)).toEqual({
				defaultsRestored: true
			});
			const fixed = await readInStore(store.id, tradeSettings.read);
			expect(fixed.settings.deposit).toEqual(defaultSettings.deposit);
			expect(fixed.settings.taxes).toEqual([
				{ name: 'Test sales tax', rateBps: 650, groups: ['material'] }
			]);
		} finally {
			errors.mockRestore();
		}
	});
});
