// The engine refuses work beyond its LIMITS itself, whatever a schema let through (issue 9
// item 2). Each case is sized just past its bound, so an engine without the bound finishes and
// the assertion fails, or is the absurd case from the issue (a room 10^11 in long, a roll
// 0.00001 in wide, 10^17 hours, 200,000 readings, 1e308 into gcd), refused before any work.
import { describe, expect, it } from 'vitest';
import { changeOrder } from './change-order';
import { estimate } from './estimate';
import { roomShape, type Shape } from './geometry';
import { LIMITS, LimitError } from './limits';
import { divRound, extend, mulDivRound, PriceIndex, taxes } from './pricing';
import { samplePriceBook, sampleRoom } from './sample';
import { schedule } from './schedule';
import { defaultSettings, type StoreSettings } from './settings';
import { rhChecks } from './substrate';
import { patchTakeoff, rollTakeoff } from './takeoff';
import type { EstimateInput, RoomMeasure } from './types';
import { formatLength, gcd, parseLength } from './units';

const carpet: RoomMeasure = {
	id: 'fam',
	name: 'Family room',
	shape: { kind: 'rect', widthIn: 216, lengthIn: 270 },
	floor: { productId: 'carpet-12', layout: 'straight' },
	subfloor: { kind: 'plywood', thicknessIn: 0.75 }
};

const job = (rooms: RoomMeasure[], settings: StoreSettings = defaultSettings): EstimateInput => ({
	job: { rooms },
	settings,
	priceBook: samplePriceBook
});

/** The refusal `work` throws. */
function refusal(work: () => unknown): LimitError {
	try {
		work();
	} catch (e) {
		if (e instanceof LimitError) return e;
		throw e;
	}
	throw new Error('not refused');
}

