import { describe, expect, it } from 'vitest';
import { defaultSettings, estimate } from '$lib/estimating';
import { samplePriceBook } from '$lib/estimating/sample';
import { collectMessages, countForRoom, draftPathsOf, roomOutlineOf } from './check';
import { emptyRoom, toEngine, type MeasureDraft, type RoomDraft } from './draft';
import { areaText, lengthText, readingOf } from './format';
import { summarize } from './summary';

function room(id: string, name: string, patch: Partial<RoomDraft> = {}): RoomDraft {
	return {
		...emptyRoom(id, name),
		shape: { kind: 'rect', width: "10'", length: "10'" },
		floor: { productId: 'lvp-grey', layout: 'straight' },
		...patch
	};
}

describe('messages by field', () => {
	it('puts the engine’s errors on the draft room they belong to, found by id', () => {
		const draft: MeasureDraft = {
			builtYear: '',
			rooms: [
				room('bad', 'Den', { shape: { kind: 'rect', width: 'twelve', length: "10'" } }),
				room('nofloor', 'Hall', { floor: { productId: '', layout: 'straight' } }),
				room('gone', 'Bath', { floor: { productId: 'retired', layout: 'straight' } })
			]
		};
		const read = toEngine(draft, defaultSettings);
		// The unreadable room is left out of the job, so job.rooms.0 is the hall (draft room 1).
		const result = estimate({
			job: read.job,
			settings: defaultSettings,
			priceBook: samplePriceBook
		});
		const engine = draftPathsOf(draft, read.job, result.errors);
		expect(engine).toEqual([
			{ path: 'rooms.1.floor.productId', roomId: 'nofloor', message: 'Choose the new floor' },
			{
				path: 'rooms.2.floor.productId',
				roomId: 'gone',
				message: 'This floor is no longer in the price book: choose another'
			}
		]);
		const messages = collectMessages(draft, { draft: read.errors, engine });
		expect(messages.fields['rooms.0.shape.width']).toMatch(/Cannot read "twelve"/);
		expect(countForRoom(messages, 1, 'nofloor')).toBe(1);
	});

	it('says when sides do not make a room, by the shape', () => {
		const r = room('s', 'Odd', {
			shape: {
				kind: 'sides',
				sides: [
					{ length: "10'", turn: 'left' },
					{ length: "10'", turn: 'left' },
					{ length: "3'", turn: 'left' }
				]
			}
		});
		const outline = roomOutlineOf(r, defaultSettings);
		expect(outline.shape).toBeUndefined();
		expect(outline.errors[0].path).toMatch(/^shape/);
	});

	it('says by the shape when a room is more than 500 ft across (the engine’s limit)', () => {
		const wide = room('w', 'Barn', {
			shape: {
				kind: 'rects',
				rects: [
					{ x: '0', y: '0', width: "400'", length: "10'" },
					{ x: "400'", y: '0', width: "400'", length: "10'" }
				]
			}
		});
		const outline = roomOutlineOf(wide, defaultSettings);
		expect(outline.shape).toBeUndefined();
		expect(outline.errors).toEqual([
			{
				path: 'shape',
				message: `The room is 800' 0" across; the engine takes rooms up to 500' 0" a side`
			}
		]);
	});

	it('keeps messages for no field apart: by room, or for the whole measure', () => {
		const m = collectMessages(
			{ builtYear: '', rooms: [room('a', 'A')] },
			{
				draft: [],
				engine: [
					{ path: 'priceBook.prep', roomId: 'a', message: 'No price for prep "trim"' },
					{ path: 'priceBook.supplies', message: 'No price for supply "patch"' }
				]
			}
		);
		expect(m.rooms).toEqual({ a: ['No price for prep "trim"'] });
		expect(m.general).toEqual(['No price for supply "patch"']);
	});
});

describe('how lengths and areas read', () => {
	const metric = { units: { system: 'metric' as const, defaultLengthUnit: 'mm' as const } };

	it('reads typed lengths in words, in the store’s units', () => {
		// 1 ft = 12 in exactly (NIST SP 811 appendix B, published).
		expect(readingOf('12\' 6 1/2"', defaultSettings, 'room')).toBe('12 ft 6 1/2 in');
		expect(readingOf('12.5', defaultSettings, 'room')).toBe('12 ft 6 in');
		expect(readingOf('4 1/2', defaultSettings, 'small')).toBe('4 1/2 in');
		expect(readingOf('12 ft 6 1/0 in', defaultSettings, 'room')).toBeUndefined();
		expect(readingOf('', defaultSettings, 'room')).toBeUndefined();
		expect(readingOf('3.81', metric, 'room')).toBe('3.81 m');
		expect(lengthText(1, metric, 'small')).toBe('25.4 mm');
	});

	it('areas to the whole ft² (ANSI Z765, published), or m² to two places', () => {
		expect(areaText(125.6, defaultSettings)).toBe('126 ft²');
		// 1 ft² = 0.09290304 m² exactly.
		expect(areaText(100, metric)).toBe('9.29 m²');
	});

	it('sums the rooms it can read for the job page', () => {
		const draft: MeasureDraft = {
			builtYear: '',
			rooms: [
				room('l', 'L', {
					shape: {
						kind: 'rects',
						rects: [
							{ x: '', y: '', width: "12'", length: "8'" },
							{ x: '0', y: "8'", width: "5'", length: "6'" }
						]
					}
				}),
				room('x', 'X', { shape: { kind: 'rect', width: '?', length: "8'" } })
			]
		};
		// An L of 12 × 8 ft and 5 × 6 ft: 96 + 30 = 126 ft².
		expect(summarize(draft, defaultSettings)).toEqual({ rooms: 2, areaSqFt: 126, unreadable: 1 });
	});
});
