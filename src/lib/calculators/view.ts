import type { CalculatorSettings, Evaluation } from './forms';
import { isCalculatorName, type CalculatorName } from './catalogue';
import type { Component } from 'svelte';
import type { CalculatorState } from '$lib/components/calculators/state.svelte';

export type CalculatorViewComponent = Component<{
	selected: CalculatorName;
	settings: CalculatorSettings;
	untouched: Record<CalculatorName, Evaluation>;
	base: string;
	calc: CalculatorState;
}>;

/**
 * The open calculator's component, for a calculators page's universal load: imported only when
 * the address names a calculator, so the list ships without the engine and the schemas. On the
 * server the import is the same module the page renders, so the form works without JavaScript.
 */
export async function calculatorView(url: URL): Promise<{ View?: CalculatorViewComponent }> {
	if (!isCalculatorName(url.searchParams.get('c'))) return {};
	const { default: View } = await import('$lib/components/calculators/CalculatorView.svelte');
	return { View };
}
