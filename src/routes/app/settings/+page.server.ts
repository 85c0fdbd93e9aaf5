import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { readProfile, savePapers, saveProfile, saveTimeZone } from '$lib/server/db/queries/stores';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { fieldErrors, parseForm, refuse, typedValues } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { LOGO_MAX_BYTES, removeLogo, saveLogo } from '$lib/server/logo';
import { storePapersSchema, storeProfileSchema } from '$lib/schemas/store';
import { DEFAULT_PAPERS, PAPERS_MAX } from '$lib/papers/store-papers';
import { saveStoreAccess } from '$lib/server/db/queries/access';
import {
	applyTradeSettings,
	storeAccessFormSchema,
	tradeSettingsFormSchema,
	tradeSettingsToForm
} from '$lib/schemas/store-settings';
import { currencySymbol, formFields, readFields } from '$lib/input';
import { defaultSettings, type StoreSettings } from '$lib/estimating';
import { settingsSchema } from '$lib/schemas/estimate';
import { restoreDefaultsWhereInvalid } from '$lib/server/store-settings';
import { log } from '$lib/server/log';
import { connectStripeAccount } from '$lib/server/payments/connect';
import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

/** The trade form's values and the fastening schedules, from settings that may not be valid. */
function tradeForm(trade: tradeSettings.StoreTradeSettings) {
	const of = (settings: StoreSettings) => ({
		values: tradeSettingsToForm(settings, trade.quoteValidDays, trade.currency),
		schedules: Object.entries(settings.underlayment.schedules).map(([key, s]) => ({ key, ...s }))
	});
	try {
		return { ...of(trade.settings), fromDefaults: false };
	} catch {
		// Saved settings too broken to fill the form: it shows the engine's defaults, and says so.
		return { ...of(defaultSettings), fromDefaults: true };
	}
}

export const load: PageServerLoad = async () => {
	const { store, grants } = requirePermission({ store: ['update'] });
	const { profile, checked, stripeAccount } = await readInStore(store.id, async (tx) => ({
		profile: await readProfile(tx),
		checked: await tradeSettings.readChecked(tx),
		stripeAccount: await tradeSettings.stripeAccount(tx)
	}));
	const trade = checked.ok ? checked.trade : checked.saved;
	const form = tradeForm(trade);
	if (!checked.ok) {
		log.error({ storeId: store.id, issues: checked.issues }, 'Saved trade settings are not valid');
	}
	return {
		stripeAccount,
		profile: { ...profile, name: store.name, timeZone: store.timeZone },
		// The store's own words on its customer papers (blank: the default, shown beside the field).
		papers: {
			values: {
				nextSteps: profile.papersNextSteps,
				cancellation: profile.papersCancellation,
				terms: profile.papersTerms
			},
			defaults: DEFAULT_PAPERS,
			max: PAPERS_MAX
		},
		logoVersion: profile.logoKey ? profile.logoKey.replace(/^.*logo-|\..*$/g, '') : null,
		trade: form.values,
		currencySymbol: currencySymbol(trade.currency),
		access: grants.access,
		schedules: form.schedules,
		// Shown to the owner: what is wrong with the saved settings (never replaced in silence).
		settingsProblem: checked.ok
			? null
			: { issues: checked.issues.slice(0, 20), formFromDefaults: form.fromDefaults }
	};
};

const CONNECT_REFUSED = {
	unknown:
		'This account cannot be connected: Stripe does not have it as an account connected to Flushline, or it is not free to use. Check the id in your Stripe dashboard.',
	stripe: 'Stripe could not be reached to check the account. Try again in a minute.'
} as const;

/** A refused trade form: what was typed and each field's message, kept apart from the other forms. */
function refuseTrade(form: FormData, errors: Record<string, string[]>) {
	return fail(400, { trade: { values: typedValues(form), errors } });
}

