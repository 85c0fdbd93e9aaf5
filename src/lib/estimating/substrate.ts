/**
 * Substrate checks against what the chosen floor needs: joists, sheathing, flatness and
 * moisture. Each failed check carries the prep that fixes it and its cautions. Planning aids,
 * never an engineer's stamp.
 */
import type { CautionKind } from './cautions';
import { countWithin, LIMITS } from './limits';
import { ceilUnits, floorUnits } from './math';
import type { PrepKind } from './prep';
import type { FlatnessRule, FloorKind, JoistSize, Species, StoreSettings } from './settings';
import { formatLength, GRAMS_PER_LB } from './units';

export type CheckKind =
	| 'joist_deflection'
	| 'joist_bending'
	| 'sheathing_boards'
	| 'sheathing_span_rating'
	| 'sheathing_floor_minimum'
	| 'flatness'
	| 'moisture_rh'
	| 'moisture_rh_tests'
	| 'moisture_mver'
	| 'moisture_mver_tests'
	| 'wood_subfloor_mc'
	| 'wood_mc_difference'
	| 'tile_subfloor'
	| 'door_clearance';

export interface SuggestedPrep {
	kind: PrepKind;
	note: string;
}

/** One check: what was measured against what the floor needs, and what to do if it fails. */
export interface Check {
	check: CheckKind;
	pass: boolean;
	measured: number;
	limit: number;
	unit: string;
	message: string;
	rule: string;
	source: string;
	suggestedPrep: SuggestedPrep[];
	cautions: CautionKind[];
}

/** Relative slack so a value exactly at a limit passes despite float noise. */
const AT_LIMIT = 1e-9;
const atMost = (v: number, limit: number) => v <= limit + AT_LIMIT * Math.max(1, Math.abs(limit));
const atLeast = (v: number, limit: number) => v >= limit - AT_LIMIT * Math.max(1, Math.abs(limit));

const STRUCTURE: CautionKind[] = ['planning_aid', 'structure'];

/**
 * Two lengths written so that a reader sees why one fails the other: to 1/16 in, then 1/32 and
 * 1/64 in, then thousandths, until they no longer look the same (never "3/16 in, allowed
 * 3/16 in — fails").
 */
export function lengthsApart(a: number, b: number): [string, string] {
	for (const denominator of [16, 32, 64]) {
		const x = formatLength(a, 'in', { denominator });
		const y = formatLength(b, 'in', { denominator });
		if (x !== y || a === b) return [x, y];
	}
	for (const digits of [3, 4, 6]) {
		const x = `${trimDigits(a, digits)} in`;
		const y = `${trimDigits(b, digits)} in`;
		if (x !== y) return [x, y];
	}
	return [`${a} in`, `${b} in`];
}
const trimDigits = (n: number, digits: number) => n.toFixed(digits).replace(/\.?0+$/, '');

// ---------------------------------------------------------------- panel thickness names

/**
 * What panels are called and what they measure: a Performance Category (the nominal name,
 * "5/8 in") and its actual thickness (19/32 in). PS 1 / PS 2 Performance Categories
 * (secondary, TRADE.md "Added for the trade-completeness work").
 */
export const PANEL_THICKNESS: readonly { nominalIn: number; actualIn: number; name: string }[] = [
	{ nominalIn: 1 / 2, actualIn: 15 / 32, name: '1/2' },
	{ nominalIn: 5 / 8, actualIn: 19 / 32, name: '5/8' },
	{ nominalIn: 3 / 4, actualIn: 23 / 32, name: '3/4' },
	{ nominalIn: 7 / 8, actualIn: 27 / 32, name: '7/8' }
];
const sameIn = (a: number, b: number) => Math.abs(a - b) < 1e-6;

/** The Performance Category a thickness names or measures (nominal or actual), if any. */
export function panelCategory(thicknessIn: number) {
	return PANEL_THICKNESS.find(
		(r) => sameIn(r.nominalIn, thicknessIn) || sameIn(r.actualIn, thicknessIn)
	);
}

/**
 * The least actual thickness that meets a minimum stated either way: a minimum of "5/8 in" is
 * met by a 19/32 in panel (its actual); a minimum stated as an actual (23/32 in) is itself.
 */
