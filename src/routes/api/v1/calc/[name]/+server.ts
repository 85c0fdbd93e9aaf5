import { isCalculatorName } from '$lib/calculators/forms';
import { calculators } from '$lib/calculators/registry';
import { endpoint, readJson } from '$lib/server/api';
import { runCalculator } from '$lib/server/estimates';
import { requirePermission } from '$lib/server/guards';
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** One calculator with the store's settings; every role uses them (installers too: no prices here). */
export const POST: RequestHandler = endpoint(async ({ params, request }) => {
	const { store } = requirePermission({ calculator: ['use'] });
	if (!isCalculatorName(params.name)) error(404, `There is no calculator called "${params.name}"`);
	const input = await readJson(request, calculators[params.name].input);
	return json(await runCalculator(store.id, params.name, input));
});
