import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth-errors';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { readProfile, saveProfile, saveTimeZone } from '$lib/server/db/queries/stores';
import { fieldErrors, parseForm, refuse, typedValues } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { LOGO_MAX_BYTES, removeLogo, saveLogo } from '$lib/server/logo';
import { storeProfileSchema } from '$lib/schemas/store';
import { saveStoreAccess } from '$lib/server/db/queries/access';
import {
	applyTradeSettings,
	storeAccessFormSchema,
	tradeSettingsFormSchema,
	tradeSettingsToForm
} from '$lib/schemas/store-settings';
import { currencySymbol, formFields, readFields } from '$lib/input';
import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, grants } = requirePermission({ store: ['update'] });
	const [profile, trade] = await Promise.all([readProfile(store.id), tradeSettings.read(store.id)]);
	const schedules = Object.entries(trade.settings.underlayment.schedules).map(([key, s]) => ({
		key,
		...s
	}));
	const stripeAccount = await tradeSettings.stripeAccount(store.id);
	return {
		stripeAccount,
		profile: { ...profile, name: store.name, timeZone: store.timeZone },
		logoVersion: profile.logoKey ? profile.logoKey.replace(/^.*logo-|\..*$/g, '') : null,
		trade: tradeSettingsToForm(trade.settings, trade.quoteValidDays, trade.currency),
		currencySymbol: currencySymbol(trade.currency),
		access: grants.access,
		schedules
	};
};

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
		if (account && !/^acct_[A-Za-z0-9]{6,}$/.test(account)) {
			return fail(400, {
				stripe: { value: account, error: 'A Stripe account id looks like acct_1A2b3C4d5E6f' }
			});
		}
		try {
			await tradeSettings.saveStripeAccount(store.id, account || null);
		} catch (e) {
			if ((e as { cause?: { code?: string } }).cause?.code === '23505') {
				return fail(409, {
					stripe: { value: account, error: 'That Stripe account is connected to another store.' }
				});
			}
			throw e;
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
		await saveProfile(store.id, profile);
		if (timeZone !== store.timeZone) await saveTimeZone(store.id, timeZone);
		return { saved: true };
	},
	/** Taxes, deposit, quote validity, units, waste, fastening schedule, crew output; the rest is kept. */
	trade: async ({ request }) => {
		const { store } = requirePermission({ store: ['update'] });
		const form = await request.formData();
		const current = await tradeSettings.read(store.id);
		const fields = readFields(form);
		if (!fields.ok) return refuseTrade(form, { _form: [fields.message] });
		const schema = tradeSettingsFormSchema(
			Object.keys(current.settings.underlayment.schedules),
			current.currency
		);
		const parsed = schema.safeParse(fields.value);
		if (!parsed.success) return refuseTrade(form, fieldErrors(parsed.error));
		const applied = applyTradeSettings(current.settings, parsed.data);
		if (!applied.ok) return refuseTrade(form, applied.errors);
		await tradeSettings.save(store.id, {
			settings: applied.settings,
			currency: current.currency,
			quoteValidDays: applied.quoteValidDays
		});
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
