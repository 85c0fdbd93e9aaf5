import * as jobs from '$lib/server/db/queries/jobs';
import * as payments from '$lib/server/db/queries/payments';
import * as quotes from '$lib/server/db/queries/quotes';
import { parseForm } from '$lib/server/forms';
import { measureSummary } from '$lib/server/measure-summary';
import { visibleLedger } from '$lib/server/figures';
import { requirePermission } from '$lib/server/guards';
import { requireJob } from '$lib/server/object-access';
import { can } from '$lib/server/permissions';
import { nextStatuses, JOB_STATUS_LABELS } from '$lib/jobs/status';
import { jobAssignSchema, jobMoveSchema, jobUpdateSchema } from '$lib/schemas/job';
import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { loadJobSite, siteAction } from './site.server';

export const load: PageServerLoad = async ({ params }) => {
	const { store, grants, scope } = requirePermission({ job: ['read'] });
	const job = await jobs.read(store.id, params.id, scope);
	if (!job) error(404, 'Not found');
	const canSchedule = can(grants, { job: ['schedule'] });
	const canAssign = can(grants, { job: ['assign'] });
	const [history, installers, quoteVersions, money] = await Promise.all([
		jobs.events(store.id, job.id),
		canAssign ? jobs.listInstallers(store.id) : Promise.resolve([]),
		can(grants, { quote: ['read'] }) ? quotes.list(store.id, job.id) : Promise.resolve([]),
		can(grants, { payment: ['read'] }) ? payments.moneyFor(store.id, job.id) : Promise.resolve(null)
	]);
	const measure = await measureSummary(store.id, job.id);
	return {
		job,
		history,
		installers,
		latestQuote: quoteVersions[0] ?? null,
		money: money && {
			currency: money.currency,
			ledger: visibleLedger(grants, money.ledger),
			count: money.payments.length
		},
		moves: canSchedule ? nextStatuses(job.status) : [],
		canAssign,
		site: await loadJobSite(store.id, job, grants),
		measure,
		canEdit: can(grants, { job: ['update'] }),
		canDelete:
			can(grants, { job: ['delete'] }) && (job.status === 'draft' || job.status === 'cancelled')
	};
};

export const actions: Actions = {
	site: siteAction,
	save: async ({ request, params }) => {
		const member = requirePermission({ job: ['update'] });
		await requireJob(member, params.id);
		const { store } = member;
		const parsed = await parseForm(request, jobUpdateSchema);
		if (!parsed.ok) return parsed.failure;
		const row = await jobs.update(store.id, params.id, parsed.data);
		if (!row) error(404, 'Not found');
		return { saved: true };
	},
	move: async ({ request, params }) => {
		const member = requirePermission({ job: ['schedule'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const parsed = await parseForm(request, jobMoveSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await jobs.move(store.id, params.id, parsed.data.to, user.id, parsed.data.note);
		if (!result.ok && result.reason === 'not_found') error(404, 'Not found');
		if (!result.ok && result.reason === 'not_allowed') {
			return fail(409, {
				moveError: `A ${JOB_STATUS_LABELS[result.from].toLowerCase()} job cannot become ${JOB_STATUS_LABELS[parsed.data.to].toLowerCase()}. The page shows the moves it allows.`
			});
		}
		return { moved: true };
	},
	assign: async ({ request, params }) => {
		const member = requirePermission({ job: ['assign'] });
		await requireJob(member, params.id);
		const { store, user } = member;
		const parsed = await parseForm(request, jobAssignSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await jobs.assign(store.id, params.id, parsed.data.installerId, user.id);
		if (result === 'not_found') error(404, 'Not found');
		if (result === 'not_an_installer') {
			return fail(400, { assignError: 'Choose one of the store’s installers.' });
		}
		return { assigned: true };
	},
	delete: async ({ params }) => {
		const member = requirePermission({ job: ['delete'] });
		await requireJob(member, params.id);
		const { store } = member;
		const result = await jobs.remove(store.id, params.id);
		if (result === 'not_found') error(404, 'Not found');
		if (result === 'not_draft') {
			return fail(409, {
				deleteError:
					'Only draft or cancelled jobs that never had a quote sent can be deleted; others keep their history.'
			});
		}
		redirect(303, '/app/jobs');
	}
};
