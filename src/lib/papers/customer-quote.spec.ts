import { describe, expect, it } from 'vitest';
import {
	CAUTION_KINDS,
	defaultSettings,
	estimate,
	PREP_KINDS,
	type EstimateResult
} from '$lib/estimating';
import { sampleJob, samplePriceBook } from '$lib/estimating/sample';
import {
	CAUTION_AUDIENCE,
	FINDINGS_AUDIENCE,
	HOMEOWNER_CAUTIONS,
	HOMEOWNER_FOR,
	lineQuantityAudience
} from './audience';
import { customerQuote, homeownerCautions } from './customer-quote';
import { PLAIN_PREP, plainPrep } from './plain-prep';
import { DEFAULT_PAPERS, papersOf } from './store-papers';
import { IN_HOUSE, inHouseWord } from './testing';

const input = { job: sampleJob(12, 1975), settings: defaultSettings, priceBook: samplePriceBook };
const result = estimate(input);
const paper = customerQuote({ input, result }, { currency: 'USD', papers: DEFAULT_PAPERS });

describe('who reads what', () => {
	it('every engine caution has a reader, and those the homeowner reads have homeowner words', () => {
		for (const kind of CAUTION_KINDS) {
			expect(CAUTION_AUDIENCE[kind]).toMatch(/^(customer|installer|both)$/);
			if (CAUTION_AUDIENCE[kind] !== 'installer') expect(HOMEOWNER_FOR[kind]).toBeDefined();
		}
		expect(CAUTION_AUDIENCE.dust_tools).toBe('both');
		expect(CAUTION_AUDIENCE.moisture).toBe('installer');
		expect(FINDINGS_AUDIENCE).toBe('installer');
		expect(lineQuantityAudience({ type: 'supply', kind: 'fastener' })).toBe('installer');
		expect(lineQuantityAudience({ type: 'floor', productId: 'x' })).toBe('both');
	});

	it('every prep item has one plain sentence naming its room, free of in-house words', () => {
		for (const kind of PREP_KINDS) {
			const sentence = PLAIN_PREP[kind]('Back hall');
			expect(sentence, kind).toMatch(/^[A-Z].*\.$/);
			expect(sentence.split('. ').length, kind).toBe(1);
			expect(sentence, kind).not.toMatch(IN_HOUSE);
			if (!['trip_charge', 'minimum_job'].includes(kind)) expect(sentence).toContain('Back hall');
		}
		expect(PLAIN_PREP.level('the kitchen')).toBe(
			'Level low spots in the kitchen so the new floor lies flat.'
		);
		expect(plainPrep('not_a_kind', 'Den', 'As stored')).toBe('As stored');
		expect(plainPrep('__proto__', 'Den', 'As stored')).toBe('As stored');
	});

	it('the homeowner cautions are free of in-house words and defer to rules and professionals', () => {
		for (const text of Object.values(HOMEOWNER_CAUTIONS)) expect(text).not.toMatch(IN_HOUSE);
		expect(HOMEOWNER_CAUTIONS.old_flooring).toMatch(/asbestos/);
		expect(HOMEOWNER_CAUTIONS.old_flooring).toMatch(/local rules/);
		expect(HOMEOWNER_CAUTIONS.structure).toMatch(/licensed professional/);
	});
});

describe('the customer quote of the 12-room sample job', () => {
	it('carries none of the in-house words, readings, pay or margin', () => {
		const text = JSON.stringify(paper);
		expect(inHouseWord(text)).toBeUndefined();
		expect(text).not.toMatch(/installerPay|margin|payCents|findings|cureHours/);
		// The engine's own customer view still has them: this is what the papers leave out.
		expect(JSON.stringify(result.findings)).toMatch(IN_HOUSE);
		expect(JSON.stringify(result.cautions)).toMatch(/saw blade/);
	});

	it('prices every line the engine priced, to the cent', () => {
		const lines = paper.groups.flatMap((g) => g.lines);
		expect(lines.map((l) => l.amountCents).sort()).toEqual(
			result.lines.map((l) => l.amountCents).sort()
		);
		const sum = lines.reduce((s, l) => s + l.amountCents, 0);
		expect(sum).toBe(result.totals.subtotalCents);
		expect(paper.totals).toEqual(result.totals);
		expect(paper.days).toBe(result.schedule.days);
	});

	it('says the prep in plain words, and supplies without their sizes or counts', () => {
		const prep = paper.groups.find((g) => g.key === 'prep')!.lines;
		expect(prep.map((l) => l.text)).toContain(
			'Level low spots in Kitchen 2 so the new floor lies flat.'
		);
		for (const l of prep) expect(l.priced).toBeUndefined();
		const materials = paper.groups.find((g) => g.key === 'material')!.lines;
		const leveller = materials.find((l) => l.text.startsWith('Self-levelling'))!;
		expect(leveller.text).toBe('Self-levelling compound to even out low spots');
		expect(leveller.priced).toBeUndefined();
		const oak = materials.find((l) => l.text.startsWith('Oak'))!;
		expect(oak).toMatchObject({
			text: 'Oak plank 7 in — 55 cartons',
			priced: { qty: 55, basis: 'carton' }
		});
	});

	it('names each room’s floor and what is taken up, with its outline to scale', () => {
		const kitchen = paper.rooms.find((r) => r.name === 'Kitchen 2')!;
		expect(kitchen.floor).toBe('Grey vinyl plank, laid straight');
		expect(kitchen.takingUp).toEqual(['Sheet vinyl']);
		expect(kitchen.outline?.bbox.widthIn).toBeGreaterThan(0);
	});

	it('tells the homeowner about old flooring, dust, clearing rooms, fixtures and the days', () => {
		expect(paper.cautions.map((c) => c.kind)).toEqual([
			'old_flooring',
			'clear_rooms',
			'fixtures',
			'rooms_out_of_use',
			'dust'
		]);
		// Joists were checked and passed: nothing structural is priced, so nothing to tell.
		expect(result.cautions.some((c) => c.kind === 'structure')).toBe(true);
	});

	it('tells the homeowner about structural work only when it is priced', () => {
		const line = result.lines.find((l) => l.ref.type === 'prep')!;
		const withSister: EstimateResult = {
			...result,
			lines: [...result.lines, { ...line, id: 'x', ref: { type: 'prep', kind: 'joist_sister' } }]
		};
		expect(homeownerCautions(withSister).map((c) => c.kind)).toContain('structure');
	});

	it("carries the store's papers, its own or the defaults", () => {
		expect(paper.papers).toEqual(DEFAULT_PAPERS);
		expect(papersOf({ terms: '  Cash only. ', cancellation: '', nextSteps: null })).toEqual({
			...DEFAULT_PAPERS,
			terms: 'Cash only.'
		});
	});
});
