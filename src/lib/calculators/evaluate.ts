/**
 * `evaluate`: reads what was typed into a calculator's own input, checks it with the calculator's
 * zod schema and runs it with the store's settings. The browser runs it on every keystroke once
 * the form is touched (imported then: it brings the engine and zod); the server runs the very
 * same function for the page's first answer and for the form action without JavaScript.
 */
import {
	formatArea,
	formatLength,
	type Cutout,
	type Shape,
	type StoreSettings
} from '$lib/estimating';
import { draftUnits, readRoomShape, type RectDraft, type ShapeDraft } from '$lib/measure/draft';
import { readArea, readLength, readNumber, setPath } from '$lib/input';
import {
	forms,
	optionsOf,
	rowCount,
	SHAPE_KINDS,
	SHAPE_ROWS,
	valueOf,
	type CalculatorSettings,
	type Evaluation,
	type FieldSpec,
	type RowsSpec,
	type ShapeKind,
	type ShapeSpec,
	type Values
} from './forms';
import { CALCULATOR_ORDER } from './catalogue';
import { calculators, type CalculatorName, type CalculatorResult } from './registry';

/** A label for messages: "Joist spacing, in" → "joist spacing"; "RH, %" → "RH". */
function lower(label: string) {
	const plain = label.replace(/\s*\(.*\)$/, '').replace(/,.*$/, '');
	return /^[A-Z][a-z]/.test(plain) ? plain.charAt(0).toLowerCase() + plain.slice(1) : plain;
}

/** Arrays without the holes left by blank optional entries. */
function compact(v: unknown): unknown {
	if (Array.isArray(v)) return v.filter((x) => x !== undefined).map(compact);
	if (v && typeof v === 'object')
		return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, compact(x)]));
	return v;
}

function readField(
	field: FieldSpec,
	key: string,
	values: Values,
	s: CalculatorSettings,
	ev: Evaluation
): unknown {
	const text = valueOf(values, field, key, s);
	const units = draftUnits(s);
	const metric = units.room === 'm';
	if (field.kind === 'select') {
		const allowed = optionsOf(field, s).map((o) => o.value);
		if (!allowed.includes(text)) {
			ev.problems[key] = {
				message: `Choose one of the choices for ${lower(field.label)}`,
				missing: false
			};
			return undefined;
		}
		return text === '' || field.uiOnly ? undefined : text;
	}
	if (!text.trim()) {
		if (!field.optional)
			ev.problems[key] = { message: `Enter the ${lower(field.label)}`, missing: true };
		return undefined;
	}
	if (field.kind === 'text') {
		if (text.length > field.maxLength) {
			ev.problems[key] = { message: `Keep it under ${field.maxLength} characters`, missing: false };
			return undefined;
		}
		return text.trim();
	}
	if (field.kind === 'length') {
		const r = readLength(text, units[field.size]);
		if (!r.ok) {
			ev.problems[key] = { message: r.message, missing: false };
			return undefined;
		}
		ev.readAs[key] =
			`${formatLength(r.value)} · ${formatLength(r.value, field.size === 'room' ? 'm' : 'mm', field.size === 'room' ? {} : { digits: 1 })}`;
		return r.value;
	}
	if (field.kind === 'area') {
		const r = readArea(text, metric ? 'sqm' : 'sqft', units.room);
		if (!r.ok) {
			ev.problems[key] = { message: r.message, missing: false };
			return undefined;
		}
		ev.readAs[key] = `${formatArea(r.value)} · ${formatArea(r.value, 'sqm')}`;
		return r.value;
	}
	const r = readNumber(text, {
		label: `the ${lower(field.label)}`,
		units: field.units,
		min: field.min,
		max: field.max,
		integer: field.integer
	});
	if (!r.ok) {
		ev.problems[key] = { message: r.message, missing: false };
		return undefined;
	}
	return r.value * (field.scale ?? 1);
}

function shapeDraft(
	values: Values,
	s: CalculatorSettings
): { shape: ShapeDraft; cutouts: (RectDraft & { name: string })[] } {
	const v = (k: string) => values[k] ?? '';
	const kind = (values['shape.kind'] ?? 'rect') as ShapeKind;
	const rect = (prefix: string): RectDraft => ({
		x: v(`${prefix}.x`),
		y: v(`${prefix}.y`),
		width: v(`${prefix}.width`),
		length: v(`${prefix}.length`)
	});
	const range = (rows: RowsSpec) => Array.from({ length: rowCount(values, rows) }, (_, i) => i);
	const shape: ShapeDraft =
		kind === 'rects'
			? { kind, rects: range(SHAPE_ROWS.rects).map((i) => rect(`shape.rects.${i}`)) }
			: kind === 'sides'
				? {
						kind,
						sides: range(SHAPE_ROWS.sides).map((i) => ({
							length: v(`shape.sides.${i}.length`),
							turn: valueOf(values, SHAPE_ROWS.sides.fields[1], `shape.sides.${i}.turn`, s)
						}))
					}
				: { kind: 'rect', width: v('shape.width'), length: v('shape.length') };
	const cutouts = range(SHAPE_ROWS.cutouts).map((i) => ({
		...rect(`cutouts.${i}`),
		name: v(`cutouts.${i}.name`)
	}));
	return { shape, cutouts };
}

