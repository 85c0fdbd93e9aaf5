import { log } from '$lib/server/log';
import { resolveLink } from '$lib/server/customer-page';
import * as payments from '$lib/server/db/queries/payments';
import { stripeAccount } from '$lib/server/db/queries/settings';
import { startCheckout, syncSession } from '$lib/server/payments';
import * as customers from '$lib/server/db/queries/customers';
import * as quotes from '$lib/server/db/queries/quotes';
import * as tradeSettings from '$lib/server/db/queries/settings';
import * as sites from '$lib/server/db/queries/sites';
import { emailOf, readProfile } from '$lib/server/db/queries/stores';
import { config } from '$lib/server/config';
import { parseForm } from '$lib/server/forms';
import { mailer } from '$lib/server/mail';
import { customerAnswerMail } from '$lib/server/mail/templates';
import { jobLabel } from '$lib/jobs/status';
import { quoteView } from '$lib/quote-view';
import { requiredText } from '$lib/schemas/fields';
import { fail, redirect } from '@sveltejs/kit';
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
	const { store, job } = await resolveLink(params.token);
	// Back from the checkout: read the payment's state from Stripe now rather than wait for the
	// webhook, which may come later (or, if the app was down, never).
	const paid = url.searchParams.get('paid');
	if (paid && /^cs_[\w]+$/.test(paid)) {
		try {
			await syncSession(store.id, paid);
		} catch (e) {
			log.error({ err: e, jobId: job.id }, 'Could not read the checkout back from Stripe');
		}
	}
	const [profile, quote, customer, site, trade, money, account] = await Promise.all([
		readProfile(store.id),
		quotes.forCustomer(store.id, job.id),
		customers.read(store.id, job.customerId),
		job.siteId ? sites.read(store.id, job.siteId) : Promise.resolve(undefined),
		tradeSettings.read(store.id),
		payments.moneyFor(store.id, job.id),
		stripeAccount(store.id)
	]);
	const lastCard = [...money.payments].reverse().find((p) => p.method === 'card');
	return {
		money: {
			currency: money.currency,
			depositDueCents: money.ledger.depositDueCents,
			balanceDueCents: money.ledger.balanceDueCents,
			netPaidCents: money.ledger.netPaidCents,
			canPayByCard: Boolean(account),
			payable:
				job.status === 'accepted' && money.ledger.depositDueCents > 0
					? ('deposit' as const)
					: job.status === 'completed' && money.ledger.balanceDueCents > 0
						? ('balance' as const)
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
				metric: trade.settings.units.system === 'metric'
			})
		}
	};
};

/** Tells the job's salesperson; a failed notice never undoes what the customer did. */
async function tellSalesperson(
	storeName: string,
	job: Awaited<ReturnType<typeof resolveLink>>['job'],
	answer: 'accepted' | 'changes',
	note?: string
) {
	const seller = await emailOf(job.salespersonId);
	if (!seller) return;
	try {
		await mailer(
			customerAnswerMail({
				to: seller,
				storeName,
				customerName: job.customerName,
				jobLabel: jobLabel(job.number),
				jobTitle: job.title,
				answer,
				note,
				url: `${config.origin}/app/jobs/${job.id}/quote`
			})
		);
	} catch (e) {
		log.error({ err: e, jobId: job.id }, 'Could not tell the salesperson');
	}
}

const REFUSED = {
	not_found: 'This quote is not the one this link is for.',
	not_open:
		'This version of the quote can no longer be answered: the store has a newer one, or it was already answered.',
	expired: 'This quote has expired. Ask the store for an up-to-date one.'
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
		const { store, job } = await resolveLink(params.token);
		const form = await request.formData();
		const purpose = form.get('purpose') === 'balance' ? 'balance' : 'deposit';
		const started = await startCheckout({
			storeId: store.id,
			jobId: job.id,
			purpose,
			linkToken: params.token
		});
		if (!started.ok)
			return fail(started.reason === 'stripe' ? 502 : 409, {
				payError: CHECKOUT_REFUSED[started.reason]
			});
		redirect(303, started.url);
	},
	accept: async ({ params, request, getClientAddress }) => {
		const { store, job } = await resolveLink(params.token);
		const parsed = await parseForm(request, acceptSchema);
		if (!parsed.ok) return parsed.failure;
		const answer = await quotes.accept(store.id, job.id, parsed.data.quoteId, {
			name: parsed.data.name,
			ip: getClientAddress(),
			userAgent: request.headers.get('user-agent')
		});
		if (!answer.ok) return fail(409, { message: REFUSED[answer.reason] });
		await tellSalesperson(store.name, job, 'accepted');
		return { accepted: true };
	},
	changes: async ({ params, request }) => {
		const { store, job } = await resolveLink(params.token);
		const parsed = await parseForm(request, changesSchema);
		if (!parsed.ok) return parsed.failure;
		const answer = await quotes.requestChanges(
			store.id,
			job.id,
			parsed.data.quoteId,
			parsed.data.note
		);
		if (!answer.ok) return fail(409, { message: REFUSED[answer.reason] });
		await tellSalesperson(store.name, job, 'changes', parsed.data.note);
		return { changesSent: true };
	}
};