export function panelMinimumIn(minIn: number): number {
	return panelCategory(minIn)?.actualIn ?? minIn;
}

/** "19/32 in (5/8 Performance Category)", or the plain length when no category fits. */
export function panelText(thicknessIn: number): string {
	const c = panelCategory(thicknessIn);
	const t = formatLength(thicknessIn, 'in', { denominator: 32 });
	if (!c) return t;
	return sameIn(c.actualIn, thicknessIn)
		? `${t} (${c.name} in Performance Category)`
		: `${t} nominal (${formatLength(c.actualIn, 'in', { denominator: 32 })} actual)`;
}

/** The highest of readings, at most `LIMITS.listItems` of them (no list spread into a call). */
function highest(xs: readonly number[], path: string): number {
	countWithin(xs.length, path, 'readings', LIMITS.listItems);
	let max = -Infinity;
	for (const x of xs) if (x > max) max = x;
	return max;
}

// ---------------------------------------------------------------- joists

export interface JoistInput {
	size: JoistSize;
	species: Species;
	/** On-centre spacing, in. */
	spacingIn: number;
	/** Span between supports, in. */
	spanIn: number;
	/** Required L/Δ under live load (360, 720...). */
	ratio: number;
	/** Members side by side (2 when sistered). */
	plies?: number;
	livePsf?: number;
	deadPsf?: number;
}

export interface JoistResult {
	ePsi: number;
	/** Reference Fb and the allowable F'b = Fb × CD × CF × Cr, psi. */
	fbPsi: number;
	fbAllowedPsi: number;
	cf: number;
	iIn4: number;
	sIn3: number;
	/** Live and total load per inch of joist, lb/in. */
	liveLbPerIn: number;
	totalLbPerIn: number;
	liveDeflectionIn: number;
	/** The deflection the ratio allows at this span, in (L ÷ ratio). */
	allowedDeflectionIn: number;
	/** Span over live-load deflection. */
	lOverDelta: number;
	bendingStressPsi: number;
	/** Longest span passing deflection and bending, exact, in. */
	maxSpanIn: number;
	/** Rounded to the inch per settings (down by default, as the engine's own rule). */
	maxSpanRoundedIn: number;
	maxSpanText: string;
	/**
	 * The longest whole-inch span that passes both checks as they are run: a span the IRC table
	 * prints (its exact span rounded to the nearest inch) passes, so this is what messages name.
	 */
	passSpanIn: number;
	governs: 'deflection' | 'bending';
	checks: [Check, Check];
}

/**
 * Joist check under uniform load on a simple span: δ = 5wL⁴/(384EI) (AISC Manual Table 3-23,
 * case 1) against L/ratio; bending fb = wL²/8 ÷ S against F'b = Fb·CD·CF·Cr (NDS); and the
 * longest span passing both.
 */
