import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { estimate } from '$lib/estimating';
import { samplePriceBook, sampleJob } from '$lib/estimating/sample';
import { defaultSettings } from '$lib/estimating/settings';
import { LIMITS } from '$lib/estimating/limits';
import { estimateInputSchema, roomSchema, shapeSchema } from './estimate';

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

describe('bounds on every number and list (the engine’s LIMITS)', () => {
	const input = () =>
		structuredClone({
			job: sampleJob(6),
			settings: defaultSettings,
			priceBook: samplePriceBook
		});
	const issues = (x: unknown) =>
		estimateInputSchema.safeParse(x).error?.issues.map((i) => [i.path.join('.'), i.message]) ?? [];

	it('accepts the defaults, the sample price book and a job at every limit', () => {
		const x = input();
		x.job.rooms[0].shape = { kind: 'rect', widthIn: LIMITS.lengthIn, lengthIn: LIMITS.lengthIn };
		x.job.rooms[4].readings = { rhPct: Array.from({ length: LIMITS.listItems }, () => 70) };
		expect(issues(x)).toEqual([]);
	});

	it('refuses a room 10^11 in long, a roll 0.00001 in wide, 200,000 readings, with their paths', () => {
		const x = input();
		x.job.rooms[0].shape = { kind: 'rect', widthIn: 144, lengthIn: 1e11 };
		x.priceBook.floors[3].rollWidthIn = 0.00001;
		x.job.rooms[4].readings = { rhPct: Array.from({ length: 200_000 }, () => 70) };
		expect(issues(x)).toEqual([
			['job.rooms.0.shape.lengthIn', 'Length along y: at most 6,000 in'],
			['job.rooms.4.readings.rhPct', 'At most 500 readings'],
			['priceBook.floors.3.rollWidthIn', 'Roll width: at least 12 in']
		]);
	});

	it('refuses too many rooms, corners, cut-outs, holes, and a schedule of 10^17 hours', () => {
		const many = input();
		many.job.rooms = Array.from({ length: LIMITS.rooms + 1 }, () => many.job.rooms[0]);
		// the list's own bound comes first: its 201 rooms are not read one by one
		expect(issues(many)).toEqual([['job.rooms', 'At most 200 rooms']]);
		const x = input();
		x.job.rooms[1] = {
			...x.job.rooms[1],
			shape: { kind: 'points', points: Array.from({ length: 201 }, (_, i) => [i, i % 2]) },
			cutouts: Array.from({ length: 51 }, () => ({
				name: 'Post',
				shape: { kind: 'rect', widthIn: 1, lengthIn: 1 }
			})),
			repairs: { holes: Array.from({ length: 501 }, () => ({ widthIn: 1, lengthIn: 1 })) }
		};
		x.settings = structuredClone(defaultSettings);
		x.settings.schedule.workdayHours = 1e17;
		x.settings.schedule.crewSqFtPerDay.carpet = 0.00001;
		expect(issues(x)).toEqual([
			['job.rooms.1.shape.points', 'At most 200 corners'],
			['job.rooms.1.cutouts', 'At most 50 cut-outs'],
			['job.rooms.1.repairs.holes', 'At most 500 holes'],
			['settings.schedule.workdayHours', 'Working day: at most 24 h'],
			['settings.schedule.crewSqFtPerDay.carpet', 'Crew output: at least 1 ft² a day']
		]);
	});

	it('refuses prices past $1,000,000 a unit and a price book of more than 1,000 lines', () => {
		const x = input();
		x.priceBook.floors[0].material.priceCents = 1e12;
		x.priceBook.prep = Array.from({ length: 1_001 }, () => x.priceBook.prep[0]);
		expect(issues(x)).toEqual([
			['priceBook.floors.0.material.priceCents', 'Price per unit: at most 100,000,000 cents'],
			['priceBook.prep', 'At most 1,000 lines']
		]);
	});
});
