// What a person did to a form before the page came alive. The server's HTML can be used at once,
// but on a slow phone the JavaScript may arrive seconds later; when it does, Svelte hydrates the
// page and sets every control it renders from the component's state: a `<select bind:value>`, a
// `value={…}` or a `checked={…}` goes back to what the server rendered, and a component that shows
// fields by a choice hides them again. A choice made in between would be silently lost (a job
// started with "A new address…" went to the customer's old address).
//
// So the root layout notes, just before hydration, each control the person changed (its value
// differs from the one in the HTML), components whose state decides what is shown start from
// that choice (`earlyValue`), and once the page is live every noted control gets its value back
// and the `input` and `change` events the page missed, so its state follows.

type Control = HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement;

type Kept =
	| { kind: 'value'; value: string }
	| { kind: 'checked'; checked: boolean }
	| { kind: 'options'; selected: boolean[] };

/** Controls whose value is not the person's to change, or cannot be set again. */
const SKIPPED_TYPES = new Set(['hidden', 'file', 'submit', 'button', 'reset', 'image']);

let captured = false;
let kept: Map<Control, Kept> | null = null;
let byId: Map<string, string> | null = null;

/** The option a single `<select>` shows before anyone touches it. */
function defaultIndex(select: HTMLSelectElement) {
	let index = -1;
	for (const [i, option] of [...select.options].entries()) if (option.defaultSelected) index = i;
	if (index >= 0) return index;
	return [...select.options].findIndex((option) => !option.disabled);
}

/** What the person changed in one control since the HTML arrived, or null. */
function changed(control: Control): Kept | null {
	if (control instanceof HTMLSelectElement) {
		if (control.multiple) {
			const selected = [...control.options].map((o) => o.selected);
			const differs = [...control.options].some((o, i) => o.defaultSelected !== selected[i]);
			return differs ? { kind: 'options', selected } : null;
		}
		return control.selectedIndex !== defaultIndex(control)
			? { kind: 'value', value: control.value }
			: null;
	}
	if (control instanceof HTMLInputElement && SKIPPED_TYPES.has(control.type)) return null;
	if (
		control instanceof HTMLInputElement &&
		(control.type === 'checkbox' || control.type === 'radio')
	) {
		return control.checked !== control.defaultChecked
			? { kind: 'checked', checked: control.checked }
			: null;
	}
	return control.value !== control.defaultValue ? { kind: 'value', value: control.value } : null;
}

/**
 * Notes every control changed before hydration. Called once, by the root layout's script, which
 * runs before any page component is hydrated; later calls (client-side navigation) do nothing.
 */
export function captureEarlyInput(root: ParentNode = document) {
	if (captured) return;
	captured = true;
	kept = new Map();
	byId = new Map();
	for (const control of root.querySelectorAll<Control>('input, select, textarea')) {
		const found = changed(control);
		if (!found) continue;
		kept.set(control, found);
		if (control.id && found.kind === 'value') byId.set(control.id, found.value);
	}
}

/**
 * The value the person gave the control with this id before the page was live, if they changed
 * it: for state that decides what a component shows (a select that reveals fields), read while
 * the component starts, so hydration keeps the fields and what was typed in them.
 */
export function earlyValue(id: string | null | undefined): string | undefined {
	return id ? byId?.get(id) : undefined;
}

/** `earlyValue` of a select, when it is still one of the options offered. */
export function earlyChoice(
	id: string | null | undefined,
	options: { value: string }[]
): string | undefined {
	const early = earlyValue(id);
	return options.some((o) => o.value === early) ? early : undefined;
}

/** Puts the noted state back; false when it no longer fits (the select lost that option). */
function put(control: Control, state: Kept) {
	if (state.kind === 'checked') {
		(control as HTMLInputElement).checked = state.checked;
	} else if (state.kind === 'options') {
		for (const [i, option] of [...(control as HTMLSelectElement).options].entries()) {
			option.selected = state.selected[i] ?? false;
		}
	} else if (control.value !== state.value) {
		if (control instanceof HTMLSelectElement) {
			if (![...control.options].some((o) => o.value === state.value)) return false;
		}
		control.value = state.value;
	}
	return true;
}

/**
 * Once the page is live: gives each noted control its value back (hydration may have reset it)
 * and sends the `input` and `change` events it missed, in the order of the page, so bindings and
 * handlers see what the person did. A radio button that was merely unchecked gets no event (a
 * browser sends it to the one checked). Controls hydration removed are gone with their block.
 */
export function restoreEarlyInput() {
	const noted = kept;
	kept = null;
	byId = null;
	if (!noted) return;
	for (const [control, state] of noted) {
		if (!control.isConnected || control.disabled || !put(control, state)) continue;
		if (
			state.kind === 'checked' &&
			!state.checked &&
			(control as HTMLInputElement).type === 'radio'
		)
			continue;
		control.dispatchEvent(new Event('input', { bubbles: true }));
		control.dispatchEvent(new Event('change', { bubbles: true }));
	}
}
