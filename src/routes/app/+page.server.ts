import { storeDay } from '$lib/server/desk/day';
import { list } from '$lib/server/db/queries/jobs';
import * as tasks from '$lib/server/db/queries/tasks';
import { inStore, readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { can } from '$lib/server/permissions';
import { resend } from '$lib/server/tasks';
import { formFields } from '$lib/input';
import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const member = requirePermission({ job: ['read'] });
	const { store, scope, grants } = member;
	const seesOutbox = can(grants, { outbox: ['read'] });
	return readInStore(store.id, async (tx) => {
		const day = await storeDay(tx, member);
		const recent = await list(
			tx,
			{ sort: 'updated', dir: 'desc', page: 1, pageSize: 6, q: null },
			scope
		);
		return {
			day,
			recent: recent.rows,
			// E-mail that did not go out (or is being retried), for managers and owners only.
			outbox: seesOutbox ? await tasks.needingAttention(tx) : null,
			canResend: can(grants, { outbox: ['resend'] })
		};
	});
};

const resendSchema = z.object({ taskId: z.string().trim().min(1).max(64) });

export const actions: Actions = {
	/** Sends an e-mail whose retries ran out again, as new. */
	resend: async ({ request }) => {
		const { store } = requirePermission({ outbox: ['resend'] });
		const parsed = resendSchema.safeParse(formFields(await request.formData()));
		if (!parsed.success) return fail(400, { resendError: 'Choose an e-mail to send again' });
		const again = await inStore(store.id, (tx) => resend(tx, parsed.data.taskId));
		if (!again) error(404, 'Not found');
		return { resent: again.summary };
	}
};
