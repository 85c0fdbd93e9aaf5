import { list } from '$lib/server/db/queries/customers';
import { readInStore } from '$lib/server/db/tenant';
import { requirePermission } from '$lib/server/guards';
import { customerListSchema } from '$lib/schemas/customer';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const { store } = requirePermission({ customer: ['read'] });
	const parsed = customerListSchema.safeParse(Object.fromEntries(url.searchParams));
	const query = parsed.success ? parsed.data : customerListSchema.parse({});
	const { rows, total } = await readInStore(store.id, (tx) => list(tx, query));
	return { rows, total, query };
};
