import { resolveLink } from '$lib/server/customer-page';
import * as customers from '$lib/server/db/queries/customers';
import * as quotes from '$lib/server/db/queries/quotes';
import * as tradeSettings from '$lib/server/db/queries/settings';
import * as sites from '$lib/server/db/queries/sites';
import { readProfile } from '$lib/server/db/queries/stores';
import { db } from '$lib/server/db';
import { user } from '$lib/server/db/schema';
import { config } from '$lib/server/config';
import { parseForm } from '$lib/server/forms';
import { mailer } from '$lib/server/mail';
import { customerAnswerMail } from '$lib/server/mail/templates';
import { jobLabel } from '$lib/jobs/status';
import { quoteView } from '$lib/quote-view';
import { requiredText } from '$lib/schemas/fields';
import { fail } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
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

export const load: PageServerLoad = async ({ params, setHeaders }) => {
	setHeaders({ 'cache-control': 'private, no-store', 'referrer-policy': 'no-referrer' });
	const { store, job } = await resolveLink(params.token);
	const [profile, quote, customer, site, trade] = await Promise.all([
		readProfile(store.id),
		quotes.forCustomer(store.id, job.id),
		customers.read(store.id, job.customerId),
		job.siteId ? sites.read(store.id, job.siteId) : Promise.resolve(undefined),
		tradeSettings.read(store.id)
	]);
	return {
		store: {
			name: store.name,
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
	if (!job.salespersonId) return;
	const [seller] = await db
		.select({ email: user.email })
		.from(user)
		.where(eq(user.id, job.salespersonId));
	if (!seller) return;
	try {
		await mailer(
			customerAnswerMail({
				to: seller.email,
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
		console.error(`Could not tell the salesperson of ${job.id}`, e);
	}
}

const REFUSED = {
	not_found: 'This quote is not the one this link is for.',
	not_open:
		'This version of the quote can no longer be answered: the store has a newer one, or it was already answered.',
	expired: 'This quote has expired. Ask the store for an up-to-date one.'
} as const;

export const actions: Actions = {
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
