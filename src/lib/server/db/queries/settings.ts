import { eq } from 'drizzle-orm';
import { isSafeKey } from '../../../input/fields';
import { defaultSettings, type StoreSettings } from '../../../estimating';
import { settingsSchema } from '../../../schemas/estimate';
import { storeSettings } from '../schema';
import { inStore } from '../tenant';

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
		// A stored `__proto__` key (own, from JSON) must not become this object's prototype.
		if (!isSafeKey(key)) continue;
		out[key] = Object.hasOwn(defaults, key) ? mergeSettings(defaults[key], value) : value;
	}
	return out as T;
}

/** The store's settings; the engine's defaults where the store has saved nothing. */
export async function read(storeId: string): Promise<StoreTradeSettings> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select()
			.from(storeSettings)
			.where(eq(storeSettings.organizationId, storeId));
		if (!row) return { settings: defaultSettings, currency: 'USD', quoteValidDays: 30 };
		const merged = settingsSchema.safeParse(mergeSettings(defaultSettings, row.settings));
		return {
			settings: merged.success ? (merged.data as StoreSettings) : defaultSettings,
			currency: row.currency,
			quoteValidDays: row.quoteValidDays
		};
	});
}

/** Saves the whole settings document (validated by the caller with `settingsSchema`). */
export async function save(storeId: string, input: StoreTradeSettings) {
	return inStore(storeId, async (tx) => {
		const values = {
			settings: input.settings,
			currency: input.currency,
			quoteValidDays: input.quoteValidDays
		};
		await tx
			.insert(storeSettings)
			.values({ organizationId: storeId, ...values })
			.onConflictDoUpdate({
				target: storeSettings.organizationId,
				set: { ...values, updatedAt: new Date() }
			});
	});
}

/** The store's own Stripe account (`acct_…`), or null when card payments are not set up. */
export async function stripeAccount(storeId: string): Promise<string | null> {
	return inStore(storeId, async (tx) => {
		const [row] = await tx
			.select({ account: storeSettings.stripeAccountId })
			.from(storeSettings)
			.where(eq(storeSettings.organizationId, storeId));
		return row?.account ?? null;
	});
}

/** Connects (or, with null, disconnects) the store's Stripe account. */
export async function saveStripeAccount(storeId: string, account: string | null) {
	const current = await read(storeId);
	return inStore(storeId, async (tx) => {
		await tx
			.insert(storeSettings)
			.values({
				organizationId: storeId,
				settings: current.settings,
				currency: current.currency,
				quoteValidDays: current.quoteValidDays,
				stripeAccountId: account
			})
			.onConflictDoUpdate({
				target: storeSettings.organizationId,
				set: { stripeAccountId: account, updatedAt: new Date() }
			});
	});
}