export const actions: Actions = {
	/** The store's own Stripe account, where its card payments, refunds and payouts live. */
	stripe: async ({ request }) => {
		const { store } = requirePermission({ store: ['update'] });
		const form = await request.formData();
		const account = String(form.get('account') ?? '').trim();
		if (account && !/^acct_[A-Za-z0-9]{6,64}$/.test(account)) {
			return fail(400, {
				stripe: { value: account, error: 'A Stripe account id looks like acct_1A2b3C4d5E6f' }
			});
		}
		const connected = await connectStripeAccount(store.id, account || null);
		if (!connected.ok) {
			return fail(connected.reason === 'stripe' ? 502 : 400, {
				stripe: { value: account, error: CONNECT_REFUSED[connected.reason] }
			});
		}
		return { stripeSaved: true };
	},
	profile: async ({ request }) => {
		const { store } = requirePermission({ store: ['update'] });
		const parsed = await parseForm(request, storeProfileSchema);
		if (!parsed.ok) return parsed.failure;
		const { name, timeZone, ...profile } = parsed.data;
		if (name !== store.name) {
			try {
				await auth.api.updateOrganization({
					headers: request.headers,
					body: { organizationId: store.id, data: { name } }
				});
			} catch (e) {
				return refuse(parsed.form, { name: [authFailure(e).message] });
			}
		}
		await inStore(store.id, async (tx) => {
			await saveProfile(tx, profile);
			if (timeZone !== store.timeZone) await saveTimeZone(tx, timeZone);
		});
		return { saved: true };
	},
	/** The store's terms, cancellation policy and what happens next, on its customer papers. */
	papers: async ({ request }) => {
		const { store } = requirePermission({ store: ['update'] });
		const form = await request.formData();
		const parsed = storePapersSchema.safeParse(formFields(form));
		if (!parsed.success) {
			return fail(400, {
				papers: { values: typedValues(form), errors: fieldErrors(parsed.error) }
			});
		}
		await inStore(store.id, (tx) => savePapers(tx, parsed.data));
		return { papersSaved: true };
	},
	/** Taxes, deposit, quote validity, units, waste, fastening schedule, crew output; the rest is kept. */
	trade: async ({ request }) => {
		const { store } = requirePermission({ store: ['update'] });
		const form = await request.formData();
		const fields = readFields(form);
		if (!fields.ok) return refuseTrade(form, { _form: [fields.message] });
		const refused = await inStore(store.id, async (tx) => {
			const checked = await tradeSettings.readChecked(tx);
			// Settings that are not valid are fixed by saving the form over them (or by putting the
			// defaults back, below); what the form does not show must then be valid too.
			const current = checked.ok ? checked.trade : checked.saved;
			const schema = tradeSettingsFormSchema(
				Object.keys(
					current.settings.underlayment?.schedules ?? defaultSettings.underlayment.schedules
				),
				current.currency
			);
			const parsed = schema.safeParse(fields.value);
			if (!parsed.success) return fieldErrors(parsed.error);
			const applied = applyTradeSettings(current.settings, parsed.data);
			if (!applied.ok) return applied.errors;
			await tradeSettings.save(tx, {
				settings: applied.settings,
				currency: current.currency,
				quoteValidDays: applied.quoteValidDays
			});
			return null;
		});
		if (refused) return refuseTrade(form, refused);
		return { tradeSaved: true };
	},
	/** Who sees what: salespeople and costs, salespeople and other people's jobs. */
	access: async ({ request }) => {
		const { store } = requirePermission({ store: ['update'] });
		const parsed = storeAccessFormSchema.safeParse(formFields(await request.formData()));
		if (!parsed.success) return fail(400, { accessErrors: fieldErrors(parsed.error) });
		await saveStoreAccess(store.id, parsed.data);
		return { accessSaved: true };
	},
	/** Puts the engine's defaults back for the saved settings that are not valid, at the owner's word. */
	restoreDefaults: async () => {
		const { store } = requirePermission({ store: ['update'] });
		const outcome = await inStore(store.id, async (tx) => {
			const checked = await tradeSettings.readChecked(tx);
			if (checked.ok) return 'valid' as const;
			const restored = settingsSchema.safeParse(
				restoreDefaultsWhereInvalid(checked.saved.settings, checked.issues)
			);
			if (!restored.success) return 'still_invalid' as const;
			await tradeSettings.save(tx, { ...checked.saved, settings: restored.data as StoreSettings });
			return 'restored' as const;
		});
		if (outcome === 'still_invalid') {
			return fail(409, { restoreError: 'The settings could not be put right: call for help.' });
		}
		return { defaultsRestored: outcome === 'restored' };
	},
	logo: async ({ request }) => {
		const { store } = requirePermission({ store: ['update'] });
		const file = (await request.formData()).get('logo');
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { logoError: 'Choose a PNG or JPEG file' });
		}
		if (file.size > LOGO_MAX_BYTES) {
			return fail(400, { logoError: 'The logo is over 2 MB: save it smaller and try again' });
		}
		const saved = await saveLogo(store.id, Buffer.from(await file.arrayBuffer()));
		if (!saved.ok) return fail(400, { logoError: saved.message });
		return { logoSaved: true };
	},
	removeLogo: async () => {
		const { store } = requirePermission({ store: ['update'] });
		await removeLogo(store.id);
		return { logoRemoved: true };
	}
};
