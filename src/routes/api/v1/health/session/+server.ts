import { endpoint } from '$lib/server/api';
import { readInStore } from '$lib/server/db/tenant';
import { requireMember } from '$lib/server/guards';
import { json } from '@sveltejs/kit';
import { sql } from 'drizzle-orm';
import type { RequestHandler } from './$types';

/**
 * The benchmarks' baseline (bench/README.md): the session read by the hooks, the member's guard,
 * and one store transaction doing `SELECT 1`. Every other route costs at least this much.
 */
export const GET: RequestHandler = endpoint(async () => {
	const { store } = requireMember();
	await readInStore(store.id, (tx) => tx.execute(sql`select 1`));
	return json({ ok: true });
});