export function joistCheck(input: JoistInput, settings: StoreSettings['joists']): JoistResult {
	const lumber = settings.lumber[input.species];
	const plies = input.plies ?? 1;
	const b = settings.widthIn * plies;
	const d = settings.depthIn[input.size];
	// NDS Supplement Table 1B (published): I = bd³/12, S = bd²/6
	const iIn4 = (b * d ** 3) / 12;
	const sIn3 = (b * d ** 2) / 6;
	const cf = lumber.sizeFactor ? settings.cf[input.size] : 1;
	const fbPsi = lumber.fbPsi[input.size];
	const fbAllowedPsi = fbPsi * settings.cd * cf * settings.cr;
	const live = input.livePsf ?? settings.livePsf;
	const dead = input.deadPsf ?? settings.deadPsf;
	// psf × spacing (ft) = lb/ft; ÷ 12 = lb/in
	const liveLbPerIn = (live * input.spacingIn) / 144;
	const totalLbPerIn = ((live + dead) * input.spacingIn) / 144;
	const L = input.spanIn;
	const e = lumber.ePsi;
	const liveDeflectionIn = (5 * liveLbPerIn * L ** 4) / (384 * e * iIn4);
	const lOverDelta = L / liveDeflectionIn;
	const bendingStressPsi = (totalLbPerIn * L ** 2) / 8 / sIn3;
	const deflectionSpan = Math.cbrt((384 * e * iIn4) / (5 * liveLbPerIn * input.ratio));
	const bendingSpan = Math.sqrt((8 * fbAllowedPsi * sIn3) / totalLbPerIn);
	const maxSpanIn = Math.min(deflectionSpan, bendingSpan);
	const maxSpanRoundedIn =
		settings.spanRounding === 'nearest' ? Math.round(maxSpanIn) : floorUnits(maxSpanIn);
	const maxSpanText = formatLength(maxSpanRoundedIn);
	const what = `${plies > 1 ? `${plies}-ply ` : ''}${input.size} ${lumber.label} at ${input.spacingIn} in o.c.`;
	// Span tables (IRC Table R502.3.1(2), published) print the longest span to the inch; a joist
	// at a printed span must not fail by the fraction the print rounded away. Each check passes up
	// to its own longest span rounded to the nearest inch.
	const deflectionExact = atLeast(lOverDelta, input.ratio);
	const bendingExact = atMost(bendingStressPsi, fbAllowedPsi);
	const deflectionPass = deflectionExact || atMost(L, Math.round(deflectionSpan));
	const bendingPass = bendingExact || atMost(L, Math.round(bendingSpan));
	const allowedDeflectionIn = L / input.ratio;
	// The longest whole-inch span both checks pass, by the same rule: what the table prints.
	const passSpanIn = floorUnits(
		Math.min(
			Math.max(deflectionSpan, Math.round(deflectionSpan)),
			Math.max(bendingSpan, Math.round(bendingSpan))
		)
	);
	const printed = ' — within the inch the span table rounds its printed span to: passes';
	const fix = (pass: boolean): SuggestedPrep[] => {
		if (pass) return [];
		if (plies === 1) {
			const sistered = joistCheck({ ...input, plies: 2 }, settings);
			if (sistered.checks.every((c) => c.pass))
				return [
					{
						kind: 'joist_sister',
						note: `Sistering each joist full length would pass (L/${Math.round(sistered.lOverDelta)}); have a licensed professional confirm.`
					}
				];
		}
		return [
			{
				kind: 'structural_consult',
				note: 'Sistering alone would not pass: consult a licensed professional (a beam, blocking or a stiffer floor system).'
			}
		];
	};
	const source = `${lumber.source}; NDS factors CF, Cr (memory for Cr); AISC Manual Table 3-23 case 1`;
	return {
		ePsi: e,
		fbPsi,
		fbAllowedPsi,
		cf,
		iIn4,
		sIn3,
		liveLbPerIn,
		totalLbPerIn,
		liveDeflectionIn,
		allowedDeflectionIn,
		lOverDelta,
		bendingStressPsi,
		maxSpanIn,
		maxSpanRoundedIn,
		maxSpanText,
		passSpanIn,
		governs: deflectionSpan <= bendingSpan ? 'deflection' : 'bending',
		checks: [
			{
				check: 'joist_deflection',
				pass: deflectionPass,
				measured: lOverDelta,
				limit: input.ratio,
				unit: 'L/Δ',
				message: `${what} spanning ${formatLength(L)}: L/${Math.floor(lOverDelta)} (${liveDeflectionIn.toFixed(3)} in) under ${live} psf live load; the floor needs L/${input.ratio} (at most ${allowedDeflectionIn.toFixed(3)} in)${deflectionPass && !deflectionExact ? printed : ''}. Longest span that passes: ${formatLength(passSpanIn)}.`,
				rule: `δ = 5wL⁴/(384EI) ≤ L/${input.ratio}`,
				source,
				suggestedPrep: fix(deflectionPass),
				cautions: STRUCTURE
			},
			{
				check: 'joist_bending',
				pass: bendingPass,
				measured: bendingStressPsi,
				limit: fbAllowedPsi,
				unit: 'psi',
				message: `Bending stress ${Math.round(bendingStressPsi)} psi under ${live + dead} psf against F'b ${Math.round(fbAllowedPsi)} psi${bendingPass && !bendingExact ? printed : ''}.`,
				rule: "fb = wL²/8 ÷ S ≤ F'b = Fb × CD × CF × Cr",
				source,
				suggestedPrep: fix(bendingPass),
				cautions: STRUCTURE
			}
		]
	};
}

