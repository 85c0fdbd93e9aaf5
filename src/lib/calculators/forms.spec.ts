import { describe, expect, it } from 'vitest';
import { defaultSettings, type StoreSettings } from '$lib/estimating';
import { calculators, type CalculatorName } from './registry';
import { calculatorExamples } from './examples';
import { CALCULATOR_CATALOGUE } from './catalogue';
import { evaluate } from './evaluate';
import {
	addRow,
	CALCULATOR_ORDER,
	calculatorSettings,
	forms,
	isCalculatorName,
	removeRow,
	rowCount,
	SHAPE_ROWS,
	type Values
} from './forms';

const s = calculatorSettings(defaultSettings);

/** What a person types to get each calculator's example body (rooms in feet, small in inches). */
const typed: Record<CalculatorName, Values> = {
	cartons: { areaSqFt: '120', coverageSqFt: '20.5 sq ft', layout: 'straight' },
	area: {
		'shape.kind': 'rect',
		'shape.width': `12'`,
		'shape.length': '10',
		'cutouts.rows': '1',
		'cutouts.0.name': 'Island',
		'cutouts.0.x': '40"',
		'cutouts.0.y': `3' 4"`,
		'cutouts.0.width': '4',
		'cutouts.0.length': '2 6'.replace(' ', "' ") + '"'
	},
	joists: {
		size: '2x10',
		species: 'spruce_pine_fir',
		spacingIn: '16',
		spanIn: '14',
		floorKind: 'ceramic_tile'
	},
	roll: { 'shape.width': '12', 'shape.length': `10'`, rollWidthIn: '12 ft', direction: '' },
	underlayment: { areaSqFt: '300', schedule: 'apa_quarter_in', perBox: '1000' },
	patch: {
		'voids.0.lengthIn': '8',
		'voids.0.widthIn': '1/4',
		'voids.0.depthIn': '1/8"',
		containerKind: 'volume',
		'container.volumeCuIn': '1 gal'
	},
	leveller: { areaSqFt: '10 x 10', depthIn: '1/4', bagYieldCuFt: '0.45' },
	sheathing: {
		kind: 'plywood',
		thicknessIn: '5/8',
		joistSpacingIn: '16',
		floorKind: 'hardwood'
	},
	flatness: {
		floorKind: 'ceramic_tile',
		subfloor: 'wood',
		'tileEdgesIn.0': '12',
		'tileEdgesIn.1': '24',
		'readings.0.spanIn': '10',
		'readings.0.gapIn': '1/8'
	},
	moisture: {
		areaSqFt: '1,500',
		'rhPct.rows': '3',
		'rhPct.0': '72',
		'rhPct.1': '74 %',
		'rhPct.2': '76'
	},
	units: { text: `12' 6 1/2"` }
};

