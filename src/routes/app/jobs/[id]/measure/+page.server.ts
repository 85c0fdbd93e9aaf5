import * as jobs from '$lib/server/db/queries/jobs';
import * as measures from '$lib/server/db/queries/measures';
import * as priceBook from '$lib/server/db/queries/price-book';
import * as sites from '$lib/server/db/queries/sites';
import { visiblePriceBook } from '$lib/server/figures';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { tradeSettingsFor } from '$lib/server/store-settings';
import { requirePermission } from '$lib/server/guards';
import { readJsonText, readNumber } from '$lib/input';
import { requireJob } from '$lib/server/object-access';
import { emptyMeasure, measureDraftSchema, type MeasureDraft } from '$lib/measure/draft';
import { sameDraft } from '$lib/measure/local';
import { mergeMeasures, type Side } from '$lib/measure/merge';
import { applyFields, applyOp, fieldId } from '$lib/measure/ops';
import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const { store, user, grants, scope } = requirePermission({ job: ['update'] });
	const { job, stored, trade, items, site } = await readInStore(store.id, async (tx) => {
		const job = await jobs.readForViewer(tx, params.id, scope);
		if (!job) error(404, 'Not found');
		return {
			job,
			stored: await measures.read(tx, job.id),
			trade: await tradeSettingsFor(tx),
			items: await priceBook.list(tx),
			site: await sites.forJob(tx, job.id)
		};
	});
	const book = priceBook.toPriceBook(items, trade.currency);
	const builtYear = site?.builtYear ? String(site.builtYear) : '';
	return {
		job: { id: job.id, number: job.number, title: job.title, customerName: job.customerName },
		measure: stored ?? {
			draft: { ...emptyMeasure(), builtYear },
			version: 0,
			updatedAt: null,
			updatedByName: null
		},
		settings: trade.settings,
		priceBook: visiblePriceBook(grants, book),
		floors: book.floors.map((f) => ({ id: f.id, name: f.name, kind: f.kind })),
		site: site ? { label: site.label, address: site.address, builtYear: site.builtYear } : null,
		room: url.searchParams.get('room'),
		confirmRemove: url.searchParams.get('remove'),
		userName: user.name
	};
};

/** The draft the form was drawn from, sent back with it (a copy: zod shares default lists). */
function formDraft(form: FormData, field: string): MeasureDraft | undefined {
	const json = readJsonText(String(form.get(field) ?? ''));
	if (!json.ok) return undefined;
	const parsed = measureDraftSchema.safeParse(json.value);
	return parsed.success ? structuredClone(parsed.data) : undefined;
}

/** A version number the form carries (`baseVersion`), or undefined when it is not one. */
function versionOf(form: FormData, field: string): number | undefined {
	const r = readNumber(String(form.get(field) ?? ''), {
		label: 'the version',
		integer: true,
		// The version is a PostgreSQL integer.
		max: 2_147_483_647
	});
	return r.ok ? r.value : undefined;
}

/** Someone saved first: nothing is written, and the page shows both (`baseVersion`: mine's). */
function conflictOf(
	current: Awaited<ReturnType<typeof measures.read>>,
	mine: MeasureDraft,
	baseVersion: number,
	base?: MeasureDraft
) {
	return fail(409, {
		conflict: {
			current: current ?? {
				draft: emptyMeasure(),
				version: 0,
				updatedAt: null,
				updatedByName: null
			},
			mine,
			baseVersion,
			base
		}
	});
}