/**
 * An I-joist under live load, from the stiffness EI its maker publishes (lb·in²): the same
 * simple-span formula δ = 5wL⁴/(384EI) (AISC Manual Table 3-23, case 1) against the floor's
 * ratio for I-joists (L/480 under ceramic tile: NTCA Reference Manual, published). Bending and
 * shear are the maker's allowable values: a planning aid, confirm with the maker's tables.
 */
export function iJoistCheck(
	input: { eiLbIn2: number; spacingIn: number; spanIn: number; ratio: number; label?: string },
	settings: Pick<StoreSettings['joists'], 'livePsf'>
): Check {
	const live = settings.livePsf;
	const w = (live * input.spacingIn) / 144;
	const L = input.spanIn;
	const delta = (5 * w * L ** 4) / (384 * input.eiLbIn2);
	const lOverDelta = L / delta;
	const maxSpan = Math.cbrt((384 * input.eiLbIn2) / (5 * w * input.ratio));
	const exact = atLeast(lOverDelta, input.ratio);
	const pass = exact || atMost(L, Math.round(maxSpan));
	const passSpanIn = floorUnits(Math.max(maxSpan, Math.round(maxSpan)));
	return {
		check: 'joist_deflection',
		pass,
		measured: lOverDelta,
		limit: input.ratio,
		unit: 'L/Δ',
		message: `${input.label ?? 'I-joists'} at ${input.spacingIn} in o.c. spanning ${formatLength(L)}: L/${Math.floor(lOverDelta)} (${delta.toFixed(3)} in) under ${live} psf live load; the floor needs L/${input.ratio} (at most ${(L / input.ratio).toFixed(3)} in)${pass && !exact ? ' — within the inch a span is printed to: passes' : ''}. Longest span that passes: ${formatLength(passSpanIn)}. Bending and shear: the maker's tables.`,
		rule: `δ = 5wL⁴/(384·EI) ≤ L/${input.ratio}, EI from the maker's data`,
		source:
			"AISC Manual Table 3-23 case 1; NTCA Reference Manual (published) for L/480 under tile; EI from the maker's published data",
		suggestedPrep: pass
			? []
			: [
					{
						kind: 'structural_consult',
						note: "I-joists are not sistered like lumber: ask the maker's tables or a licensed professional for blocking, a mid-span support or a stiffer floor."
					}
				],
		cautions: STRUCTURE
	};
}

// ---------------------------------------------------------------- sheathing

export interface SheathingInput {
	kind: 'plywood' | 'osb' | 'board';
	thicknessIn: number;
	/** Panel span rating stamped on the panel, e.g. `32/16`, `24 oc`. */
	spanRating?: string;
	joistSpacingIn: number;
	/** The spacing is the store's assumption, not measured. */
	spacingAssumed?: boolean;
	floorKind?: FloorKind;
}

