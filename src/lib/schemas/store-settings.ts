/**
 * The store's trade settings form: taxes, deposit, quote validity, units, waste by layout, the
 * underlayment fastening schedule and crew output, typed as people type them (rates "6.5",
 * amounts "250.00", or "25000" in yen) and read by `$lib/input`, laid over the store's whole
 * settings document, which is then checked with the engine's `settingsSchema`. Every other
 * default of the engine is kept as it is. The form posts dotted names (`taxes.0.rate`), read with
 * `readFields`. Browser-safe.
 */
import { z } from 'zod';
import {
	FLOOR_KINDS,
	formatLength,
	LAYOUTS,
	LINE_GROUPS,
	type FloorKind,
	type LineGroup,
	type StoreSettings
} from '$lib/estimating';
import { bpsToInput, moneyToInput, readPercentBps } from '$lib/input';
import {
	moneyField,
	numberField,
	optionalLengthField,
	optionalNumberField,
	textField as text,
	percentBpsField
} from '$lib/input/zod';
import { INSTALL_SUPPLY_DEFAULTS } from '$lib/estimating/trim';
import { settingsSchema } from './estimate';

export const LINE_GROUP_LABELS: Record<LineGroup, string> = {
	material: 'Materials',
	labour: 'Install labour',
	prep: 'Prep services',
	removal: 'Removal'
};

export const TAX_ROUNDING_LABELS: Record<StoreSettings['taxRounding'], string> = {
	half_up: 'To the nearest cent, halves up',
	half_even: 'To the nearest cent, halves to even',
	up: 'Always up to the next cent',
	down: 'Always down'
};

export const LENGTH_UNIT_LABELS: Record<StoreSettings['units']['defaultLengthUnit'], string> = {
	in: 'inches',
	ft: 'feet',
	mm: 'millimetres',
	cm: 'centimetres',
	m: 'metres'
};

const number = (what: string, options: { min?: number; max?: number; whole?: boolean } = {}) =>
	numberField({ label: what, min: options.min, max: options.max, integer: options.whole });

const checkbox = z
	.string()
	.optional()
	.transform((v) => v === 'on' || v === 'true');

const taxRow = z
	.object({
		name: text.pipe(z.string().max(60, 'Keep it under 60 characters')),
		rate: text,
		material: checkbox,
		labour: checkbox,
		prep: checkbox,
		removal: checkbox
	})
	.transform((row, ctx) => {
		const groups = LINE_GROUPS.filter((g) => row[g]);
		if (!row.name && !row.rate && groups.length === 0) return null;
		let bad = false;
		if (!row.name) {
			ctx.addIssue({ code: 'custom', path: ['name'], message: 'Name this tax, e.g. Sales tax' });
			bad = true;
		}
		const rate = readPercentBps(row.rate, 'the rate');
		if (!rate.ok) {
			ctx.addIssue({ code: 'custom', path: ['rate'], message: rate.message });
			bad = true;
		}
		if (bad || !rate.ok) return z.NEVER;
		return { name: row.name, rateBps: rate.value, groups };
	});

const byLayout = z.object(
	Object.fromEntries(LAYOUTS.map((l) => [l, number('the waste in %', { max: 100 })])) as Record<
		(typeof LAYOUTS)[number],
		ReturnType<typeof number>
	>
);
const byFloor = z.object(
	Object.fromEntries(
		FLOOR_KINDS.map((k) => [k, number('the ft² a crew lays in a day', { min: 1, max: 100_000 })])
	) as Record<FloorKind, ReturnType<typeof number>>
);

/** Days each floor acclimates on site before it is laid; empty keeps the saved figure. */
const acclimationDays = z.object(
	Object.fromEntries(
		FLOOR_KINDS.map((k) => [
			k,
			optionalNumberField({ label: 'the days it acclimates', min: 0, max: 84 })
		])
	) as Record<FloorKind, ReturnType<typeof optionalNumberField>>
);

/**
 * The trade settings form; `schedules` are the fastening schedules the store's settings hold,
 * `currency` the store's (amounts are typed with its decimals).
 */
export function tradeSettingsFormSchema(schedules: string[], currency: string) {
	return z.object({
		taxes: z
			.array(taxRow)
			.max(10)
			.default([])
			.transform((rows) => rows.filter((r) => r !== null)),
		taxRounding: z.enum(['half_up', 'half_even', 'up', 'down'], {
			error: 'Choose how taxes round'
		}),
		deposit: z
			.object({
				percent: percentBpsField('the deposit percentage'),
				minimum: moneyField(currency, { label: 'the minimum deposit' })
			})
			.prefault({}),
		quoteValidDays: number('how many days a quote stays open', { min: 1, max: 365, whole: true }),
		units: z
			.object({
				system: z.enum(['imperial', 'metric'], { error: 'Choose imperial or metric' }),
				defaultLengthUnit: z.enum(['in', 'ft', 'mm', 'cm', 'm'], { error: 'Choose a unit' })
			})
			// A missing group is parsed as empty, so each of its fields gets its own message.
			.prefault({} as never),
		waste: byLayout.prefault({}),
		fasteningSchedule: z
			.string({ error: 'Choose a fastening schedule' })
			.refine((s) => schedules.includes(s), 'Choose one of the schedules listed'),
		crew: byFloor.prefault({}),
		acclimation: acclimationDays.prefault({}),
		setWaste: optionalNumberField({ label: 'the waste in %', min: 0, max: 100 }),
		trimAllowance: optionalLengthField('in', { label: 'the allowance', maxIn: 12 })
	});
}

