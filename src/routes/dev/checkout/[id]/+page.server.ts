import { config } from '$lib/server/config';
import { parseForm, refuse } from '$lib/server/forms';
import { safeRedirect } from '$lib/redirect';
import { testCheckoutSchema } from '$lib/schemas/test-payments';
import { CHECKOUT_CARDS } from '$mocks/stripe';
import { error, redirect } from '@sveltejs/kit';
import { requireStripeFake } from '../../stripe/fake.server';
import type { Actions, PageServerLoad } from './$types';

// The fake's hosted payment page, standing in for Stripe Checkout while no Stripe key is set.
// The payer is not a member of any store, so there is no member guard; the session id in the
// address is the only key, as with Stripe's own checkout links.

/** A session's own return address, only when it is a path of this site (else none). */
const ownPath = (url: string | null) => (url ? safeRedirect(url, '', config.origin) || null : null);

export const load: PageServerLoad = async ({ params }) => {
	const view = requireStripeFake().checkout(params.id);
	if (!view) error(404, 'Not found');
	return {
		session: { ...view, successUrl: ownPath(view.successUrl), cancelUrl: ownPath(view.cancelUrl) },
		cards: CHECKOUT_CARDS
	};
};

export const actions: Actions = {
	pay: async ({ params, request }) => {
		const fake = requireStripeFake();
		const view = fake.checkout(params.id);
		if (!view) error(404, 'Not found');
		const parsed = await parseForm(request, testCheckoutSchema);
		if (!parsed.ok) return parsed.failure;
		const email = parsed.data.email ?? view.email;
		if (!email) {
			return refuse(parsed.form, { email: ['Enter the e-mail address for the receipt'] });
		}
		const result = await fake.pay(params.id, parsed.data.card, { email, name: parsed.data.name });
		if (result.outcome === 'paid') {
			redirect(
				303,
				ownPath(fake.checkout(params.id)?.successUrl ?? null) ?? `/dev/checkout/${params.id}`
			);
		}
		if (result.outcome === 'declined') {
			return refuse(parsed.form, {}, result.error.message ?? 'Your card was declined.', 402);
		}
		// A second tab, or a page left open past its time: nothing was charged.
		return refuse(
			parsed.form,
			{},
			result.outcome === 'already_paid'
				? 'This payment was already made; nothing more was charged.'
				: 'This payment page has expired; nothing was charged.',
			409
		);
	}
};