describe('estimate refuses a job beyond its limits, naming the field and the limit', () => {
	it('a room 1 in past 500 ft, or 10^11 in long: that room is refused, the others price', () => {
		for (const [lengthIn, text] of [
			[LIMITS.lengthIn + 1, '6,001'],
			[1e11, '100,000,000,000']
		] as const) {
			const far: RoomMeasure = {
				...carpet,
				id: 'far',
				shape: { kind: 'rect', widthIn: 144, lengthIn }
			};
			const r = estimate(job([far, carpet]));
			expect(r.errors).toEqual([
				{
					path: 'job.rooms.0.shape.lengthIn',
					roomId: 'far',
					message: `A length is ${text} in; the engine takes at most 6,000 in`,
					limit: LIMITS.lengthIn
				}
			]);
			expect(r.rooms.map((x) => x.ok)).toEqual([false, true]);
			expect(r.lines.some((l) => l.roomId === 'fam')).toBe(true);
		}
	});

	it('a room just over 500 ft across, drawn from corners or sides', () => {
		const side = LIMITS.roomSideIn + 1;
		const points: Shape = {
			kind: 'points',
			points: [
				[0, 0],
				[side, 0],
				[side, 100],
				[0, 100]
			]
		};
		expect(estimate(job([{ ...carpet, shape: points }])).errors[0]).toMatchObject({
			path: 'job.rooms.0.shape',
			limit: LIMITS.roomSideIn,
			message: `The room is 500' 1" across; the engine takes rooms up to 500' 0" a side`
		});
		const sides: Shape = {
			kind: 'sides',
			sides: [
				{ lengthIn: 3000, turn: 0 },
				{ lengthIn: 3001, turn: 'left' },
				{ lengthIn: 100, turn: 'left' },
				{ lengthIn: 3001, turn: 0 },
				{ lengthIn: 3000, turn: 'left' },
				{ lengthIn: 100, turn: 'left' }
			]
		};
		expect(estimate(job([{ ...carpet, shape: sides }])).errors[0]).toMatchObject({
			path: 'job.rooms.0.shape',
			limit: LIMITS.roomSideIn
		});
	});

	it(`more than ${LIMITS.rooms} rooms: nothing is priced`, () => {
		const rooms = Array.from({ length: LIMITS.rooms + 1 }, (_, i) => ({
			...carpet,
			id: `r${i}`
		}));
		const r = estimate(job(rooms));
		expect(r.ok).toBe(false);
		expect(r.errors).toEqual([
			{
				path: 'job.rooms',
				message: '201 rooms; the engine takes at most 200',
				limit: LIMITS.rooms
			}
		]);
		expect(r.lines).toEqual([]);
		expect(r.totals.totalCents).toBe(0);
	});

	it('too many corners, rectangles or cut-outs in a room, or corners in a job', () => {
		const corners = (n: number): Shape => ({
			kind: 'points',
			points: Array.from({ length: n }, (_, i) => {
				const a = (2 * Math.PI * i) / n;
				return [100 + 90 * Math.cos(a), 100 + 90 * Math.sin(a)] as [number, number];
			})
		});
		const one = (room: Partial<RoomMeasure>) => estimate(job([{ ...carpet, ...room }])).errors[0];
		expect(one({ shape: corners(LIMITS.outlineCorners + 1) })).toMatchObject({
			path: 'job.rooms.0.shape.points',
			limit: LIMITS.outlineCorners
		});
		expect(one({ shape: corners(LIMITS.outlineCorners) })).toBeUndefined();
		const rects = Array.from({ length: LIMITS.rects + 1 }, (_, i) => ({
			xIn: i * 10,
			yIn: 0,
			widthIn: 10,
			lengthIn: 100
		}));
		expect(one({ shape: { kind: 'rects', rects } })).toMatchObject({
			path: 'job.rooms.0.shape.rects',
			limit: LIMITS.rects
		});
		const post = { name: 'Post', shape: { kind: 'rect', xIn: 5, yIn: 5, widthIn: 1, lengthIn: 1 } };
		expect(
			one({ cutouts: Array.from({ length: LIMITS.cutouts + 1 }, () => post as never) })
		).toMatchObject({ path: 'job.rooms.0.cutouts', limit: LIMITS.cutouts });
		expect(
			one({ cutouts: [{ name: 'Hearth', shape: corners(LIMITS.cutoutCorners + 1) }] })
		).toMatchObject({ path: 'job.rooms.0.cutouts.0.shape.points' });
		// 60 rooms of 180 corners: 10,800 > 10,000 in the job
		const many = Array.from({ length: 60 }, (_, i) => ({
			...carpet,
			id: `r${i}`,
			shape: corners(180)
		}));
		expect(estimate(job(many)).errors).toEqual([
			{
				path: 'job.rooms',
				message: '10,800 corners in the job; the engine takes at most 10,000',
				limit: LIMITS.jobCorners
			}
		]);
	});

	it('a roll 0.00001 in wide, or just under 1 ft', () => {
		for (const rollWidthIn of [LIMITS.rollWidthMinIn - 0.5, 0.00001]) {
			const book = structuredClone(samplePriceBook);
			book.floors[3].rollWidthIn = rollWidthIn;
			const r = estimate({ ...job([carpet]), priceBook: book });
			expect(r.errors).toEqual([
				{
					path: 'priceBook.floors.3.rollWidthIn',
					roomId: 'fam',
					message: `The roll width is ${rollWidthIn === 0.00001 ? '0' : '11.5'} in; the engine takes 12 to 240 in`,
					limit: LIMITS.rollWidthMinIn
				}
			]);
		}
	});

	it(`roll drops past ${LIMITS.jobDrops} in a job`, () => {
		// 500 ft square rooms in 1 ft rolls: 500 drops each way, 1,000 a room; 11 rooms pass
		const big = (i: number): RoomMeasure => ({
			...carpet,
			id: `w${i}`,
			shape: { kind: 'rect', widthIn: 6000, lengthIn: 6000 },
			floor: { productId: 'narrow', layout: 'straight' }
		});
		const book = structuredClone(samplePriceBook);
		book.floors.push({ ...book.floors[3], id: 'narrow', rollWidthIn: 12 });
		// Seaming 1 ft rolls by the foot would pass the hours' limit first: not what this checks.
		const s = structuredClone(defaultSettings);
		for (const k of ['carpet_seam', 'carpet_pad', 'tack_strip']) s.schedule.prepHoursPerUnit[k] = 0;
		const input = (n: number) => ({
			...job(
				Array.from({ length: n }, (_, i) => big(i)),
				s
			),
			priceBook: book
		});
		expect(estimate(input(10)).ok).toBe(true);
		const r = estimate(input(11));
		expect(r.errors).toEqual([
			{
				path: 'job.rooms',
				message: "The rooms' roll goods come to 11000 drops; the engine lays out up to 10000 a job",
				limit: LIMITS.jobDrops
			}
		]);
		expect(r.lines).toEqual([]);
	});

	it('200,000 readings, or one more than the limit', () => {
		const slab = (n: number): RoomMeasure => ({
			...carpet,
			subfloor: { kind: 'concrete' },
			readings: { rhPct: Array.from({ length: n }, () => 70) }
		});
		for (const n of [LIMITS.listItems + 1, 200_000])
			expect(estimate(job([slab(n)])).errors).toEqual([
				{
					path: 'job.rooms.0.readings.rhPct',
					roomId: 'fam',
					message: `${n.toLocaleString('en-US')} readings; the engine takes at most 500`,
					limit: LIMITS.listItems
				}
			]);
		expect(estimate(job([slab(LIMITS.listItems)])).ok).toBe(true);
		const holes = Array.from({ length: LIMITS.listItems + 1 }, () => ({ widthIn: 2, lengthIn: 2 }));
		expect(estimate(job([{ ...carpet, repairs: { holes } }])).errors[0]).toMatchObject({
			path: 'job.rooms.0.repairs.holes'
		});
	});

	it('a schedule past the limit of work hours: the job is refused', () => {
		// 120 ft² at 0.01 ft² a crew day is 96,000 h of carpet work; two rooms, 192,000 h
		const settings = structuredClone(defaultSettings);
		settings.schedule.crewSqFtPerDay.carpet = 0.01;
		const room = { ...carpet, shape: { kind: 'rect' as const, widthIn: 144, lengthIn: 120 } };
		expect(estimate(job([room], settings)).ok).toBe(true);
		const r = estimate(job([room, { ...room, id: 'two' }], settings));
		expect(r.errors).toEqual([
			{
				path: 'job.rooms',
				message: 'Install floors: the work is 192,000 h; the engine takes 0 to 100,000 h',
				limit: LIMITS.workHours
			}
		]);
		settings.schedule.crewSqFtPerDay.carpet = 800;
		settings.schedule.workdayHours = 0.0001;
		expect(estimate(job([room], settings)).errors[0]).toMatchObject({
			path: 'settings.schedule.workdayHours',
			limit: 1
		});
	});

	it('a line priced past its quantity or amount limit', () => {
		// oak is priced by the carton: 4.4 ft² cartons of 1e-9 ft² each
		const book = structuredClone(samplePriceBook);
		book.floors[0].cartonSqFt = 1e-9;
		const oak = { ...carpet, floor: { productId: 'oak-7', layout: 'straight' as const } };
		expect(estimate({ ...job([oak]), priceBook: book }).errors).toEqual([
			{
				path: 'priceBook.floors',
				message: expect.stringContaining('the engine prices up to 1,000,000,000 a line'),
				limit: LIMITS.lineQty
			}
		]);
		const dear = structuredClone(samplePriceBook);
		dear.floors[0].labourCentsPerSqFt = 1e11;
		expect(estimate({ ...job([oak]), priceBook: dear }).errors[0]).toMatchObject({
			path: 'priceBook.floors.0.labourCentsPerSqFt',
			limit: LIMITS.lineCents
		});
	});

	it('a price book or settings list past its limit', () => {
		const book = structuredClone(samplePriceBook);
		book.prep = Array.from({ length: LIMITS.priceBookLines + 1 }, () => book.prep[0]);
		expect(estimate({ ...job([carpet]), priceBook: book }).errors).toEqual([
			{
				path: 'priceBook.prep',
				message: '1,001 price-book lines; the engine takes at most 1,000',
				limit: LIMITS.priceBookLines
			}
		]);
		const settings = structuredClone(defaultSettings);
		settings.taxes = Array.from({ length: LIMITS.settingsRows + 1 }, () => settings.taxes[0]);
		expect(estimate(job([carpet], settings)).errors[0]).toMatchObject({
			path: 'settings.taxes',
			limit: LIMITS.settingsRows
		});
	});

	it('still prices the sample rooms of every kind well inside the limits', () => {
		const r = estimate(job(Array.from({ length: 12 }, (_, i) => sampleRoom(i))));
		expect(r.errors).toEqual([]);
	});
});