export type TradeSettingsForm = z.output<ReturnType<typeof tradeSettingsFormSchema>>;

/**
 * The whole settings document with the form's values laid over the current one, checked with the
 * engine's schema; issues come back on the form field they belong to.
 */
export function applyTradeSettings(
	current: StoreSettings,
	form: TradeSettingsForm
):
	| { ok: true; settings: StoreSettings; quoteValidDays: number }
	| { ok: false; errors: Record<string, string[]> } {
	// Acclimation by the flooring maker's instructions (TRADE.md: memory for the usual range),
	// typed in days and kept in hours; 0 days is none.
	const acclimationHours = { ...current.schedule.acclimationHours };
	for (const k of FLOOR_KINDS) {
		const days = form.acclimation[k];
		if (days === undefined) continue;
		if (days > 0) acclimationHours[k] = days * 24;
		else delete acclimationHours[k];
	}
	const supplies = current.installSupplies ?? INSTALL_SUPPLY_DEFAULTS;
	const next: StoreSettings = {
		...current,
		units: form.units,
		wastePct: form.waste,
		underlayment: { ...current.underlayment, schedule: form.fasteningSchedule },
		schedule: { ...current.schedule, crewSqFtPerDay: form.crew, acclimationHours },
		...((form.setWaste !== undefined || form.trimAllowance !== undefined) && {
			installSupplies: {
				wastePct: form.setWaste ?? supplies.wastePct,
				trimEndAllowanceIn: form.trimAllowance ?? supplies.trimEndAllowanceIn
			}
		}),
		taxes: form.taxes,
		taxRounding: form.taxRounding,
		deposit: { percentBps: form.deposit.percent, minimumCents: form.deposit.minimum }
	};
	const checked = settingsSchema.safeParse(next);
	if (!checked.success) {
		const field: Record<string, string> = {
			wastePct: 'waste',
			schedule: 'crew',
			underlayment: 'fasteningSchedule'
		};
		const errors: Record<string, string[]> = {};
		for (const issue of checked.error.issues) {
			const [head, ...rest] = issue.path.map(String);
			const key =
				head === 'deposit'
					? `deposit.${rest[0] === 'minimumCents' ? 'minimum' : 'percent'}`
					: head === 'taxes'
						? `taxes.${rest[0]}.rate`
						: head === 'schedule' && rest[0] === 'acclimationHours'
							? `acclimation.${rest[1]}`
							: head === 'schedule'
								? `crew.${rest[rest.length - 1]}`
								: head === 'installSupplies'
									? rest[0] === 'wastePct'
										? 'setWaste'
										: 'trimAllowance'
									: [field[head] ?? head, ...rest].join('.');
			(errors[key] ??= []).push(issue.message);
		}
		return { ok: false, errors };
	}
	return { ok: true, settings: checked.data as StoreSettings, quoteValidDays: form.quoteValidDays };
}

/** The form's fields for the saved settings (dotted names, as the form posts them). */
export function tradeSettingsToForm(s: StoreSettings, quoteValidDays: number, currency: string) {
	const values: Record<string, string> = {
		taxRounding: s.taxRounding,
		'deposit.percent': bpsToInput(s.deposit.percentBps),
		'deposit.minimum': moneyToInput(s.deposit.minimumCents, currency),
		quoteValidDays: String(quoteValidDays),
		'units.system': s.units.system,
		'units.defaultLengthUnit': s.units.defaultLengthUnit,
		fasteningSchedule: s.underlayment.schedule
	};
	s.taxes.forEach((t, i) => {
		values[`taxes.${i}.name`] = t.name;
		values[`taxes.${i}.rate`] = bpsToInput(t.rateBps);
		for (const g of t.groups) values[`taxes.${i}.${g}`] = 'on';
	});
	for (const l of LAYOUTS) values[`waste.${l}`] = String(s.wastePct[l]);
	for (const k of FLOOR_KINDS) values[`crew.${k}`] = String(s.schedule.crewSqFtPerDay[k]);
	for (const k of FLOOR_KINDS)
		values[`acclimation.${k}`] = String((s.schedule.acclimationHours?.[k] ?? 0) / 24);
	const supplies = s.installSupplies ?? INSTALL_SUPPLY_DEFAULTS;
	values.setWaste = String(supplies.wastePct);
	values.trimAllowance = formatLength(supplies.trimEndAllowanceIn, 'in');
	return values;
}

/** How many tax rows a form of these values shows: every row typed, and one empty to add. */
export function taxRowCount(values: Record<string, string>): number {
	let n = 0;
	for (const [key, value] of Object.entries(values)) {
		const m = /^taxes\.(\d{1,3})\./.exec(key);
		if (m && value.trim()) n = Math.max(n, Number(m[1]) + 1);
	}
	return Math.min(n + 1, 10);
}

/**
 * "Who sees what": whether salespeople see costs, installer pay and margins (never card fees),
 * and whether they see every job or only the jobs they sell. An unticked box is not sent.
 */
export const storeAccessFormSchema = z.object({
	salesSeeCosts: checkbox,
	salesJobs: z.enum(['all', 'own'], { error: 'Choose which jobs salespeople see' })
});

export type StoreAccessForm = z.output<typeof storeAccessFormSchema>;
