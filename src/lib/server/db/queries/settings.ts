import { eq, sql } from 'drizzle-orm';
import { defaultSettings, type StoreSettings } from '../../../estimating';
import { settingsSchema } from '../../../schemas/estimate';
import { storeSettings } from '../schema';
import { db } from '../index';
import type { StoreTx, StoreWriteTx } from '../tenant';

export interface StoreTradeSettings {
	settings: StoreSettings;
	currency: string;
	quoteValidDays: number;
}

type Plain = Record<string, unknown>;
const isPlain = (v: unknown): v is Plain =>
	typeof v === 'object' && v !== null && !Array.isArray(v);

/** Saved values over the defaults, key by key, so settings added later get their default. */
export function mergeSettings<T>(defaults: T, saved: unknown): T {
	if (!isPlain(defaults) || !isPlain(saved)) return (saved === undefined ? defaults : saved) as T;
	const out: Plain = { ...defaults };
	for (const [key, value] of Object.entries(saved)) {
		out[key] = key in defaults ? mergeSettings((defaults as Plain)[key], value) : value;
	}
	return out as T;
}

/** The store's settings; the engine's defaults where the store has saved nothing. */
export async function read(tx: StoreTx): Promise<StoreTradeSettings> {
	const [row] = await tx
		.select()
		.from(storeSettings)
		.where(eq(storeSettings.organizationId, tx.storeId));
	if (!row) return { settings: defaultSettings, currency: 'USD', quoteValidDays: 30 };
	const merged = settingsSchema.safeParse(mergeSettings(defaultSettings, row.settings));
	return {
		settings: merged.success ? (merged.data as StoreSettings) : defaultSettings,
		currency: row.currency,
		quoteValidDays: row.quoteValidDays
	};
}

/** Saves the whole settings document (validated by the caller with `settingsSchema`). */
export async function save(tx: StoreWriteTx, input: StoreTradeSettings) {
	const values = {
		settings: input.settings,
		currency: input.currency,
		quoteValidDays: input.quoteValidDays
	};
	await tx
		.insert(storeSettings)
		.values({ organizationId: tx.storeId, ...values })
		.onConflictDoUpdate({
			target: storeSettings.organizationId,
			set: { ...values, updatedAt: new Date() }
		});
}

/** The store's own Stripe account (`acct_…`), or null when card payments are not set up. */
export async function stripeAccount(tx: StoreTx): Promise<string | null> {
	const [row] = await tx
		.select({ account: storeSettings.stripeAccountId })
		.from(storeSettings)
		.where(eq(storeSettings.organizationId, tx.storeId));
	return row?.account ?? null;
}

/**
 * Connects (or, with null, disconnects) the store's Stripe account. A store that never saved its
 * settings gets the engine's defaults with it, as `read` would have given.
 */
export async function saveStripeAccount(tx: StoreWriteTx, account: string | null) {
	await tx
		.insert(storeSettings)
		.values({ organizationId: tx.storeId, settings: defaultSettings, stripeAccountId: account })
		.onConflictDoUpdate({
			target: storeSettings.organizationId,
			set: { stripeAccountId: account, updatedAt: new Date() }
		});
}

/**
 * The store whose Stripe account this is, for a verified webhook event that names the account but
 * not the store (a payout, a charge made in Stripe's dashboard). Row security shows the lookup the
 * one settings row of that account (policy `stripe_account_lookup`), and nothing of any store.
 */
export async function storeOfStripeAccount(account: string): Promise<string | null> {
	if (!account) return null;
	return db.transaction(async (tx) => {
		await tx.execute(sql`select set_config('app.stripe_account', ${account}, true)`);
		const [row] = await tx
			.select({ storeId: storeSettings.organizationId })
			.from(storeSettings)
			.where(eq(storeSettings.stripeAccountId, account));
		return row?.storeId ?? null;
	});
}
