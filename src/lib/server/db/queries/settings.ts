import { log } from '../../log';
import { eq, sql } from 'drizzle-orm';
import { isSafeKey } from '../../../input/fields';
import { defaultSettings, type StoreSettings } from '../../../estimating';
import { settingsSchema } from '../../../schemas/estimate';
import { storeSettings } from '../schema';
import { db } from '../index';
import type { StoreTx, StoreWriteTx } from '../tenant';
import { runShape } from '../named';

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

/** A problem with a saved setting: where it is (`deposit.percentBps`) and what is wrong. */
export interface SettingsIssue {
	path: string;
	message: string;
}

/**
 * The store's saved trade settings do not pass the engine's schema. They are never replaced by the
 * engine's defaults in silence (a store's taxes must not vanish from new quotes): whatever needs
 * them refuses until the owner fixes them in Store settings.
 */
export class InvalidStoreSettings extends Error {
	constructor(
		readonly storeId: string,
		readonly issues: SettingsIssue[]
	) {
		super(
			`The saved trade settings of store ${storeId} are not valid: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`
		);
	}
}

export type CheckedSettings =
	| { ok: true; trade: StoreTradeSettings }
	| {
			ok: false;
			issues: SettingsIssue[];
			/** What is saved, over the defaults, unchecked: for the owner's form, nothing else. */
			saved: StoreTradeSettings;
	  };

/**
 * The store's settings as saved, checked with the engine's schema. Settings added since the store
 * last saved get their default (they were never chosen); a saved value that fails the check is an
 * issue, never a default.
 */
export async function readChecked(tx: StoreTx): Promise<CheckedSettings> {
	const [row] = await runShape(
		tx,
		'settings.readChecked',
		() =>
			tx
				.select()
				.from(storeSettings)
				.where(eq(storeSettings.organizationId, sql.placeholder('store'))),
		{ store: tx.storeId }
	);
	if (!row) {
		return { ok: true, trade: { settings: defaultSettings, currency: 'USD', quoteValidDays: 30 } };
	}
	const merged = mergeSettings(defaultSettings, row.settings);
	const checked = settingsSchema.safeParse(merged);
	const base = { currency: row.currency, quoteValidDays: row.quoteValidDays };
	if (checked.success) {
		return { ok: true, trade: { ...base, settings: checked.data as StoreSettings } };
	}
	return {
		ok: false,
		issues: checked.error.issues.map((i) => ({
			path: i.path.map(String).join('.') || '(settings)',
			message: i.message
		})),
		saved: { ...base, settings: merged }
	};
}

/**
 * The store's settings, for anything that measures, prices or quotes with them. Settings that fail
 * the check are logged with the store and thrown as `InvalidStoreSettings`.
 */
export async function read(tx: StoreTx): Promise<StoreTradeSettings> {
	const checked = await readChecked(tx);
	if (checked.ok) return checked.trade;
	const problem = new InvalidStoreSettings(tx.storeId, checked.issues);
	log.error({ storeId: tx.storeId, issues: checked.issues }, 'Saved trade settings are not valid');
	throw problem;
}

/**
 * The store's currency and how long its quotes stay open: columns of their own, readable whatever
 * the state of the trade settings.
 */
export async function termsOf(tx: StoreTx): Promise<{ currency: string; quoteValidDays: number }> {
	const [row] = await tx
		.select({ currency: storeSettings.currency, quoteValidDays: storeSettings.quoteValidDays })
		.from(storeSettings)
		.where(eq(storeSettings.organizationId, tx.storeId));
	return row ?? { currency: 'USD', quoteValidDays: 30 };
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
