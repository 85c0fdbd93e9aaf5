import { readMoney } from '$lib/input';
import { totalsByKind } from '$lib/statements/maths';
import { statementLineSchema, statementPaySchema } from '$lib/schemas/crew';
import * as statements from '$lib/server/db/queries/statements';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { parseForm, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import {
	addManualLine,
	payStatement,
	refreshStatement,
	type StatementResult
} from '$lib/server/statements/build';
import { error } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const { store, grants } = requirePermission({ statement: ['read'] });
	const found = await readInStore(store.id, async (tx) => {
		const row = await statements.read(tx, params.id);
		return row && { ...row, lines: await statements.lines(tx, params.id) };
	});
	if (!found) error(404, 'Not found');
	const { statement, installerName, lines } = found;
	return {
		statement: {
			id: statement.id,
			installerName,
			periodStart: statement.periodStart,
			periodEnd: statement.periodEnd,
			currency: statement.currency,
			status: statement.status,
			totalCents: statement.totalCents,
			paidAt: statement.paidAt,
			paidReference: statement.paidReference
		},
		lines,
		totals: totalsByKind(lines),
		canEdit: can(grants, { statement: ['create'] }) && statement.status === 'open',
		canPay: can(grants, { statement: ['pay'] }) && statement.status === 'open'
	};
};

/** A refusal of the workflow as the form shows it; another store's statement is 404. */
function answer<T extends object>(form: FormData, result: StatementResult, done: T) {
	if (!result.ok && result.reason === 'not_found') error(404, 'Not found');
	if (!result.ok)
		return result.field
			? refuse(form, { [result.field]: [result.message] })
			: refuse(form, {}, result.message, 409);
	return done;
}

export const actions: Actions = {
	line: async ({ request, params }) => {
		const { store, user } = requirePermission({ statement: ['create'] });
		const parsed = await parseForm(request, statementLineSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await inStore(store.id, async (tx) => {
			const row = await statements.read(tx, params.id);
			if (!row) return { ok: false, reason: 'not_found' } as const;
			const amount = readMoney(parsed.data.amount, row.statement.currency, {
				label: 'the amount',
				min: -100_000_000,
				max: 100_000_000
			});
			if (!amount.ok)
				return { ok: false, reason: 'refused', field: 'amount', message: amount.message } as const;
			return addManualLine(
				tx,
				params.id,
				{
					kind: parsed.data.kind,
					amountCents: amount.value,
					reason: parsed.data.reason,
					description: parsed.data.description ?? ''
				},
				user.id
			);
		});
		return answer(parsed.form, result, { lineAdded: true });
	},
	refresh: async ({ request, params }) => {
		const { store, user } = requirePermission({ statement: ['create'] });
		const form = await request.formData();
		const result = await inStore(store.id, (tx) =>
			refreshStatement(tx, params.id, { id: user.id, timeZone: store.timeZone })
		);
		return answer(form, result, { refreshed: result.ok ? result.added : 0 });
	},
	pay: async ({ request, params }) => {
		const { store, user } = requirePermission({ statement: ['pay'] });
		const parsed = await parseForm(request, statementPaySchema);
		if (!parsed.ok) return parsed.failure;
		const result = await inStore(store.id, (tx) =>
			payStatement(tx, params.id, parsed.data.reference, user.id)
		);
		return answer(parsed.form, result, { paid: true });
	}
};
