import { log } from '$lib/server/log';
import { linkedJob, openLink } from '$lib/server/customer-page';
import * as customers from '$lib/server/db/queries/customers';
import * as payments from '$lib/server/db/queries/payments';
import * as quotes from '$lib/server/db/queries/quotes';
import * as tradeSettings from '$lib/server/db/queries/settings';
import * as sites from '$lib/server/db/queries/sites';
import { readProfile } from '$lib/server/db/queries/stores';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { parseForm } from '$lib/server/forms';
import { startCheckout } from '$lib/server/payments/checkout';
import { syncSession } from '$lib/server/payments/sync';
import { acceptQuote, requestChanges } from '$lib/server/quotes/answer';
import { jobLabel, payableNow } from '$lib/jobs/status';
import { quoteView } from '$lib/quote-view';
import { requiredText } from '$lib/schemas/fields';
import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

const acceptSchema = z.object({
	quoteId: z.string().min(1),
	name: requiredText('Type your full name to accept', 100).refine(
		(v) => v.length >= 2,
		'Type your full name to accept'
	)
});
const changesSchema = z.object({
	quoteId: z.string().min(1),
	note: requiredText('Tell the store what to change', 2000)
});

export const load: PageServerLoad = async ({ params, setHeaders, url }) => {
	// same-origin: the link's token never goes to another site in a Referer, while this page's own
	// form posts still carry their Origin (no-referrer would send Origin: null, refused as cross-site).
	setHeaders({ 'cache-control': 'private, no-store', 'referrer-policy': 'same-origin' });
	const link = openLink(params.token);
	// Back from the checkout: read the payment's state from Stripe now rather than wait for the
	// webhook, which may come later (or, if the app was down, never).
	const paid = url.searchParams.get('paid');
	if (paid && /^cs_[\w]+$/.test(paid)) {
		try {
			await syncSession(link.storeId, paid);
		} catch (e) {
			log.error({ err: e, jobId: link.jobId }, 'Could not read the checkout back from Stripe');
		}
	}
	const found = await readInStore(link.storeId, async (tx) => {
		const { store, job } = await linkedJob(tx, link);
		return {
			store,
			job,
			profile: await readProfile(tx),
			quote: await quotes.forCustomer(tx, job.id),
			customer: await customers.read(tx, job.customerId),
			site: job.siteId ? await sites.read(tx, job.siteId) : undefined,
			money: await payments.moneyFor(tx, job.id),
			account: await tradeSettings.stripeAccount(tx)
		};
	});
	const { store, job, profile, quote, customer, site, money, account } = found;
	const due = payableNow(job.status);
	const lastCard = [...money.payments].reverse().find((p) => p.method === 'card');
	return {
		money: {
			currency: money.currency,
			depositDueCents: money.ledger.depositDueCents,
			balanceDueCents: money.ledger.balanceDueCents,
			netPaidCents: money.ledger.netPaidCents,
			creditsCents: money.ledger.creditsCents,
			canPayByCard: Boolean(account),
			payable:
				(due === 'deposit' && money.ledger.depositDueCents > 0) ||
				(due === 'balance' && money.ledger.balanceDueCents > 0)
					? due
					: null,
			paid: money.payments
				.filter((p) => p.status === 'succeeded' || p.status === 'refunded')
				.map((p) => ({
					id: p.id,
					purpose: p.purpose,
					amountCents: p.amountCents,
					refundedCents: p.refundedCents,
					at: p.succeededAt
				})),
			declined: lastCard?.status === 'pending' ? lastCard.failureMessage : null,
			justPaid: Boolean(
				paid &&
				money.payments.some((p) => p.stripeCheckoutSessionId === paid && p.status !== 'pending')
			),
			confirming: Boolean(
				paid &&
				money.payments.some((p) => p.stripeCheckoutSessionId === paid && p.status === 'pending')
			),
			cancelled: url.searchParams.has('cancelled')
		},
		store: {
			name: store.name,
			timeZone: store.timeZone,
			address: profile.address,
			town: profile.town,
			phone: profile.phone,
			email: profile.email,
			hasLogo: Boolean(profile.logoKey)
		},
		job: { label: jobLabel(job.number), title: job.title, status: job.status },
		customerName: customer?.name ?? job.customerName,
		site: site ? { address: site.address, town: site.town } : null,
		quote: quote && {
			id: quote.id,
			version: quote.version,
			status: quote.status,
			validUntil: quote.validUntil,
			expired: Boolean(quote.validUntil && quote.validUntil < new Date()),
			acceptedAt: quote.acceptedAt,
			acceptedName: quote.acceptedName,
			changeNote: quote.changeNote,
			view: quoteView(quote.result, {
				currency: quote.currency,
				// The units the quote was built in, as stored with it.
				metric: quote.input.settings.units.system === 'metric'
			})
		}
	};
};

const REFUSED = {
	not_found: 'This quote is not the one this link is for.',
	not_open:
		'This version of the quote can no longer be answered: the store has a newer one, or it was already answered.',
	expired: 'This quote has expired. Ask the store for an up-to-date one.',
	withdrawn: 'The store withdrew this quote, so it can no longer be accepted or changed.'
} as const;

const CHECKOUT_REFUSED = {
	no_account: 'This store does not take card payments online. Call the store to pay.',
	nothing_due: 'Nothing is due right now.',
	not_payable: 'There is nothing to pay yet.',
	not_found: 'This link is not valid.',
	stripe: 'The card payment page could not be opened. Try again in a minute.'
} as const;

export const actions: Actions = {
	pay: async ({ params, request }) => {
		const link = openLink(params.token);
		// A link the store has withdrawn pays nothing (410, as its page says).
		await readInStore(link.storeId, (tx) => linkedJob(tx, link));
		const form = await request.formData();
		const purpose = form.get('purpose') === 'balance' ? 'balance' : 'deposit';
		const started = await startCheckout({
			storeId: link.storeId,
			jobId: link.jobId,
			purpose,
			linkToken: params.token
		});
		if (!started.ok && started.reason === 'not_found') error(404, CHECKOUT_REFUSED.not_found);
		if (!started.ok)
			return fail(started.reason === 'stripe' ? 502 : 409, {
				payError: CHECKOUT_REFUSED[started.reason]
			});
		redirect(303, started.url);
	},
	accept: async ({ params, request, getClientAddress }) => {
		const link = openLink(params.token);
		const parsed = await parseForm(request, acceptSchema);
		if (!parsed.ok) return parsed.failure;
		const signature = {
			name: parsed.data.name,
			ip: getClientAddress(),
			userAgent: request.headers.get('user-agent')
		};
		const answer = await inStore(link.storeId, async (tx) => {
			const { job } = await linkedJob(tx, link);
			return acceptQuote(tx, job.id, parsed.data.quoteId, signature);
		});
		if (!answer.ok) return fail(409, { message: REFUSED[answer.reason] });
		return { accepted: true };
	},
	changes: async ({ params, request }) => {
		const link = openLink(params.token);
		const parsed = await parseForm(request, changesSchema);
		if (!parsed.ok) return parsed.failure;
		const { quoteId, note } = parsed.data;
		const answer = await inStore(link.storeId, async (tx) => {
			const { job } = await linkedJob(tx, link);
			return requestChanges(tx, job.id, quoteId, note);
		});
		if (!answer.ok) return fail(409, { message: REFUSED[answer.reason] });
		return { changesSent: true };
	}
};