/** Sheathing thickness and span rating against the joist spacing and the floor's minimum. */
export function sheathingChecks(
	input: SheathingInput,
	settings: StoreSettings['sheathing']
): Check[] {
	const checks: Check[] = [];
	const spacing = input.joistSpacingIn;
	countWithin(settings.boardMinIn.length, 'boardMinIn', 'rows', LIMITS.settingsRows);
	const overlay = (need: number): SuggestedPrep[] => [
		{
			kind: 'subfloor_overlay',
			note: `Add a structural panel layer to reach at least ${formatLength(need, 'in')} total, glued and fastened to the joists' schedule.`
		}
	];
	if (input.kind === 'board') {
		const row = settings.boardMinIn.find((r) => spacing <= r.maxSpacingIn);
		const need = row?.minIn ?? Infinity;
		const pass = row !== undefined && atLeast(input.thicknessIn, need);
		checks.push({
			check: 'sheathing_boards',
			pass,
			measured: input.thicknessIn,
			limit: need,
			unit: 'in',
			message: row
				? `Board sheathing ${formatLength(input.thicknessIn, 'in')} over joists at ${spacing} in${input.spacingAssumed ? ' (assumed: joists not measured)' : ''}; needs ${formatLength(need, 'in')}.`
				: `No board sheathing rule for joists wider apart than ${settings.boardMinIn.at(-1)?.maxSpacingIn} in.`,
			rule: 'lumber sheathing thickness by joist spacing (perpendicular to joists)',
			source: 'IRC Table R503.1 (published)',
			suggestedPrep: pass ? [] : overlay(row?.minIn ?? input.thicknessIn),
			cautions: STRUCTURE
		});
	} else if (input.spanRating) {
		const allowed = settings.spanRatingFloorIn[input.spanRating.trim()];
		const pass = allowed !== undefined && atMost(spacing, allowed);
		checks.push({
			check: 'sheathing_span_rating',
			pass,
			measured: spacing,
			limit: allowed ?? 0,
			unit: 'in',
			message:
				allowed === undefined
					? `Span rating "${input.spanRating}" is not in the store's table.`
					: `Span rating ${input.spanRating} allows joists up to ${allowed} in o.c.; they are at ${spacing} in.`,
			rule: 'panel span rating against joist spacing',
			source: 'IRC Table R503.2.1.1(1) (memory; partly secondary)',
			suggestedPrep: pass ? [] : overlay(input.thicknessIn + 0.5),
			cautions: STRUCTURE
		});
	}
	const floorRows = input.floorKind ? settings.floorMinIn[input.floorKind] : undefined;
	if (floorRows) countWithin(floorRows.length, 'floorMinIn', 'rows', LIMITS.settingsRows);
	if (floorRows && input.kind !== 'board') {
		const row = floorRows.find((r) => spacing <= r.maxSpacingIn);
		const need = row ? (input.kind === 'osb' ? row.osbIn : row.plywoodIn) : Infinity;
		// Panels are named by Performance Category and measure less (PS 1 / PS 2, secondary):
		// a 19/32 in panel is a "5/8 in" panel and meets a 5/8 in minimum.
		const needActual = panelMinimumIn(need);
		const measuredActual = panelMinimumIn(input.thicknessIn);
		const pass = row !== undefined && atLeast(measuredActual, needActual);
		checks.push({
			check: 'sheathing_floor_minimum',
			pass,
			measured: input.thicknessIn,
			limit: need,
			unit: 'in',
			message: row
				? `${input.kind === 'osb' ? 'OSB' : 'Plywood'} ${panelText(input.thicknessIn)} over joists at ${spacing} in${input.spacingAssumed ? ' (assumed: joists not measured)' : ''}; this floor needs ${panelText(need)} or thicker (compared by actual thickness).`
				: `No panel rule for this floor over joists wider apart than ${floorRows.at(-1)?.maxSpacingIn} in.`,
			rule: 'subfloor panel thickness under nailed wood flooring by joist spacing; nominal and actual compared by Performance Category (PS 1 / PS 2, secondary)',
			source: 'NWFA guidance in Wood Floor Business (published)',
			suggestedPrep: pass ? [] : overlay(row ? need : input.thicknessIn),
			cautions: ['planning_aid', 'maker_instructions']
		});
	}
	return checks;
}

// ---------------------------------------------------------------- flatness

/**
 * The flatness rules for a floor over a subfloor; `null` for floors with no flatness rule
 * (carpet). A tile with any edge ≥ the large-format threshold takes the large-format rule.
 */
export function flatnessRules(
	floorKind: FloorKind,
	subfloor: 'wood' | 'concrete',
	settings: StoreSettings['flatness'],
	tileEdgesIn: readonly number[] = []
): FlatnessRule[] | null {
	if (floorKind === 'ceramic_tile' || floorKind === 'stone_tile') {
		const large = tileEdgesIn.some((e) => atLeast(e, settings.largeTileEdgeIn));
		return settings.rules[large ? 'large_tile' : 'tile'];
	}
	if (floorKind === 'vinyl_plank' || floorKind === 'sheet_vinyl')
		return settings.rules[subfloor === 'concrete' ? 'resilient_concrete' : 'resilient_wood'];
	if (floorKind === 'carpet') return null;
	return settings.rules.wood;
}

export interface FlatnessReading {
	/** Straightedge length, in. */
	spanIn: number;
	/** Largest gap under it, in. */
	gapIn: number;
	/** A low spot (default) is filled; a high spot is ground down. */
	kind?: 'low' | 'high';
}

