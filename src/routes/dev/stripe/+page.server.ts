import { parseForm, refuse } from '$lib/server/forms';
import { config } from '$lib/server/config';
import { stripe } from '$lib/server/stripe';
import { testPaymentFormSchema } from '$lib/schemas/test-payments';
import { readMoney } from '$lib/input';
import { formatAmount, MAXIMUM_AMOUNT } from '$mocks/stripe';
import { fail, redirect } from '@sveltejs/kit';
import { requireStripeFake } from './fake.server';
import type { Actions, PageServerLoad } from './$types';

// The Stripe fake's desk for testers (only while no Stripe key is set, like /dev/outbox): test
// payments, the events and their deliveries to /api/webhooks/stripe, and payouts.

const LATE_BY = 6 * 60;

export const load: PageServerLoad = async ({ url }) => {
	const fake = requireStripeFake();
	const state = fake.store.state;
	const sessions = fake.store
		.newestFirst('checkoutSessions')
		.slice(0, 20)
		.map((s) => fake.checkout(s.id)!);
	const events = fake
		.events()
		.slice(0, 40)
		.map((e) => {
			const last = fake.deliveries({ event: e.id })[0] ?? null;
			return {
				id: e.id,
				type: e.type,
				created: e.created,
				object: (e.data.object as { id: string }).id,
				last: last && { status: last.status, ok: last.ok, kind: last.kind, error: last.error }
			};
		});
	const balance = await stripe.balance.retrieve();
	const paid = url.searchParams.get('paid');
	return {
		paid: paid && state.checkoutSessions[paid]?.payment_status === 'paid' ? paid : null,
		sessions,
		events,
		mode: fake.deliveryMode(),
		endpoint: fake.options.webhookUrl,
		balance: balance.available.map((b) => formatAmount(b.amount, b.currency)),
		payouts: fake.store
			.newestFirst('payouts')
			.slice(0, 10)
			.map((p) => ({
				id: p.id,
				amount: formatAmount(p.amount, p.currency),
				transactions: Object.values(state.paidOutBy).filter((id) => id === p.id).length
			}))
	};
};

const eventOf = async (request: Request) => {
	const fake = requireStripeFake();
	const id = String((await request.formData()).get('event') ?? '');
	if (!fake.events().some((e) => e.id === id)) return { fake, id: null };
	return { fake, id };
};

export const actions: Actions = {
	start: async ({ request }) => {
		requireStripeFake();
		const parsed = await parseForm(request, testPaymentFormSchema);
		if (!parsed.ok) return parsed.failure;
		const { currency, name } = parsed.data;
		// Typed in the currency's main unit, with its own decimals (none for yen).
		const read = readMoney(parsed.data.amount, currency.toUpperCase(), {
			label: 'the amount',
			min: 1,
			max: MAXIMUM_AMOUNT
		});
		if (!read.ok) return refuse(parsed.form, { amount: [read.message] });
		const amount = read.value;
		let url: string | null;
		try {
			const session = await stripe.checkout.sessions.create({
				mode: 'payment',
				line_items: [
					{ price_data: { currency, unit_amount: amount, product_data: { name } }, quantity: 1 }
				],
				success_url: `${config.origin}/dev/stripe?paid={CHECKOUT_SESSION_ID}`,
				cancel_url: `${config.origin}/dev/stripe`,
				metadata: { store_name: 'Test store' }
			});
			url = session.url;
		} catch (e) {
			return refuse(parsed.form, { amount: [(e as Error).message] });
		}
		redirect(303, url ?? '/dev/stripe');
	},
	redeliver: async ({ request }) => {
		const { fake, id } = await eventOf(request);
		if (!id) return fail(404, { message: 'No such event' });
		await fake.redeliver(id);
		return { done: `Delivered ${id} again` };
	},
	late: async ({ request }) => {
		const { fake, id } = await eventOf(request);
		if (!id) return fail(404, { message: 'No such event' });
		await fake.deliver([id], { lateBy: LATE_BY });
		return { done: `Delivered ${id} signed six minutes ago` };
	},
	badSignature: async ({ request }) => {
		const { fake, id } = await eventOf(request);
		if (!id) return fail(404, { message: 'No such event' });
		await fake.deliver([id], { badSignature: true });
		return { done: `Delivered ${id} with a wrong signature` };
	},
	payout: async () => {
		const payouts = await requireStripeFake().payout();
		return {
			done: payouts.length
				? `Paid out ${payouts.map((p) => formatAmount(p.amount, p.currency)).join(', ')}`
				: 'Nothing to pay out'
		};
	},
	mode: async ({ request }) => {
		const fake = requireStripeFake();
		const mode = (await request.formData()).get('mode') === 'hold' ? 'hold' : 'auto';
		fake.setDeliveryMode(mode);
		return { done: mode === 'hold' ? 'New events are held' : 'New events are delivered' };
	}
};