export const actions: Actions = {
	/**
	 * The editor without JavaScript: every field is named by its path in the draft, the draft it
	 * was drawn from comes along, and the button pressed is an operation (add a hole, a room...).
	 * The result is saved on top of the version the form was drawn from, or refused with both.
	 */
	save: async ({ request, params, url }) => {
		const member = requirePermission({ job: ['update'] });
		await requireJob(member, params.id);
		const { store, user, scope } = member;
		const form = await request.formData();
		const baseVersion = versionOf(form, 'baseVersion');
		const drawn = formDraft(form, '_draft');
		if (!drawn || baseVersion === undefined) {
			return fail(400, { message: 'The form was not sent whole: reload the page and try again.' });
		}
		const draft: MeasureDraft = structuredClone(drawn);
		applyFields(draft, form.entries());
		const op = String(form.get('op') ?? 'save');
		let room = String(form.get('room') ?? '');
		let focus: string | undefined;
		let askRemove: string | undefined;
		if (op.startsWith('remove-room:')) askRemove = op.slice('remove-room:'.length);
		else {
			const done = applyOp(draft, op);
			if (done.selected !== undefined) room = done.selected ?? '';
			focus = done.focus;
		}
		const checked = measureDraftSchema.safeParse(draft);
		if (!checked.success) {
			return fail(400, {
				draft,
				message: 'Some fields are too long or not valid',
				issues: checked.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))
			});
		}
		const saved = sameDraft(drawn, draft)
			? { ok: true as const }
			: await inStore(store.id, async (tx) => {
					const result = await measures.save(tx, params.id, checked.data, baseVersion, user.id);
					if (result.ok || result.reason === 'conflict') return result;
					const job = await jobs.readForViewer(tx, params.id, scope);
					return job ? result : ({ ok: false, reason: 'no_job' } as const);
				});
		if (!saved.ok) {
			if (saved.reason === 'conflict') return conflictOf(saved.current, draft, baseVersion, drawn);
			if (saved.reason === 'no_job') error(404, 'Not found');
			return conflictOf(undefined, draft, baseVersion, drawn);
		}
		const query = new URLSearchParams();
		if (room) query.set('room', room);
		if (askRemove) query.set('remove', askRemove);
		redirect(303, `${url.pathname}?${query}${focus ? `#${fieldId(focus)}` : ''}`);
	},

	/** Settles a conflict without JavaScript: a side for each room, saved on top of theirs. */
	resolve: async ({ request, params, url }) => {
		const member = requirePermission({ job: ['update'] });
		await requireJob(member, params.id);
		const { store, user, scope } = member;
		const form = await request.formData();
		const mine = formDraft(form, '_mine');
		const theirVersion = versionOf(form, 'baseVersion');
		const mineVersion = versionOf(form, 'mineVersion') ?? 0;
		if (!mine || theirVersion === undefined) {
			return fail(400, { message: 'The form was not sent whole: reload the page and try again.' });
		}
		const all = form.get('all');
		const side = (v: FormDataEntryValue | null): Side => (v === 'theirs' ? 'theirs' : 'mine');
		const outcome = await inStore(store.id, async (tx) => {
			const current = await measures.read(tx, params.id);
			if (!current && !(await jobs.readForViewer(tx, params.id, scope)))
				return { kind: 'no_job' } as const;
			const theirs = current ?? { draft: emptyMeasure(), version: 0 };
			// Someone saved again while this one was choosing: choose again against the newest.
			if (theirs.version !== theirVersion) return { kind: 'conflict', current } as const;
			const rooms: Record<string, Side> = {};
			for (const r of [...theirs.draft.rooms, ...mine.rooms])
				rooms[r.id] = all ? side(all) : side(form.get(`pick.${r.id}`));
			const merged = mergeMeasures(theirs.draft, mine, {
				rooms,
				builtYear: all ? side(all) : side(form.get('pick.builtYear'))
			});
			if (sameDraft(theirs.draft, merged)) return { kind: 'saved' } as const;
			const saved = await measures.save(tx, params.id, merged, theirs.version, user.id);
			if (saved.ok) return { kind: 'saved' } as const;
			if (saved.reason === 'conflict') return { kind: 'conflict', current: saved.current } as const;
			return { kind: 'no_job' } as const;
		});
		if (outcome.kind === 'no_job') error(404, 'Not found');
		if (outcome.kind === 'conflict') return conflictOf(outcome.current, mine, mineVersion);
		redirect(303, url.pathname);
	}
};
