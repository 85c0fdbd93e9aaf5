import { isCalculatorName } from '$lib/calculators/forms';
import { calculators } from '$lib/calculators/registry';
import { endpoint, readJson } from '$lib/server/api';
import { readInStore } from '$lib/server/db/tenant';
import { runCalculator } from '$lib/server/estimates';
import { requirePermission } from '$lib/server/guards';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** One calculator with the store's settings; every role uses them (installers too: no prices here). */
export const POST: RequestHandler = endpoint(async ({ params, request }) => {
	const { store } = requirePermission({ calculator: ['use'] });
	const name = params.name;
	if (!isCalculatorName(name)) error(404, `There is no calculator called "${name}"`);
	const input = await readJson(request, calculators[name].input);
	return json(await readInStore(store.id, (tx) => runCalculator(tx, name, input)));
});
