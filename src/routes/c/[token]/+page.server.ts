import { log } from '$lib/server/log';
import { linkedJob, openLink } from '$lib/server/customer-page';
import * as changeOrders from '$lib/server/db/queries/change-orders';
import * as completions from '$lib/server/db/queries/completions';
import * as customers from '$lib/server/db/queries/customers';
import * as payments from '$lib/server/db/queries/payments';
import * as quotes from '$lib/server/db/queries/quotes';
import * as tradeSettings from '$lib/server/db/queries/settings';
import * as sites from '$lib/server/db/queries/sites';
import { readProfile } from '$lib/server/db/queries/stores';
import { inStore, readInStore, type StoreTx } from '$lib/server/db/tenant';
import { parseForm } from '$lib/server/forms';
import { startCheckout, type CheckoutPurpose } from '$lib/server/payments/checkout';
import { syncSession } from '$lib/server/payments/sync';
import { acceptQuote, requestChanges } from '$lib/server/quotes/answer';
import {
	approveChangeOrder,
	customerDeclinesChangeOrder,
	type CustomerDecision
} from '$lib/server/change-orders/answer';
import { customerChangeOrder, photoLines, roomNamesOf } from '$lib/server/change-orders/view';
import { signOff, type SignOffResult } from '$lib/server/sign-off/sign-off';
import {
	customerApproveSchema,
	customerDeclineSchema,
	payChangeOrderSchema,
	signOffSchema
} from '$lib/schemas/change-order';
import { jobLabel, payableNow } from '$lib/jobs/status';
import { customerQuote } from '$lib/papers/customer-quote';
import { papersOf } from '$lib/papers/store-papers';
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
			account: await tradeSettings.stripeAccount(tx),
			...(await changeOrdersAndCompletion(tx, job))
		};
	});
	const { store, job, profile, quote, customer, site, money, account } = found;
	const due = payableNow(job.status);
	const balanceNow = due === 'balance';
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
		changeOrders: found.changeOrders.map((co) => {
			const paid = money.payments.some(
				(p) => p.changeOrderId === co.id && (p.status === 'succeeded' || p.status === 'refunded')
			);
			return {
				...co,
				paid,
				// Once the job is finished its balance takes in every approved change order.
				payable:
					co.status === 'approved' &&
					co.totalCents > 0 &&
					!paid &&
					!balanceNow &&
					money.ledger.balanceDueCents >= co.totalCents
			};
		}),
		changePhotos: found.changePhotos,
		completion: found.completion,
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
			// The customer's papers: what a homeowner reads, never the installer's notes or readings.
			paper: customerQuote(quote, {
				currency: quote.currency,
				// The units the quote was built in, as stored with it.
				metric: quote.input.settings.units.system === 'metric',
				papers: papersOf({
					nextSteps: profile.papersNextSteps,
					cancellation: profile.papersCancellation,
					terms: profile.papersTerms
				})
			})
		}
	};
};

/**
 * What the customer sees of the installer's half: the change orders the store sent them (never
 * the installer's pay), the report's photos when there is one to show, and the completion with
 * its photos, notes and sign-off once the job is finished.
 */
async function changeOrdersAndCompletion(tx: StoreTx, job: { id: string; status: string }) {
	const sent = await changeOrders.listSent(tx, job.id);
	const accepted = sent.length ? await quotes.accepted(tx, job.id) : undefined;
	const rooms = accepted ? roomNamesOf(accepted) : new Map<string, string>();
	const changePhotos = sent.length
		? photoLines(
				await changeOrders.reportPhotos(tx, job.id),
				await changeOrders.liveFoundItems(tx, sent[0].reportId)
			)
		: [];
	const done = job.status === 'completed' || job.status === 'closed';
	const completion = done ? await completions.read(tx, job.id) : undefined;
	return {
		changeOrders: sent.map((row) => customerChangeOrder(row, rooms)),
		changePhotos,
		completion: completion
			? {
					completedAt: completion.completedAt,
					notes: completion.walkthroughNotes,
					signedAt: completion.signedAt,
					signedName: completion.signedName,
					photos: (await changeOrders.completionPhotos(tx, job.id)).map((p) => ({
						id: p.id,
						caption: p.caption
					}))
				}
			: null
	};
}

