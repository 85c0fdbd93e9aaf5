import { defaultSettings, type StoreSettings } from '$lib/estimating';
import { error } from '@sveltejs/kit';
import {
	InvalidStoreSettings,
	read,
	type SettingsIssue,
	type StoreTradeSettings
} from './db/queries/settings';
import type { StoreTx } from './db/tenant';

/** What people are told when the store's saved trade settings are not valid. */
export const SETTINGS_NOT_VALID =
	'This store’s trade settings are not valid, so nothing is measured, priced or quoted with them until they are fixed. The owner can fix them in Store settings.';

/**
 * The store's trade settings for a page or an endpoint. Saved settings that are not valid are a
 * clear 409 (logged with the store by `read`), never the engine's defaults in their place.
 */
export async function tradeSettingsFor(tx: StoreTx): Promise<StoreTradeSettings> {
	try {
		return await read(tx);
	} catch (e) {
		if (e instanceof InvalidStoreSettings) error(409, SETTINGS_NOT_VALID);
		throw e;
	}
}

/**
 * The saved settings with the engine's default put back for each top-level setting that is not
 * valid (the whole `deposit`, say, when its percent is), and nothing else changed. Only when the
 * owner asks for it: never done quietly.
 */
export function restoreDefaultsWhereInvalid(
	saved: StoreSettings,
	issues: SettingsIssue[]
): StoreSettings {
	const broken = new Set(issues.map((i) => i.path.split('.')[0]));
	const defaults = defaultSettings as unknown as Record<string, unknown>;
	const kept = Object.entries(saved as unknown as Record<string, unknown>).filter(
		([key]) => !broken.has(key)
	);
	const restored = Object.entries(defaults).filter(([key]) => broken.has(key));
	return Object.fromEntries([...kept, ...restored]) as unknown as StoreSettings;
}