describe('evaluate', () => {
	it.each(CALCULATOR_ORDER)(
		'%s: what people type gives the example body and its answer',
		(name) => {
			const ev = evaluate(name, typed[name], s);
			expect(ev.problems).toEqual({});
			// The page fills a select's first choice where the example leaves the field out.
			const filled = { underlayment: { schedule: 'apa_quarter_in' }, units: { defaultUnit: 'in' } };
			const expected = calculators[name].input.parse({
				...calculatorExamples[name],
				...(filled as Record<string, object>)[name]
			});
			expect(ev.input).toEqual(expected);
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			expect(ev.result).toEqual(calculators[name].run(expected as any, defaultSettings));
		}
	);

	it('lists every calculator of the engine, and no other name', () => {
		expect([...CALCULATOR_ORDER].sort()).toEqual(Object.keys(calculators).sort());
		// The list (plain data, shipped without the engine) and the forms name the same ones.
		expect([...CALCULATOR_ORDER].sort()).toEqual(Object.keys(forms).sort());
		for (const name of CALCULATOR_ORDER)
			expect(CALCULATOR_CATALOGUE[name].title).toBe(calculators[name].title);
		expect(isCalculatorName('cartons')).toBe(true);
		expect(isCalculatorName('constructor')).toBe(false);
		expect(isCalculatorName('__proto__')).toBe(false);
	});

	it('gives the cartons arithmetic: 120 ft² × 1.10 ÷ 20.5 ft² = 6.44 → 7 cartons', () => {
		const ev = evaluate('cartons', typed.cartons, s);
		expect(ev.result).toMatchObject({ cartons: 7, wastePct: 10 });
		expect(ev.readAs.areaSqFt).toBe('120 ft² · 11.15 m²');
	});

	it("applies the store's own settings (its waste for the layout)", () => {
		const store: StoreSettings = structuredClone(defaultSettings);
		store.wastePct.diagonal = 30;
		const ev = evaluate(
			'cartons',
			{ ...typed.cartons, layout: 'diagonal' },
			calculatorSettings(store)
		);
		// 120 × 1.30 ÷ 20.5 = 7.61 → 8
		expect(ev.result).toMatchObject({ cartons: 8, wastePct: 30 });
	});

	it('puts an unreadable length by its field, never throwing', () => {
		const ev = evaluate('joists', { ...typed.joists, spanIn: `14' 6 1/0"` }, s);
		expect(ev.result).toBeUndefined();
		expect(ev.problems.spanIn).toEqual({
			message: expect.stringContaining("a fraction's bottom cannot be 0"),
			missing: false
		});
		const bad = evaluate('area', { ...typed.area, 'cutouts.0.width': 'wide' }, s);
		expect(bad.problems['cutouts.0.width'].message).toContain('"wide"');
	});

	it('marks fields not typed yet as missing, so the page waits before showing them', () => {
		const ev = evaluate('cartons', {}, s);
		expect(ev.problems.areaSqFt).toEqual({ message: 'Enter the floor area', missing: true });
		expect(ev.problems.coverageSqFt.missing).toBe(true);
		expect(ev.problems.wastePct).toBeUndefined();
		expect(evaluate('flatness', { floorKind: 'carpet' }, s).problems.readings).toEqual({
			message: 'Enter at least one reading',
			missing: true
		});
	});

	it('skips blank rows and names a bad row by the row it was typed in', () => {
		const values = {
			...typed.flatness,
			'readings.rows': '3',
			'readings.2.spanIn': '6',
			'readings.2.gapIn': 'huge'
		};
		const ev = evaluate('flatness', values, s);
		expect(Object.keys(ev.problems)).toEqual(['readings.2.gapIn']);
		const ok = evaluate('flatness', { ...values, 'readings.2.gapIn': '1/4' }, s);
		expect((ok.input as { readings: unknown[] }).readings).toHaveLength(2);
	});

	it("shows the engine's own refusal by the field it names", () => {
		const odd = evaluate('area', { 'shape.kind': 'circle', 'shape.width': '10' }, s);
		expect(odd.result).toBeUndefined();
		expect(odd.problems['shape.kind'].missing).toBe(false);
		const units = evaluate('units', { text: '12 apples' }, s);
		expect(units.result).toMatchObject({ ok: false });
		expect(units.problems.text.message).toContain('apples');
		const sides = evaluate(
			'area',
			{
				'shape.kind': 'sides',
				'shape.sides.rows': '4',
				'shape.sides.0.length': '10',
				'shape.sides.1.length': '10',
				'shape.sides.2.length': '3',
				'shape.sides.3.length': '10'
			},
			s
		);
		expect(sides.result).toMatchObject({ ok: false });
		expect(Object.keys(sides.problems)[0]).toMatch(/^shape/);
	});

	it('reads metric stores in metres and millimetres', () => {
		const metric = structuredClone(defaultSettings);
		metric.units = { system: 'metric', defaultLengthUnit: 'mm' };
		const ev = evaluate(
			'joists',
			{ ...typed.joists, spacingIn: '406.4', spanIn: '4.2672' },
			calculatorSettings(metric)
		);
		expect(ev.input).toMatchObject({
			spanIn: expect.closeTo(168, 9),
			spacingIn: expect.closeTo(16, 9)
		});
		const area = evaluate(
			'cartons',
			{ ...typed.cartons, areaSqFt: '10' },
			calculatorSettings(metric)
		);
		expect((area.input as { areaSqFt: number }).areaSqFt).toBeCloseTo(107.639, 3);
	});

	it('moisture needs a reading, and wood flooring readings need the subfloor to compare with', () => {
		expect(evaluate('moisture', { areaSqFt: '500' }, s).problems.rhPct.missing).toBe(true);
		const flooringOnly = evaluate('moisture', { areaSqFt: '500', 'woodMc.flooringPct.0': '9' }, s);
		expect(flooringOnly.problems['woodMc.subfloorPct'].message).toContain('subfloor');
		const wood = evaluate(
			'moisture',
			{
				areaSqFt: '500',
				'woodMc.subfloorPct.0': '12',
				'woodMc.flooringPct.0': '9',
				'woodMc.boardWidthIn': '5'
			},
			s
		);
		// NWFA installation guidelines (published, via Hardwood Floors 2017): wide plank ≤ 2 %
		expect(wood.result).toMatchObject({ ok: true, pass: false });
	});

	it('runs every calculator on settings without the money keys, which it never reads', () => {
		const money = new Set(['taxes', 'taxRounding', 'deposit']);
		const guarded = new Proxy(s, {
			get(target, key) {
				if (typeof key === 'string' && money.has(key)) throw new Error(`read ${key}`);
				return Reflect.get(target, key);
			}
		});
		expect(Object.keys(s).some((k) => money.has(k))).toBe(false);
		for (const name of CALCULATOR_ORDER)
			expect(evaluate(name, typed[name], guarded).result?.ok).toBe(true);
	});
});

describe('rows', () => {
	it('adds up to the maximum and removes a row, moving the later ones up', () => {
		let v: Values = { 'readings.0.spanIn': 'a', 'readings.1.spanIn': 'b', 'readings.rows': '2' };
		v = addRow(v, 'flatness', 'readings');
		expect(v['readings.rows']).toBe('3');
		v = { ...v, 'readings.2.spanIn': 'c' };
		v = removeRow(v, 'flatness', 'readings', 0);
		expect(v).toMatchObject({
			'readings.0.spanIn': 'b',
			'readings.1.spanIn': 'c',
			'readings.rows': '2'
		});
		expect(v['readings.2.spanIn']).toBeUndefined();
		// The last row of a group that needs one stays.
		const one = removeRow({ 'readings.rows': '1' }, 'flatness', 'readings', 0);
		expect(one['readings.rows']).toBe('1');
		expect(addRow({}, 'flatness', 'nothing')).toEqual({});
	});

	it('lets cut-outs have none, and walls at least three', () => {
		expect(rowCount({}, SHAPE_ROWS.cutouts)).toBe(0);
		expect(rowCount({ 'shape.sides.rows': '1' }, SHAPE_ROWS.sides)).toBe(3);
		expect(rowCount({ 'shape.sides.rows': '999' }, SHAPE_ROWS.sides)).toBe(60);
		const v = removeRow({ 'cutouts.rows': '1', 'cutouts.0.name': 'Island' }, 'area', 'cutouts', 0);
		expect(v).toEqual({ 'cutouts.rows': '0' });
	});
});