const CHANGE_REFUSED: Record<Exclude<CustomerDecision, { ok: true }>['reason'], string> = {
	not_found: 'This change order is not one this link is for.',
	not_open: 'This change order was already answered, so it cannot be answered again.'
};

const SIGN_OFF_REFUSED: Record<Exclude<SignOffResult, { ok: true }>['reason'], string> = {
	not_found: 'This link is not valid.',
	not_completed: 'The work is not marked finished yet, so there is nothing to sign off.',
	already_signed: 'The work was already signed off.'
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

/** What is kept of a customer's typed-name answer (quote, change order, sign-off), as for a quote. */
function signatureOf(name: string, request: Request, ip: string) {
	return { name, ip, userAgent: request.headers.get('user-agent') };
}

export const actions: Actions = {
	pay: async ({ params, request }) => {
		const link = openLink(params.token);
		// A link the store has withdrawn pays nothing (410, as its page says).
		await readInStore(link.storeId, (tx) => linkedJob(tx, link));
		const form = await request.formData();
		const asked = form.get('purpose');
		let what: CheckoutPurpose;
		if (asked === 'change_order') {
			const parsed = payChangeOrderSchema.safeParse({ changeOrderId: form.get('changeOrderId') });
			if (!parsed.success) return fail(400, { payError: 'Choose the change order to pay.' });
			what = { purpose: 'change_order', changeOrderId: parsed.data.changeOrderId };
		} else {
			what = { purpose: asked === 'balance' ? 'balance' : 'deposit' };
		}
		const started = await startCheckout({
			storeId: link.storeId,
			jobId: link.jobId,
			linkToken: params.token,
			...what
		});
		if (!started.ok && started.reason === 'not_found') error(404, CHECKOUT_REFUSED.not_found);
		if (!started.ok)
			return fail(started.reason === 'stripe' ? 502 : 409, {
				payError: CHECKOUT_REFUSED[started.reason]
			});
		redirect(303, started.url);
	},
	approveChange: async ({ params, request, getClientAddress }) => {
		const link = openLink(params.token);
		const parsed = await parseForm(request, customerApproveSchema);
		if (!parsed.ok) return parsed.failure;
		const signature = signatureOf(parsed.data.name, request, getClientAddress());
		const answer = await inStore(link.storeId, async (tx) => {
			const { job } = await linkedJob(tx, link);
			return approveChangeOrder(tx, job.id, parsed.data.changeOrderId, signature);
		});
		if (!answer.ok) return fail(409, { changeMessage: CHANGE_REFUSED[answer.reason] });
		return { changeApproved: true };
	},
	declineChange: async ({ params, request, getClientAddress }) => {
		const link = openLink(params.token);
		const parsed = await parseForm(request, customerDeclineSchema);
		if (!parsed.ok) return parsed.failure;
		const answer = await inStore(link.storeId, async (tx) => {
			const { job } = await linkedJob(tx, link);
			return customerDeclinesChangeOrder(tx, job.id, parsed.data.changeOrderId, {
				reason: parsed.data.reason ?? '',
				ip: getClientAddress(),
				userAgent: request.headers.get('user-agent')
			});
		});
		if (!answer.ok) return fail(409, { changeMessage: CHANGE_REFUSED[answer.reason] });
		return { changeDeclined: true };
	},
	signOff: async ({ params, request, getClientAddress }) => {
		const link = openLink(params.token);
		const parsed = await parseForm(request, signOffSchema);
		if (!parsed.ok) return parsed.failure;
		const signature = signatureOf(parsed.data.name, request, getClientAddress());
		const answer = await inStore(link.storeId, async (tx) => {
			const { job } = await linkedJob(tx, link);
			return signOff(tx, job.id, signature);
		});
		if (!answer.ok) return fail(409, { signOffMessage: SIGN_OFF_REFUSED[answer.reason] });
		return { signedOff: true };
	},
	accept: async ({ params, request, getClientAddress }) => {
		const link = openLink(params.token);
		const parsed = await parseForm(request, acceptSchema);
		if (!parsed.ok) return parsed.failure;
		const signature = signatureOf(parsed.data.name, request, getClientAddress());
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
