/**
 * A calculator's answer in words for the page: the headline, the figures behind it, each check
 * with what to do when it fails, and the cautions. Only the engine's own numbers, formatted.
 */
import { formatArea, formatLength } from '$lib/estimating/units';
import type {
	Check,
	FastenerCount,
	JoistResult,
	LevellerTakeoff,
	Outline,
	PatchTakeoff,
	RollTakeoff,
	UnderlaymentTakeoff
} from '$lib/estimating';
import type { CalculatorName, CalculatorResult } from './registry';

export interface Figure {
	label: string;
	value: string;
}

export interface SummaryCheck {
	pass: boolean;
	message: string;
	/** What to do about a failed check (sister the joists, retest...). */
	notes: string[];
}

export interface Summary {
	headline: string;
	/** A pass/fail answer (checks) or a plain quantity. */
	verdict?: 'pass' | 'fail';
	figures: Figure[];
	checks: SummaryCheck[];
	warnings: string[];
	outline?: Outline;
	rule: string;
	source: string;
	cautions: string[];
}

/**
 * Structure and moisture answers always carry this line, whatever the engine's cautions say: they
 * are planning aids (TRADE.md "Cautions to show").
 */
export const CONFIRM_WITH_PROFESSIONAL =
	'Confirm with the flooring maker’s instructions, local codes and a licensed professional before relying on this result.';

/** Calculators whose answers touch structure or moisture. */
export const STRUCTURAL: readonly CalculatorName[] = ['joists', 'sheathing', 'moisture'];

const n = (x: number, digits = 2) =>
	Number.isInteger(x) ? String(x) : x.toFixed(digits).replace(/\.?0+$/, '');
const plural = (count: number, one: string, many = `${one}s`) =>
	`${count} ${count === 1 ? one : many}`;

function checksOf(list: Check[]): SummaryCheck[] {
	return list.map((c) => ({
		pass: c.pass,
		message: c.message,
		notes: c.suggestedPrep.map((p) => p.note)
	}));
}

type Parts = Pick<Summary, 'headline' | 'figures'> & Partial<Summary>;

function verdictOf(r: CalculatorResult, what: string): Pick<Summary, 'headline' | 'verdict'> {
	const pass = r.pass === true;
	return {
		headline: pass ? `Passes: ${what}` : `Does not pass: ${what}`,
		verdict: pass ? 'pass' : 'fail'
	};
}

