import type { CalculatorName } from '$lib/calculators/registry';
import type { Evaluation, Values } from '$lib/calculators/forms';

/** What the form action sends back: what was typed, kept, and whether it was a real submit. */
export interface CalculatorFormData {
	calculator?: CalculatorName;
	values?: Values;
	submitted?: boolean;
	/** The server's answer to those values. */
	evaluation?: Evaluation;
}

/**
 * What was typed in each calculator (kept when switching between them), which fields were left,
 * and which forms were sent: a field's "Enter the ..." shows only after one of those.
 */
export class CalculatorState {
	valuesBy = $state<Partial<Record<CalculatorName, Values>>>({});
	touched = $state<Record<string, boolean>>({});
	submitted = $state<Partial<Record<CalculatorName, boolean>>>({});
	/** The server's answer to what was posted, shown until the browser works answers out itself. */
	posted = $state.raw<Partial<Record<CalculatorName, Evaluation>>>({});

	constructor(initial?: CalculatorFormData | null) {
		if (initial?.calculator && initial.values) {
			this.valuesBy[initial.calculator] = initial.values;
			this.submitted[initial.calculator] = !!initial.submitted;
			if (initial.evaluation) this.posted = { [initial.calculator]: initial.evaluation };
		}
	}

	values(name: CalculatorName): Values {
		return this.valuesBy[name] ?? {};
	}

	set(name: CalculatorName, key: string, value: string) {
		this.valuesBy[name] = { ...this.values(name), [key]: value };
	}

	replace(name: CalculatorName, values: Values) {
		this.valuesBy[name] = values;
	}

	touch(name: CalculatorName, key: string) {
		this.touched[`${name}:${key}`] = true;
	}

	/** A problem's message once it should show: unreadable at once, missing after leaving or sending. */
	shown(name: CalculatorName, ev: Evaluation | undefined, key: string): string | undefined {
		const p = ev?.problems[key];
		if (!p) return undefined;
		if (!p.missing || this.submitted[name]) return p.message;
		const prefix = `${name}:${key}`;
		const left = Object.keys(this.touched).some((k) => k === prefix || k.startsWith(`${prefix}.`));
		return left ? p.message : undefined;
	}
}
