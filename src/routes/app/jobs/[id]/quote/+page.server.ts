import { log } from '$lib/server/log';
import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import * as measures from '$lib/server/db/queries/measures';
import * as quotes from '$lib/server/db/queries/quotes';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { parseForm, refuse } from '$lib/server/forms';
import { seesCosts } from '$lib/server/figures';
import { requirePermission } from '$lib/server/guards';
import { requireJob, requireObjects } from '$lib/server/object-access';
import { can } from '$lib/server/permissions';
import { customerLink, mailQuote } from '$lib/server/quote-service';
import { diffLines } from '$lib/quote-diff';
import { quoteView } from '$lib/quote-view';
import { email } from '$lib/schemas/fields';
import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { QUOTE_VERSION, readNumber } from '$lib/input';

const sendSchema = z.object({ quoteId: z.string().min(1), to: email });

export const load: PageServerLoad = async ({ params, url }) => {
	const { store, grants, scope } = requirePermission({ quote: ['read'] });
	const job = await jobs.read(store.id, params.id, scope);
	if (!job) error(404, 'Not found');
	const [versions, measure, customer, trade] = await Promise.all([
		quotes.list(store.id, job.id),
		measures.read(store.id, job.id),
		customers.read(store.id, job.customerId),
		tradeSettings.read(store.id)
	]);
	const asked = url.searchParams.get('v');
	const read = asked ? readNumber(asked, QUOTE_VERSION) : undefined;
	const wanted = read ? (read.ok ? read.value : undefined) : versions[0]?.version;
	const current = wanted ? await quotes.readVersion(store.id, job.id, wanted) : undefined;
	if (asked && !current) error(404, 'Not found');
	const previous =
		current && current.version > 1
			? await quotes.readVersion(store.id, job.id, current.version - 1)
			: undefined;
	const metric = trade.settings.units.system === 'metric';
	return {
		job,
		versions,
		current: current && {
			id: current.id,
			version: current.version,
			status: current.status,
			sentAt: current.sentAt,
			sentTo: current.sentTo,
			validUntil: current.validUntil,
			acceptedAt: current.acceptedAt,
			acceptedName: current.acceptedName,
			changeNote: current.changeNote,
			updatedAt: current.updatedAt,
			view: quoteView(current.result, {
				currency: current.currency,
				metric,
				storeFigures: seesCosts(grants)
			})
		},
		changes: current && previous ? diffLines(previous.result.lines, current.result.lines) : [],
		previousTotalCents: previous?.totalCents ?? null,
		measure: measure && {
			version: measure.version,
			updatedAt: measure.updatedAt,
			updatedByName: measure.updatedByName,
			rooms: measure.draft.rooms.length
		},
		measureChanged: Boolean(
			current?.status === 'draft' && measure && measure.updatedAt > current.updatedAt
		),
		customerEmail: customer?.email ?? '',
		canBuild: can(grants, { quote: ['create'] }),
		canSend: can(grants, { quote: ['send'] }),
		jobOpen: job.status === 'draft' || job.status === 'quoted',
		link: current && current.status !== 'draft' ? customerLink(store.id, job.id) : null
	};
};

export const actions: Actions = {
	build: async ({ params }) => {
		const member = requirePermission({ quote: ['create'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const built = await quotes.build(store.id, params.id, user.id);
		if (!built.ok) {
			if (built.reason === 'invalid') return fail(400, { buildErrors: built.errors });
			if (built.reason === 'not_found') error(404, 'Not found');
			if (built.reason === 'no_measure')
				return fail(400, { buildErrors: [{ path: '', message: 'Measure the rooms first.' }] });
			return fail(409, {
				buildErrors: [
					{ path: '', message: 'This job is past quoting: its quote can no longer change.' }
				]
			});
		}
		redirect(303, `/app/jobs/${params.id}/quote?v=${built.quote.version}`);
	},
	send: async ({ request, params }) => {
		const member = requirePermission({ quote: ['send'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const parsed = await parseForm(request, sendSchema);
		if (!parsed.ok) return parsed.failure;
		await requireObjects(member, 'quote', [parsed.data.quoteId]);
		const trade = await tradeSettings.read(store.id);
		const sent = await quotes.send(store.id, parsed.data.quoteId, {
			to: parsed.data.to,
			validDays: trade.quoteValidDays,
			actorId: user.id
		});
		if (!sent.ok) {
			if (sent.reason === 'not_found') error(404, 'Not found');
			return refuse(
				parsed.form,
				{},
				sent.reason === 'not_draft'
					? 'This version was already sent.'
					: 'This job is past quoting.',
				409
			);
		}
		try {
			await mailQuote(store, sent.quote, parsed.data.to);
		} catch (e) {
			log.error({ err: e, quoteId: sent.quote.id }, 'The quote e-mail failed');
			return fail(502, {
				mailFailed: `The quote is sent and frozen, but the e-mail to ${parsed.data.to} failed. Send the link again.`
			});
		}
		redirect(303, `/app/jobs/${params.id}/quote?v=${sent.quote.version}&sent=1`);
	},
	resend: async ({ request, params }) => {
		const member = requirePermission({ quote: ['send'] });
		await requireJob(member, params.id);
		const { store } = member;
		const parsed = await parseForm(request, sendSchema);
		if (!parsed.ok) return parsed.failure;
		const quote = await quotes.read(store.id, parsed.data.quoteId);
		if (!quote || quote.jobId !== params.id) error(404, 'Not found');
		if (quote.status === 'draft') return refuse(parsed.form, {}, 'Send the quote first.', 409);
		await mailQuote(store, quote, parsed.data.to);
		return { resent: parsed.data.to };
	}
};