function readShape(
	spec: ShapeSpec,
	values: Values,
	s: CalculatorSettings,
	ev: Evaluation
): { shape?: Shape; cutouts: Cutout[]; kept: number[] } {
	const kind = values['shape.kind'] ?? 'rect';
	if (!SHAPE_KINDS.some((k) => k.value === kind)) {
		ev.problems['shape.kind'] = { message: 'Choose how the room is drawn', missing: false };
		return { cutouts: [], kept: [] };
	}
	const draft = shapeDraft(values, s);
	const drafted = { shape: draft.shape, cutouts: spec.cutouts ? draft.cutouts : [] };
	// A cut-out row left blank is not a cut-out.
	const kept = drafted.cutouts
		.map((c, i) => ({ c, i }))
		.filter(({ c }) => [c.name, c.x, c.y, c.width, c.length].some((t) => t.trim()));
	const read = readRoomShape({ shape: drafted.shape, cutouts: kept.map((k) => k.c) }, s);
	for (const e of read.errors) {
		const key = e.path.replace(/^cutouts\.(\d+)/, (_, j) => `cutouts.${kept[Number(j)].i}`);
		ev.problems[key] = {
			message: e.message,
			missing: /^Enter /.test(e.message) || e.path === 'shape.rects'
		};
	}
	const lengthKeys = Object.keys(values).filter(
		(k) => /^(shape|cutouts)\./.test(k) && /\.(x|y|width|length)$/.test(k)
	);
	for (const key of lengthKeys) {
		if (ev.problems[key] || !values[key].trim()) continue;
		const r = readLength(values[key], draftUnits(s).room);
		if (r.ok) ev.readAs[key] = `${formatLength(r.value)} · ${formatLength(r.value, 'm')}`;
	}
	return { shape: read.shape, cutouts: read.cutouts, kept: kept.map((k) => k.i) };
}

/** A zod or engine path (`voids.0.depthIn`) back to the row the user typed it in. */
function formKey(path: string, rowMaps: Map<string, number[]>): string {
	for (const [group, rows] of rowMaps) {
		if (path === group || path.startsWith(`${group}.`)) {
			const rest = path.slice(group.length + 1);
			const m = /^(\d+)(.*)$/.exec(rest);
			if (!m) return path;
			const row = rows[Number(m[1])];
			return row === undefined ? group : `${group}.${row}${m[2]}`;
		}
	}
	return path;
}

/**
 * Reads what was typed for a calculator, checks it with the calculator's schema and runs it
 * with the store's settings. Never throws: every problem comes back by its field.
 */
export function evaluate(name: CalculatorName, values: Values, s: CalculatorSettings): Evaluation {
	const form = forms[name];
	const ev: Evaluation = { problems: {}, readAs: {} };
	const input: Record<string, unknown> = {};
	const rowMaps = new Map<string, number[]>();

	for (const part of form.parts) {
		if (part.kind === 'shape') {
			const { shape, cutouts, kept } = readShape(part, values, s, ev);
			rowMaps.set('cutouts', kept);
			if (shape) input.shape = shape;
			if (part.cutouts && cutouts.length) input.cutouts = cutouts;
			continue;
		}
		if (part.kind === 'rows') {
			const kept: number[] = [];
			const list: unknown[] = [];
			for (let i = 0; i < rowCount(values, part); i++) {
				const key = (f: FieldSpec) =>
					f.name ? `${part.name}.${i}.${f.name}` : `${part.name}.${i}`;
				const typed = part.fields.some(
					(f) => f.kind !== 'select' && (values[key(f)] ?? '').trim() !== ''
				);
				if (!typed) continue;
				const row: Record<string, unknown> = {};
				let value: unknown;
				for (const f of part.fields) {
					const v = readField(f, key(f), values, s, ev);
					if (f.name) {
						if (v !== undefined) row[f.name] = v;
					} else value = v;
				}
				kept.push(i);
				list.push(part.fields.length === 1 && !part.fields[0].name ? value : row);
			}
			rowMaps.set(part.name, kept);
			if (list.length === 0) {
				if (part.min > 0)
					ev.problems[part.name] = {
						message: `Enter at least ${part.min === 1 ? 'one' : part.min} ${part.rowLabel.toLowerCase()}${part.min === 1 ? '' : 's'}`,
						missing: true
					};
				continue;
			}
			setPath(input, part.name, list);
			continue;
		}
		if (part.when && !part.when(values)) continue;
		const v = readField(part, part.name, values, s, ev);
		if (v !== undefined) setPath(input, part.name, v);
	}
	const built = compact(input) as Record<string, unknown>;
	form.finish?.(built, ev.problems);
	if (Object.keys(ev.problems).length > 0) return ev;

	const calculator = calculators[name];
	const parsed = calculator.input.safeParse(built);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const key = formKey(issue.path.join('.'), rowMaps) || form.failField;
			ev.problems[key] ??= { message: issue.message, missing: false };
		}
		return ev;
	}
	ev.input = parsed.data;
	// The calculators never read the money settings left out of CalculatorSettings.
	const result = (calculator.run as (i: unknown, s: StoreSettings) => CalculatorResult)(
		parsed.data,
		s as StoreSettings
	);
	ev.result = result;
	if (!result.ok) {
		const field =
			typeof result.field === 'string' ? formKey(result.field, rowMaps) : form.failField;
		ev.problems[field] = {
			message: typeof result.message === 'string' ? result.message : 'This cannot be worked out',
			missing: false
		};
	}
	return ev;
}

/** Every calculator's answer to nothing typed yet: what its form shows before it is touched. */
export function untouched(s: CalculatorSettings): Record<CalculatorName, Evaluation> {
	return Object.fromEntries(
		CALCULATOR_ORDER.map((name) => [name, evaluate(name, {}, s)])
	) as Record<CalculatorName, Evaluation>;
}