/**
 * The rule whose straightedge length matches a reading's: the nearest by ratio (a 2 ft
 * straightedge under tile is held to 1/16 in in 12 in, not to 1/4 in in 10 ft; a 6 ft one to
 * the 10 ft rule); on a tie, the shorter (stricter) rule. Common practice: a tolerance is
 * stated for a straightedge length, and a reading is held to the one it was taken for.
 */
export function flatnessRuleFor(spanIn: number, rules: readonly FlatnessRule[]): FlatnessRule {
	countWithin(rules.length, 'rules', 'flatness rules', LIMITS.settingsRows);
	let best = rules[0];
	let bestGap = Infinity;
	for (const r of rules) {
		const gap = Math.abs(Math.log(r.overIn / spanIn));
		if (gap < bestGap - 1e-12 || (Math.abs(gap - bestGap) <= 1e-12 && r.overIn < best.overIn)) {
			best = r;
			bestGap = gap;
		}
	}
	return best;
}

/**
 * A straightedge reading against the rule for its length (`flatnessRuleFor`). A gap exactly at
 * the tolerance passes; the exact values are compared, and a message shows enough precision
 * to tell them apart.
 */
export function flatnessCheck(reading: FlatnessReading, rules: readonly FlatnessRule[]): Check {
	const rule = flatnessRuleFor(reading.spanIn, rules);
	const pass = atMost(reading.gapIn, rule.gapIn);
	const [gapText, allowedText] = pass
		? [formatLength(reading.gapIn, 'in'), formatLength(rule.gapIn, 'in')]
		: lengthsApart(reading.gapIn, rule.gapIn);
	const high = reading.kind === 'high';
	return {
		check: 'flatness',
		pass,
		measured: reading.gapIn,
		limit: rule.gapIn,
		unit: 'in',
		message: `${high ? 'High spot' : 'Gap'} of ${gapText} under a ${formatLength(reading.spanIn)} straightedge; allowed ${allowedText} in ${formatLength(rule.overIn)}${pass ? '' : ': fails'}.`,
		rule: `${formatLength(rule.gapIn, 'in')} in ${formatLength(rule.overIn)}`,
		source: rule.source,
		suggestedPrep: pass
			? []
			: high
				? [{ kind: 'grind', note: 'Grind (concrete) or plane/sand (wood) the high spot.' }]
				: [{ kind: 'level', note: 'Fill the low spot with patch or self-levelling underlayment.' }],
		cautions: pass ? ['maker_instructions'] : ['maker_instructions', 'dust_tools']
	};
}

// ---------------------------------------------------------------- moisture

/** Tests an area needs: `first` for the first block, one more per further block or part. */
export function testsNeeded(
	areaSqFt: number,
	rule: { first: number; firstSqFt: number; perSqFt: number }
): number {
	return rule.first + ceilUnits(Math.max(0, areaSqFt - rule.firstSqFt) / rule.perSqFt);
}

function countCheck(
	check: CheckKind,
	have: number,
	need: number,
	areaSqFt: number,
	source: string
): Check {
	const pass = have >= need;
	return {
		check,
		pass,
		measured: have,
		limit: need,
		unit: 'tests',
		message: `${have} of ${need} tests for ${Math.round(areaSqFt)} ft².`,
		rule: 'tests for the first 1000 ft², one more for each further 1000 ft² or part',
		source,
		suggestedPrep: pass ? [] : [{ kind: 'moisture_test', note: `Take ${need - have} more tests.` }],
		cautions: ['moisture']
	};
}

/** Where F2170's probes go: a share of the slab's thickness by how it dries (§10.2, secondary). */
export function probeDepthIn(
	thicknessIn: number,
	drying: 'top' | 'both',
	pct: { top: number; both: number } = { top: 40, both: 20 }
): number {
	return (thicknessIn * (drying === 'both' ? pct.both : pct.top)) / 100;
}

/**
 * How many tests a slab needs for its tested area, counted once for the slab whatever rooms it
 * runs under (ASTM F2170 §10.1, F1869: secondary), with where the probes go and how long each
 * test waits before it is read.
 */
