import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { calculatorExamples } from './examples';
import { calculators, isRefusal } from './registry';

// The API's examples, with stone under the joists and boards at 24 in for these checks.
const examples: { [K in keyof typeof calculators]: unknown } = {
	...calculatorExamples,
	joists: { ...calculatorExamples.joists, floorKind: 'stone_tile' },
	sheathing: { kind: 'board', thicknessIn: 0.625, joistSpacingIn: 24 }
};

describe('calculators', () => {
	it.each(Object.keys(calculators) as (keyof typeof calculators)[])(
		'%s parses its example and answers with the rule, source and cautions',
		(name) => {
			const c = calculators[name];
			expect(c.title.length).toBeGreaterThan(0);
			expect(c.summary.length).toBeGreaterThan(0);
			const input = c.input.parse(examples[name]);
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			const r = c.run(input as any);
			expect(r.ok).toBe(true);
			expect(typeof r.rule).toBe('string');
			expect(typeof r.source).toBe('string');
			expect(Array.isArray(r.cautions)).toBe(true);
			expect(() => z.toJSONSchema(c.input)).not.toThrow();
		}
	);

	it('gives the same numbers as the engine', () => {
		expect(calculators.units.run({ text: `12' 6 1/2"` })).toMatchObject({
			inches: 150.5,
			mm: '3823 mm'
		});
		expect(
			calculators.cartons.run(calculators.cartons.input.parse(examples.cartons))
		).toMatchObject({ cartons: 7 });
		const stone = calculators.joists.run(calculators.joists.input.parse(examples.joists));
		expect(stone).toMatchObject({ pass: false });
		expect(stone.cautions.join(' ')).toContain('licensed professional');
		const moisture = calculators.moisture.run(calculators.moisture.input.parse(examples.moisture));
		// 76 % > 75 % and 3 of 4 tests for 1500 ft²: ASTM F2170 (secondary)
		expect(moisture).toMatchObject({ pass: false });
		const bad = calculators.units.run({ text: '1/0' });
		expect(bad).toMatchObject({ ok: false });
	});
});

describe('work beyond the engine’s limits', () => {
	it('is answered as a refusal naming the input field and the limit, never thrown', () => {
		// run without the schema: the engine itself refuses
		const roll = calculators.roll.run({
			shape: { kind: 'rect', widthIn: 144, lengthIn: 1e11 },
			rollWidthIn: 144
		});
		expect(roll).toMatchObject({ ok: false, field: 'shape.lengthIn', limit: 6_000 });
		expect(isRefusal(roll)).toBe(true);
		const narrow = calculators.roll.run({
			shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
			rollWidthIn: 0.00001
		});
		expect(narrow).toMatchObject({ ok: false, field: 'rollWidthIn', limit: 12 });
		const moisture = calculators.moisture.run({
			areaSqFt: 1000,
			rhPct: Array.from({ length: 200_000 }, () => 70)
		});
		expect(moisture).toMatchObject({ ok: false, field: 'rhPct', limit: 500 });
		const far = calculators.units.run({ text: '9'.repeat(79) + ' ft' });
		expect(far).toMatchObject({ ok: false, field: 'text', limit: 10_000_000 });
		// an unreadable length is no refusal: 200 with ok false
		expect(isRefusal(calculators.units.run({ text: '1/0' }))).toBe(false);
	});

	it('is refused by the input schemas with each field first', () => {
		const roll = calculators.roll.input.safeParse({
			shape: { kind: 'rect', widthIn: 144, lengthIn: 1e11 },
			rollWidthIn: 0.00001
		});
		expect(roll.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['shape.lengthIn', 'Length along y: at most 6,000 in'],
			['rollWidthIn', 'Roll width: at least 12 in']
		]);
		const readings = calculators.moisture.input.safeParse({
			areaSqFt: 1000,
			rhPct: Array.from({ length: 501 }, () => 70)
		});
		expect(readings.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['rhPct', 'At most 500 readings']
		]);
	});
});