describe('the engine functions refuse work beyond their limits when called alone', () => {
	it('roomShape: a side of 10^11 in, 201 sides', () => {
		expect(refusal(() => roomShape({ kind: 'rect', widthIn: 1e11, lengthIn: 10 })).path).toBe(
			'shape.widthIn'
		);
		const sides = Array.from({ length: 201 }, () => ({ lengthIn: 10, turn: 'left' as const }));
		expect(refusal(() => roomShape({ kind: 'sides', sides }))).toMatchObject({
			path: 'shape.sides',
			limit: 200
		});
	});

	it('rollTakeoff: a roll 0.00001 in wide, or a room 10^11 in long', () => {
		const square = roomShape({ kind: 'rect', widthIn: 144, lengthIn: 144 });
		if (!square.ok) throw new Error(square.message);
		const args = { polygon: square.polygon, isRect: true, trimPerEndIn: 3, orderIncrementIn: 12 };
		expect(rollTakeoff({ ...args, rollWidthIn: 12 }).drops).toHaveLength(12);
		expect(refusal(() => rollTakeoff({ ...args, rollWidthIn: 11.5 })).path).toBe('rollWidthIn');
		expect(refusal(() => rollTakeoff({ ...args, rollWidthIn: 0.00001 })).path).toBe('rollWidthIn');
		const long = [
			[
				[0, 0],
				[144, 0],
				[144, 1e11],
				[0, 1e11]
			] as [number, number][]
		];
		expect(refusal(() => rollTakeoff({ ...args, polygon: long, rollWidthIn: 144 })).path).toBe(
			'polygon'
		);
	});

	it('schedule: 10^17 hours, or one hour past the limit', () => {
		const day = { workdayHours: 8, dayStartHour: 8 };
		const half = { key: 'a', label: 'A', hours: LIMITS.workHours / 2 };
		expect(schedule([half, half], day).workHours).toBe(LIMITS.workHours);
		expect(refusal(() => schedule([half, { ...half, hours: half.hours + 1 }], day)).path).toBe(
			'steps'
		);
		const install = { key: 'install', label: 'Install floors', hours: 1e17 };
		expect(refusal(() => schedule([install], day))).toMatchObject({
			path: 'steps.0.hours',
			limit: LIMITS.workHours
		});
		expect(refusal(() => schedule([half], { ...day, workdayHours: 0.0001 })).path).toBe(
			'workdayHours'
		);
	});

	it('rhChecks and patchTakeoff: 200,000 readings or voids', () => {
		for (const n of [LIMITS.listItems + 1, 200_000]) {
			const readingsPct = Array.from({ length: n }, () => 70);
			const rh = { readingsPct, areaSqFt: 100, limitPct: 75 };
			expect(refusal(() => rhChecks(rh, defaultSettings.moisture))).toMatchObject({
				path: 'readingsPct',
				limit: LIMITS.listItems
			});
		}
		const voids = Array.from({ length: LIMITS.rooms * 2 * LIMITS.listItems + 1 }, () => ({
			lengthIn: 1,
			widthIn: 1,
			depthIn: 1
		}));
		expect(
			refusal(() => patchTakeoff({ voids, wastePct: 10, container: { volumeCuIn: 231 } })).path
		).toBe('voids');
	});

	it('gcd and formatLength: 1e308, NaN, a fraction', () => {
		expect(refusal(() => gcd(1e308, 16)).message).toContain(String(Number.MAX_SAFE_INTEGER));
		expect(refusal(() => gcd(16, 0.5)).path).toBe('b');
		expect(refusal(() => gcd(NaN, 16)).path).toBe('a');
		// Euclid (published, Elements VII.2): gcd(1071, 462) = 21
		expect(gcd(1071, 462)).toBe(21);
		// consecutive Fibonacci numbers are Euclid's worst case: F78 and F77 take 76 steps
		expect(gcd(8944394323791464, 5527939700884757)).toBe(1);
		// formatLength never reaches gcd with such a number: it writes the plain figure
		expect(formatLength(1e308)).toBe('1e+308 in');
		expect(formatLength(NaN)).toBe('NaN in');
		expect(formatLength(-2e7)).toBe('-20,000,000 in');
		expect(formatLength(150.5)).toBe(`12' 6 1/2"`);
	});

	it('parseLength: a text longer than any length', () => {
		const long = '9'.repeat(LIMITS.lengthText + 1);
		expect(parseLength(long)).toEqual({
			ok: false,
			message: 'A length is at most 100 characters; this one is 101'
		});
		expect(parseLength('9'.repeat(20)).ok).toBe(true);
	});

	it('PriceIndex, taxes and changeOrder: lists past their limits', () => {
		const book = structuredClone(samplePriceBook);
		book.floors = Array.from({ length: LIMITS.priceBookLines + 1 }, () => book.floors[0]);
		expect(refusal(() => new PriceIndex(book)).path).toBe('floors');
		const rows = Array.from({ length: LIMITS.settingsRows + 1 }, () => defaultSettings.taxes[0]);
		const byGroup = { material: 1, labour: 0, prep: 0, removal: 0 };
		expect(refusal(() => taxes(byGroup, { taxes: rows, taxRounding: 'half_up' })).path).toBe(
			'taxes'
		);
		const item = { ref: { type: 'prep', kind: 'grind' } as const, qty: 1 };
		const sold = Array.from({ length: LIMITS.changeOrderItems + 1 }, () => item);
		expect(
			refusal(() =>
				changeOrder({ sold, found: [], priceBook: samplePriceBook, settings: defaultSettings })
			).path
		).toBe('sold');
	});
});

describe('money past 2^53 stays exact', () => {
	it('rounds a × b ÷ d exactly, checked against BigInt arithmetic', () => {
		// 15,250,198,147,102 × 67,745 is past 2^53: as a float it is 1 too high, and the half-up
		// rounding of its ten-thousandths goes the wrong way
		const [a, b] = [15_250_198_147_102, 67_745];
		const exact = (BigInt(a) * BigInt(b) + 5_000n) / 10_000n;
		expect(mulDivRound(a, b, 10_000)).toBe(Number(exact));
		expect(divRound(a * b, 10_000)).toBe(Number(exact) + 1);
		expect(mulDivRound(-a, b, 10_000)).toBe(-Number(exact));
		expect(mulDivRound(5, 1, 2, 'half_even')).toBe(2);
		expect(extend(900_000, 99_999_999)).toBe(89_999_999_100_000);
	});
});
