import * as customers from '$lib/server/db/queries/customers';
import * as jobs from '$lib/server/db/queries/jobs';
import * as measures from '$lib/server/db/queries/measures';
import * as quotes from '$lib/server/db/queries/quotes';
import * as tradeSettings from '$lib/server/db/queries/settings';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { customerLink } from '$lib/server/customer-page';
import { parseForm, refuse } from '$lib/server/forms';
import { seesCosts } from '$lib/server/figures';
import { SETTINGS_NOT_VALID } from '$lib/server/store-settings';
import { requirePermission } from '$lib/server/guards';
import { requireJob, requireObjects } from '$lib/server/object-access';
import { can } from '$lib/server/permissions';
import { buildQuote } from '$lib/server/quotes/build';
import { resendQuoteLink, sendQuote } from '$lib/server/quotes/send';
import { canQuote } from '$lib/jobs/status';
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
	const asked = url.searchParams.get('v');
	const found = await readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		if (!job) error(404, 'Not found');
		const versions = await quotes.list(tx, job.id);
		const read = asked ? readNumber(asked, QUOTE_VERSION) : undefined;
		const wanted = read ? (read.ok ? read.value : undefined) : versions[0]?.version;
		const current = wanted ? await quotes.readVersion(tx, job.id, wanted) : undefined;
		if (asked && !current) error(404, 'Not found');
		const previous =
			current && current.version > 1
				? await quotes.readVersion(tx, job.id, current.version - 1)
				: undefined;
		return {
			job,
			versions,
			current,
			previous,
			measure: await measures.read(tx, job.id),
			customer: await customers.read(tx, job.customerId),
			link: await customerLink(tx, job.id)
		};
	});
	const { job, versions, current, previous, measure, customer, link } = found;
	// Each version shows in the units it was built in, as stored with it.
	const metric = current?.input.settings.units.system === 'metric';
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
		jobOpen: canQuote(job.status),
		link: current && current.status !== 'draft' ? link : null
	};
};

export const actions: Actions = {
	build: async ({ params }) => {
		const member = requirePermission({ quote: ['create'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const built = await inStore(store.id, (tx) => buildQuote(tx, params.id, user.id));
		if (!built.ok) {
			if (built.reason === 'invalid') return fail(400, { buildErrors: built.errors });
			if (built.reason === 'not_found') error(404, 'Not found');
			if (built.reason === 'no_measure')
				return fail(400, { buildErrors: [{ path: '', message: 'Measure the rooms first.' }] });
			if (built.reason === 'settings')
				return fail(409, { buildErrors: [{ path: '', message: SETTINGS_NOT_VALID }] });
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
		const { quoteId, to } = parsed.data;
		const sent = await inStore(store.id, async (tx) => {
			const { quoteValidDays } = await tradeSettings.termsOf(tx);
			return sendQuote(tx, quoteId, { to, validDays: quoteValidDays, actorId: user.id });
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
		redirect(303, `/app/jobs/${params.id}/quote?v=${sent.quote.version}&sent=1`);
	},
	/**
	 * Withdraws the customer's link: every link made so far (e-mailed, copied) stops working and
	 * says so; the page then shows the new one, which "E-mail it again" sends.
	 */
	revokeLink: async ({ params }) => {
		const member = requirePermission({ quote: ['send'] });
		await requireJob(member, params.id);
		const version = await inStore(member.store.id, (tx) => jobs.raiseLinkVersion(tx, params.id));
		if (version === undefined) error(404, 'Not found');
		return { linkRevoked: true };
	},
	resend: async ({ request, params }) => {
		const member = requirePermission({ quote: ['send'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const parsed = await parseForm(request, sendSchema);
		if (!parsed.ok) return parsed.failure;
		const { quoteId, to } = parsed.data;
		const queued = await inStore(store.id, (tx) =>
			resendQuoteLink(tx, params.id, quoteId, to, user.id)
		);
		if (queued === 'not_found') error(404, 'Not found');
		if (queued === 'draft') return refuse(parsed.form, {}, 'Send the quote first.', 409);
		return { resent: to };
	}
};
