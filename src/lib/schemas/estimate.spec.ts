import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { estimate } from '$lib/estimating';
import { samplePriceBook, sampleJob } from '$lib/estimating/sample';
import { defaultSettings } from '$lib/estimating/settings';
import { calculators, estimateInputSchema, roomSchema, shapeSchema } from './estimate';

const examples: { [K in keyof typeof calculators]: unknown } = {
	units: { text: `12' 6 1/2"` },
	area: {
		shape: { kind: 'rect', widthIn: 144, lengthIn: 120 },
		cutouts: [
			{ name: 'Island', shape: { kind: 'rect', xIn: 40, yIn: 40, widthIn: 48, lengthIn: 30 } }
		]
	},
	cartons: { areaSqFt: 120, coverageSqFt: 20.5, layout: 'straight' },
	roll: { shape: { kind: 'rect', widthIn: 144, lengthIn: 120 }, rollWidthIn: 144 },
	underlayment: { areaSqFt: 300, perBox: 1000 },
	patch: {
		voids: [{ lengthIn: 96, widthIn: 0.25, depthIn: 0.125 }],
		container: { volumeCuIn: 231 }
	},
	leveller: { areaSqFt: 100, depthIn: 0.25, bagYieldCuFt: 0.45 },
	joists: {
		size: '2x10',
		species: 'spruce_pine_fir',
		spacingIn: 16,
		spanIn: 168,
		floorKind: 'stone_tile'
	},
	sheathing: { kind: 'board', thicknessIn: 0.625, joistSpacingIn: 24 },
	flatness: {
		floorKind: 'ceramic_tile',
		subfloor: 'wood',
		tileEdgesIn: [12, 24],
		readings: [{ spanIn: 120, gapIn: 0.125 }]
	},
	moisture: { areaSqFt: 1500, rhPct: [72, 74, 76] }
};

describe('estimate input schema', () => {
	it('accepts a whole sample job with the default settings and sample price book', () => {
		const input = { job: sampleJob(12), settings: defaultSettings, priceBook: samplePriceBook };
		const parsed = estimateInputSchema.parse(JSON.parse(JSON.stringify(input)));
		expect(estimate(parsed)).toEqual(estimate(input));
	});

	it('rejects bad fields with their path', () => {
		const bad = roomSchema.safeParse({
			id: 'r1',
			name: 'Hall',
			shape: { kind: 'rect', widthIn: -3, lengthIn: 100 },
			subfloor: { kind: 'dirt' }
		});
		expect(bad.success).toBe(false);
		const paths = bad.error!.issues.map((i) => i.path.join('.'));
		expect(paths).toEqual(expect.arrayContaining(['shape.widthIn', 'subfloor.kind']));
		expect(shapeSchema.safeParse({ kind: 'points', points: [[0, 0]] }).success).toBe(false);
	});

	it('turns into JSON Schema with the field descriptions (for OpenAPI docs)', () => {
		const json = JSON.stringify(z.toJSONSchema(estimateInputSchema));
		expect(json).toContain('Existing floors to tear out, top first');
		expect(json).toContain('integer cents');
	});
});

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
