import { fail } from '@sveltejs/kit';
import { evaluate, untouched } from '$lib/calculators/evaluate';
import { addRow, calculatorSettings, isCalculatorName, removeRow } from '$lib/calculators/forms';
import { readInStore } from './db/tenant';
import { typedValues } from './forms';
import { requirePermission } from './guards';
import { tradeSettingsFor } from './store-settings';

/**
 * The Calculators page's load, shared by the staff desk and the installer screens: the store's
 * settings (its overrides apply in the browser), without the money settings, and each
 * calculator's answer to an empty form, which an open calculator shows until it is touched (the
 * browser imports `evaluate`, the engine and zod only then). Not by the address's calculator: the
 * installer's service worker keeps one copy of this data for every `?c=`.
 */
export async function calculatorLoad() {
	const { store } = requirePermission({ calculator: ['use'] });
	const { settings } = await readInStore(store.id, tradeSettingsFor);
	const s = calculatorSettings(settings);
	return { settings: s, untouched: untouched(s) };
}

/**
 * The form action for browsers without JavaScript: the same `evaluate` on the server, keeping
 * what was typed; "Add" and "Remove" post here too and change the rows.
 */
export const calculatorActions = {
	default: async ({ request }: { request: Request }) => {
		const { store } = requirePermission({ calculator: ['use'] });
		const form = await request.formData();
		const calculator = form.get('calculator');
		if (!isCalculatorName(calculator)) return fail(400, { message: 'Choose a calculator first' });
		const { calculator: _c, add, remove, ...typed } = typedValues(form);
		let values = typed;
		if (add) values = addRow(values, calculator, add);
		const at = remove ? /^(.+)\.(\d+)$/.exec(remove) : null;
		if (at) values = removeRow(values, calculator, at[1], Number(at[2]));
		const changedRows = Boolean(add || remove);
		const { settings } = await readInStore(store.id, tradeSettingsFor);
		const evaluation = evaluate(calculator, values, calculatorSettings(settings));
		const body = { calculator, values, submitted: !changedRows, evaluation };
		if (!changedRows && Object.keys(evaluation.problems).length > 0) return fail(400, body);
		return body;
	}
};