export function slabTestChecks(
	slab: {
		label: string;
		areaSqFt: number;
		rh: number;
		cc: number;
		/** A floor with a moisture limit goes on it: with no test taken, RH tests are still due. */
		needsTests?: boolean;
		thicknessIn?: number;
		drying?: 'top' | 'both';
	},
	settings: StoreSettings['moisture'],
	waits: { rh: number; calciumChloride: number }
): Check[] {
	const checks: Check[] = [];
	const depth =
		slab.thicknessIn === undefined
			? 'measure the slab’s thickness to set the probe depth (40 % drying from the top only, 20 % drying both ways)'
			: `probes ${formatLength(probeDepthIn(slab.thicknessIn, slab.drying ?? 'top', settings.probeDepthPct), 'in', { denominator: 8 })} deep (${slab.drying === 'both' ? (settings.probeDepthPct?.both ?? 20) : (settings.probeDepthPct?.top ?? 40)} % of a ${formatLength(slab.thicknessIn, 'in')} slab drying ${slab.drying === 'both' ? 'both ways' : 'from the top only'})`;
	const one = (
		check: CheckKind,
		have: number,
		rule: { first: number; firstSqFt: number; perSqFt: number },
		what: string,
		wait: string,
		source: string
	) => {
		const need = testsNeeded(slab.areaSqFt, rule);
		const pass = have >= need;
		checks.push({
			check,
			pass,
			measured: have,
			limit: need,
			unit: 'tests',
			message: `${slab.label}: ${have} of ${need} ${what} for ${Math.round(slab.areaSqFt)} ft² of slab; ${wait}.`,
			rule: `${rule.first} tests for the first ${rule.firstSqFt} ft² of the slab, one more for each further ${rule.perSqFt} ft² or part`,
			source,
			suggestedPrep: pass
				? []
				: [{ kind: 'moisture_test', note: `Take ${need - have} more ${what} on this slab.` }],
			cautions: ['moisture']
		});
	};
	// No test taken yet under a floor with a moisture limit: the RH probes the slab needs come
	// first (ASTM F2170, secondary; F710 names it for resilient floors), never skipped.
	if (slab.rh > 0 || (slab.cc === 0 && slab.needsTests === true))
		one(
			'moisture_rh_tests',
			slab.rh,
			settings.rhTests,
			'RH probes',
			`${depth}; read ${waits.rh} h after the probes are set`,
			'ASTM F2170 §10.1–10.2 (secondary)'
		);
	if (slab.cc > 0)
		one(
			'moisture_mver_tests',
			slab.cc,
			settings.mverTests,
			'calcium chloride tests',
			`dishes stay sealed ${waits.calciumChloride} h before weighing`,
			'ASTM F1869 (secondary)'
		);
	return checks;
}

const concreteFix: SuggestedPrep[] = [
	{
		kind: 'moisture_barrier',
		note: 'Use a moisture barrier the floor maker allows, or let the slab dry and retest.'
	}
];

/** In-situ RH probes (ASTM F2170) against the limit, and whether there are enough of them. */
export function rhChecks(
	input: { readingsPct: readonly number[]; areaSqFt: number; limitPct: number },
	settings: StoreSettings['moisture']
): Check[] {
	const worst = highest(input.readingsPct, 'readingsPct');
	const pass = atMost(worst, input.limitPct);
	return [
		{
			check: 'moisture_rh',
			pass,
			measured: worst,
			limit: input.limitPct,
			unit: '% RH',
			message: `Highest in-situ RH ${worst} %; the floor allows ${input.limitPct} %.`,
			rule: `every probe ≤ ${input.limitPct} % RH`,
			source: 'ASTM F710 / ASTM F2170 (secondary)',
			suggestedPrep: pass ? [] : concreteFix,
			cautions: ['moisture']
		},
		countCheck(
			'moisture_rh_tests',
			input.readingsPct.length,
			testsNeeded(input.areaSqFt, settings.rhTests),
			input.areaSqFt,
			'ASTM F2170 §10.1 (secondary)'
		)
	];
}

export interface CalciumChlorideTest {
	/** Weight gain of the dish, g. */
	gainGrams: number;
	/** Area under the test dome, ft². */
	areaSqFt: number;
	/** Exposure, h. */
	hours: number;
}