const describe: { [K in CalculatorName]: (r: CalculatorResult, metric: boolean) => Parts } = {
	units: (r) => ({
		headline: String(r.ftIn),
		figures: [
			{ label: 'Inches', value: `${n(r.inches as number, 4)} in` },
			{ label: 'Millimetres', value: String(r.mm) },
			{ label: 'Metres', value: String(r.m) }
		]
	}),
	area: (r, metric) => {
		const text = r.areaText as { sqft: string; sqyd: string; sqm: string };
		const cut = (r.perimeterIn as number) !== (r.wallPerimeterIn as number);
		return {
			headline: metric ? text.sqm : text.sqft,
			figures: [
				metric
					? { label: 'Square feet', value: text.sqft }
					: { label: 'Square metres', value: text.sqm },
				{ label: 'Square yards', value: text.sqyd },
				{
					label: cut ? 'Floor edge (walls and cut-outs)' : 'Perimeter',
					value: formatLength(r.perimeterIn as number)
				},
				...(cut ? [{ label: 'Walls', value: formatLength(r.wallPerimeterIn as number) }] : [])
			],
			warnings: (r.warnings as string[]) ?? [],
			outline: r.outline as Outline
		};
	},
	cartons: (r) => ({
		headline: plural(r.cartons as number, 'carton'),
		figures: [
			{ label: 'Floor area', value: formatArea(r.areaSqFt as number) },
			{ label: 'Waste allowed', value: `${n(r.wastePct as number)} %` },
			{ label: 'Needed with waste', value: formatArea(r.neededSqFt as number) },
			{ label: 'The cartons cover', value: formatArea(r.suppliedSqFt as number) }
		]
	}),
	roll: (r) => {
		const t = r as unknown as RollTakeoff;
		const along = (d: 'x' | 'y') => (d === 'x' ? 'along the width' : 'along the length');
		return {
			headline: `${formatLength(t.orderLengthIn)} of ${formatLength(t.rollWidthIn)} roll`,
			figures: [
				{
					label: 'Order',
					value: `${n(t.orderLinFt)} lin ft · ${n(t.orderSqYd)} yd² · ${formatArea(t.orderSqFt)}`
				},
				{ label: 'Drops', value: `${t.drops.length}, run ${along(t.direction)}` },
				{
					label: 'Seams',
					value: t.seams ? `${t.seams}, ${formatLength(t.seamLengthIn)} in all` : 'None'
				},
				{ label: 'Cut length (trim included)', value: formatLength(t.cutLengthIn) },
				{
					label: `The other way (${along(t.other.direction)})`,
					value: `${formatLength(t.other.orderLengthIn)}, ${plural(t.other.seams, 'seam')}`
				}
			]
		};
	},
	underlayment: (r) => {
		const t = r as unknown as UnderlaymentTakeoff & { count: FastenerCount };
		return {
			headline: plural(t.panels, 'panel'),
			figures: [
				{ label: 'Panel', value: formatArea(t.panelSqFt) },
				{ label: 'Schedule', value: t.schedule.name },
				{
					label: 'Fasteners per panel',
					value: `${t.count.perPanel} (${t.count.perimeter} edge, ${t.count.field} field)`
				},
				{ label: 'Fasteners in all', value: String(t.fasteners) },
				...(t.boxes !== undefined ? [{ label: 'Boxes', value: String(t.boxes) }] : [])
			]
		};
	},
	patch: (r) => {
		const t = r as unknown as PatchTakeoff & { cureHours?: number };
		return {
			headline: plural(t.containers, 'container'),
			figures: [
				{
					label: 'Volume to fill',
					value: `${n(t.volumeCuIn)} in³ (${n(t.volumeUsGal, 3)} US gal)`
				},
				{ label: 'One container holds', value: `${n(t.containerCuIn)} in³` },
				...(t.cureHours
					? [{ label: 'Wait before traffic (store setting)', value: `${t.cureHours} h` }]
					: [])
			]
		};
	},
	leveller: (r) => {
		const t = r as unknown as LevellerTakeoff;
		return {
			headline: plural(t.bags, 'bag'),
			figures: [
				{ label: 'Volume to fill', value: `${n(t.volumeCuFt, 3)} ft³` },
				...(t.coverageSqFtPerBag !== undefined
					? [{ label: 'One bag covers', value: formatArea(t.coverageSqFtPerBag) }]
					: [])
			]
		};
	},
	joists: (r) => {
		const t = r as unknown as JoistResult;
		const [deflection] = t.checks;
		return {
			...verdictOf(r, `L/${Math.floor(t.lOverDelta)} against L/${deflection.limit}`),
			figures: [
				{
					label: 'Deflection under live load',
					value: `${n(t.liveDeflectionIn, 3)} in (L/${Math.floor(t.lOverDelta)})`
				},
				{
					label: 'Bending stress',
					value: `${Math.round(t.bendingStressPsi)} psi of ${Math.round(t.fbAllowedPsi)} psi allowed`
				},
				{ label: 'Longest span that passes', value: t.maxSpanText },
				{ label: 'Limited by', value: t.governs }
			],
			checks: checksOf(t.checks)
		};
	},
	sheathing: (r) => ({
		...verdictOf(r, 'subfloor thickness and rating'),
		figures: [],
		checks: checksOf(r.checks as Check[])
	}),
	flatness: (r) => {
		const list = r.checks as Check[];
		return {
			...(list.length ? verdictOf(r, r.rule) : { headline: 'No flatness rule for this floor' }),
			figures: [],
			checks: checksOf(list)
		};
	},
	moisture: (r) => ({
		...verdictOf(r, `${plural((r.checks as Check[]).length, 'check')}`),
		figures: [],
		checks: checksOf(r.checks as Check[])
	})
};

/**
 * The answer of a calculator as the page shows it (a metric store reads room areas in m²);
 * undefined for a refusal (`ok: false`).
 */
export function summarize(
	name: CalculatorName,
	r: CalculatorResult,
	options: { metric?: boolean } = {}
): Summary | undefined {
	if (!r.ok) return undefined;
	const parts = describe[name](r, !!options.metric);
	const cautions = [...r.cautions];
	if (STRUCTURAL.includes(name)) cautions.push(CONFIRM_WITH_PROFESSIONAL);
	return {
		checks: [],
		warnings: [],
		...parts,
		rule: r.rule,
		source: r.source,
		cautions
	};
}
