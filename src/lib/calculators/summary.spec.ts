import { describe, expect, it } from 'vitest';
import { CAUTIONS, defaultSettings } from '$lib/estimating';
import { calculators } from './registry';
import { calculatorExamples } from './examples';
import { CALCULATOR_ORDER } from './forms';
import { CONFIRM_WITH_PROFESSIONAL, STRUCTURAL, summarize } from './summary';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const run = (name: keyof typeof calculators, body: unknown): any =>
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	calculators[name].run(calculators[name].input.parse(body) as any, defaultSettings);

describe('summarize', () => {
	it.each(CALCULATOR_ORDER)('%s: a headline, the rule, its source and the cautions', (name) => {
		const r = run(name, calculatorExamples[name]);
		const summary = summarize(name, r)!;
		expect(summary.headline.length).toBeGreaterThan(0);
		expect(summary.rule).toBe(r.rule);
		expect(summary.source).toBe(r.source);
		expect(summary.cautions).toEqual(
			STRUCTURAL.includes(name) ? [...r.cautions, CONFIRM_WITH_PROFESSIONAL] : r.cautions
		);
	});

	it('says the cartons and the numbers behind them', () => {
		const s = summarize('cartons', run('cartons', calculatorExamples.cartons))!;
		expect(s.headline).toBe('7 cartons');
		expect(s.figures).toContainEqual({ label: 'Needed with waste', value: '132 ft²' });
		expect(s.cautions).toEqual([CAUTIONS.maker_instructions]);
	});

	it('gives joists a verdict, the longest span and the licensed-professional line', () => {
		// 2x10 SPF No.2 at 16 in, 14 ft: L/504 ≥ L/360 for ceramic tile (NTCA Reference Manual, published)
		const s = summarize('joists', run('joists', calculatorExamples.joists))!;
		expect(s).toMatchObject({ verdict: 'pass', headline: 'Passes: L/504 against L/360' });
		expect(s.figures).toContainEqual({ label: 'Longest span that passes', value: `15' 4"` });
		const stone = summarize(
			'joists',
			run('joists', { ...calculatorExamples.joists, floorKind: 'stone_tile' })
		)!;
		expect(stone.verdict).toBe('fail');
		expect(stone.checks[0].notes[0]).toContain('Sistering');
		expect(stone.cautions.join(' ')).toContain('licensed professional');
	});

	it('draws the area and keeps refusals out', () => {
		const s = summarize('area', run('area', calculatorExamples.area))!;
		// 144 × 120 − 48 × 30 = 15,840 in² = 110 ft²
		expect(s.headline).toBe('110 ft²');
		expect(s.outline?.holes).toHaveLength(1);
		expect(summarize('units', run('units', { text: 'soon' }))).toBeUndefined();
		// 110 ft² × 0.09290304 = 10.22 m² (exact factor, published)
		expect(
			summarize('area', run('area', calculatorExamples.area), { metric: true })?.headline
		).toBe('10.22 m²');
	});

	it('moisture always carries the caution to confirm', () => {
		const s = summarize('moisture', run('moisture', calculatorExamples.moisture))!;
		// 76 % > 75 % (ASTM F710 / ASTM F2170, secondary)
		expect(s.verdict).toBe('fail');
		expect(s.cautions).toContain(CONFIRM_WITH_PROFESSIONAL);
		expect(s.cautions).toContain(CAUTIONS.moisture);
	});
});
