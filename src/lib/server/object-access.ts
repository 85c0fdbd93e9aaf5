import { error } from '@sveltejs/kit';
import * as rows from './db/queries/access';
import { can, type Grants } from './permissions';

export { WHOLE_STORE, type JobScope } from './db/queries/access';

/** The things a member reaches by id. */
export type ObjectKind = 'job' | 'customer' | 'quote' | 'payment';

/** Who is asking: the member's grants in the active store, and who they are. */
export interface Asker {
	store: { id: string };
	user: { id: string };
	grants: Grants;
}

/** The most ids one request may ask about; more is a mistake or an attack. */
export const MAX_IDS = 500;

function plausibleId(id: string): boolean {
	// eslint-disable-next-line no-control-regex
	return id.length > 0 && id.length <= 128 && !/[\u0000-\u001f\u007f]/.test(id);
}

/**
 * The jobs a member sees and works on. Staff with `job: read` see the store's jobs, except
 * salespeople in a store that keeps them to their own (store settings, "Who sees what"); members
 * with `assignedJob: read` only (installers) see the jobs assigned to them; anyone else, none.
 */
export function jobScope(grants: Grants, userId: string): rows.JobScope {
	if (can(grants, { job: ['read'] })) {
		const narrowed = grants.role === 'sales' && grants.access.salesJobs === 'own';
		return narrowed ? { kind: 'sold', userId } : { kind: 'store' };
	}
	if (can(grants, { assignedJob: ['read'] })) return { kind: 'assigned', userId };
	return { kind: 'none' };
}

/**
 * Of `ids`, the ones this member may touch: rows of the active store, within their jobs (a quote
 * or a payment by its job), and of a kind their role reads at all. Duplicates are asked once.
 */
export async function touchable(
	member: Asker,
	kind: ObjectKind,
	ids: readonly string[]
): Promise<Set<string>> {
	if (ids.length > MAX_IDS) error(400, `Ask about at most ${MAX_IDS} at once`);
	// An id no row can have (empty, overlong, control characters) is simply not found.
	const unique = [...new Set(ids)].filter(plausibleId);
	const storeId = member.store.id;
	const scope = jobScope(member.grants, member.user.id);
	const reads = (permission: Parameters<typeof can>[1]) => can(member.grants, permission);
	let found: string[] = [];
	switch (kind) {
		case 'job':
			found = await rows.jobsIn(storeId, scope, unique);
			break;
		case 'customer':
			found = reads({ customer: ['read'] }) ? await rows.customersIn(storeId, unique) : [];
			break;
		case 'quote':
			found = reads({ quote: ['read'] }) ? await rows.quotesIn(storeId, scope, unique) : [];
			break;
		case 'payment':
			found = reads({ payment: ['read'] }) ? await rows.paymentsIn(storeId, scope, unique) : [];
			break;
	}
	return new Set(found);
}

/**
 * 404 unless the member may touch every one of `ids`: another store's row, a job outside their
 * scope and a made-up id all look the same. Call after the permission guard, before any work.
 */
export async function requireObjects(
	member: Asker,
	kind: ObjectKind,
	ids: readonly string[]
): Promise<void> {
	const allowed = await touchable(member, kind, ids);
	if (ids.length === 0 || ids.some((id) => !allowed.has(id))) error(404, 'Not found');
}

/** `requireObjects` for one job. */
export function requireJob(member: Asker, id: string): Promise<void> {
	return requireObjects(member, 'job', [id]);
}
