import { monthStart, monthLength, today, addDays } from '$lib/schedule/days';
import { statementCreateSchema } from '$lib/schemas/crew';
import * as installers from '$lib/server/db/queries/installers';
import * as statements from '$lib/server/db/queries/statements';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { parseForm, refuse } from '$lib/server/forms';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { makeStatement } from '$lib/server/statements/build';
import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const { store, grants } = requirePermission({ statement: ['read'] });
	const { rows, people } = await readInStore(store.id, async (tx) => ({
		rows: await statements.list(tx),
		people: await installers.list(tx)
	}));
	// The month before this one is the usual period to pay.
	const lastMonth = monthStart(addDays(monthStart(today(store.timeZone)), -1));
	return {
		statements: rows,
		installers: people.map((p) => ({ id: p.userId, name: p.name })),
		period: { start: lastMonth, end: addDays(lastMonth, monthLength(lastMonth) - 1) },
		canCreate: can(grants, { statement: ['create'] })
	};
};

export const actions: Actions = {
	create: async ({ request }) => {
		const { store, user } = requirePermission({ statement: ['create'] });
		const parsed = await parseForm(request, statementCreateSchema);
		if (!parsed.ok) return parsed.failure;
		const result = await inStore(store.id, (tx) =>
			makeStatement(tx, parsed.data, { id: user.id, timeZone: store.timeZone })
		);
		if (!result.ok) {
			return result.reason === 'refused' && result.field
				? refuse(parsed.form, { [result.field]: [result.message] })
				: refuse(parsed.form, {}, 'That installer is not one of the store’s.');
		}
		redirect(303, `/app/statements/${result.statementId}`);
	}
};