/**
 * Moisture vapour emission rate, lb/1000 ft²/24 h: 24,000 × gain ÷ (g per lb × area × hours)
 * (ASTM F1869, secondary). The exact pound (453.59237 g) is used; the secondary quote's
 * 453.612 differs by 0.004 %.
 */
export function mver(test: CalciumChlorideTest): number {
	return (24_000 * test.gainGrams) / (GRAMS_PER_LB * test.areaSqFt * test.hours);
}

/** Calcium-chloride tests against the MVER limit, and whether there are enough of them. */
export function mverChecks(
	input: { tests: readonly CalciumChlorideTest[]; areaSqFt: number; limit: number },
	settings: StoreSettings['moisture']
): Check[] {
	countWithin(input.tests.length, 'tests', 'tests', LIMITS.listItems);
	const worst = highest(input.tests.map(mver), 'tests');
	const pass = atMost(worst, input.limit);
	return [
		{
			check: 'moisture_mver',
			pass,
			measured: worst,
			limit: input.limit,
			unit: 'lb/1000 ft²/24 h',
			message: `Highest MVER ${worst.toFixed(2)} lb/1000 ft²/24 h; the floor allows ${input.limit}.`,
			rule: 'MVER = 24,000 × gain (g) ÷ (453.59 × area (ft²) × hours)',
			source: 'ASTM F1869 (secondary)',
			suggestedPrep: pass ? [] : concreteFix,
			cautions: ['moisture']
		},
		countCheck(
			'moisture_mver_tests',
			input.tests.length,
			testsNeeded(input.areaSqFt, settings.mverTests),
			input.areaSqFt,
			'ASTM F1869 (memory)'
		)
	];
}

const mean = (xs: readonly number[]) => xs.reduce((t, x) => t + x, 0) / xs.length;

/**
 * Wood moisture: the subfloor's highest reading against its maximum, and the difference
 * between subfloor and flooring averages by board width (NWFA installation guidelines,
 * published via Hardwood Floors 2017).
 */
export function woodMoistureChecks(
	input: { subfloorPct: readonly number[]; flooringPct: readonly number[]; boardWidthIn?: number },
	settings: StoreSettings['moisture']
): Check[] {
	const source = 'NWFA installation guidelines (published, via Hardwood Floors 2017)';
	const retest: SuggestedPrep[] = [
		{
			kind: 'moisture_retest',
			note: 'Let the subfloor dry or the flooring acclimate, then retest.'
		}
	];
	const checks: Check[] = [];
	countWithin(input.flooringPct.length, 'flooringPct', 'readings', LIMITS.listItems);
	if (input.subfloorPct.length > 0) {
		const worst = highest(input.subfloorPct, 'subfloorPct');
		const pass = atMost(worst, settings.woodSubfloorMaxPct);
		checks.push({
			check: 'wood_subfloor_mc',
			pass,
			measured: worst,
			limit: settings.woodSubfloorMaxPct,
			unit: '% MC',
			message: `Highest subfloor reading ${worst} % MC; at most ${settings.woodSubfloorMaxPct} %.`,
			rule: `wood subfloor ≤ ${settings.woodSubfloorMaxPct} % MC`,
			source,
			suggestedPrep: pass ? [] : retest,
			cautions: ['moisture']
		});
	}
	if (input.subfloorPct.length > 0 && input.flooringPct.length > 0) {
		const wide = atLeast(input.boardWidthIn ?? 0, settings.wideFromIn);
		const limit = wide ? settings.woodDiffWidePct : settings.woodDiffStripPct;
		const diff = Math.abs(mean(input.subfloorPct) - mean(input.flooringPct));
		const pass = atMost(diff, limit);
		checks.push({
			check: 'wood_mc_difference',
			pass,
			measured: diff,
			limit,
			unit: '% MC',
			message: `Subfloor and flooring differ by ${diff.toFixed(1)} % MC; ${wide ? 'wide plank' : 'strip'} flooring allows ${limit} %.`,
			rule: `|subfloor − flooring| ≤ ${limit} % (${wide ? `boards ${settings.wideFromIn} in or wider` : `boards under ${settings.wideFromIn} in`})`,
			source,
			suggestedPrep: pass ? [] : retest,
			cautions: ['moisture']
		});
	}
	return checks;
}
