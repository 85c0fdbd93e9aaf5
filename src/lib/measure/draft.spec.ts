import { describe, expect, it } from 'vitest';
import { defaultSettings } from '$lib/estimating';
import { emptyRoom, measureDraftSchema, toEngine, type RoomDraft } from './draft';

const metric = { units: { system: 'metric' as const, defaultLengthUnit: 'mm' as const } };

function room(patch: Partial<RoomDraft>, id = 'r1'): RoomDraft {
	return { ...emptyRoom(id, 'Kitchen'), ...patch };
}

describe('reading the typed measure', () => {
	it('reads room lengths in feet and small ones in inches by default', () => {
		// 1 ft = 12 in exactly; 1 in = 25.4 mm exactly (NIST SP 811 appendix B, published).
		const draft = {
			builtYear: '1962',
			rooms: [
				room({
					shape: { kind: 'rect', width: '12\' 6"', length: '10' },
					repairs: {
						holes: [{ width: '3', length: '4 1/2' }],
						seams: [],
						dents: [],
						fasteners: 'room',
						fastenerArea: ''
					}
				})
			]
		};
		const { job, errors } = toEngine(draft, defaultSettings);
		expect(errors).toEqual([]);
		expect(job.builtYear).toBe(1962);
		expect(job.rooms[0].shape).toEqual({ kind: 'rect', widthIn: 150, lengthIn: 120 });
		expect(job.rooms[0].repairs?.holes).toEqual([{ widthIn: 3, lengthIn: 4.5 }]);
		expect(job.rooms[0].repairs?.fasteners).toBe(true);
	});

	it('reads metres and millimetres for a metric store', () => {
		const draft = {
			builtYear: '',
			rooms: [room({ shape: { kind: 'rect', width: '3.81', length: '3048 mm' } })]
		};
		const { job } = toEngine(draft, metric);
		// 3.81 m = 150 in; 3048 mm = 120 in (exact, 1 in = 25.4 mm).
		expect(job.rooms[0].shape).toMatchObject({
			widthIn: expect.closeTo(150, 9),
			lengthIn: expect.closeTo(120, 9)
		});
	});

	it('names the field of every unreadable or missing length, and leaves that room out', () => {
		const draft = {
			builtYear: 'old',
			rooms: [
				room({ shape: { kind: 'rect', width: '12 ft 6 1/0 in', length: '' } }),
				room({ shape: { kind: 'rect', width: '10', length: '10' } }, 'r2')
			]
		};
		draft.rooms[1].name = 'Hall';
		const { job, errors } = toEngine(draft, defaultSettings);
		expect(errors.map((e) => e.path)).toEqual([
			'builtYear',
			'rooms.0.shape.width',
			'rooms.0.shape.length'
		]);
		expect(errors[1].message).toMatch(/bottom cannot be 0/);
		expect(errors[2]).toMatchObject({ roomId: 'r1', message: 'Enter the length' });
		expect(job.rooms.map((r) => r.id)).toEqual(['r2']);
	});

	it('reads numbers by the one rule: 1,500 ft² is fifteen hundred, 0,5 % is refused', () => {
		const draft = {
			builtYear: '1,962',
			rooms: [
				room({
					shape: { kind: 'rect', width: '1,200 mm', length: '10' },
					repairs: {
						holes: [],
						seams: [],
						dents: [],
						fasteners: 'area',
						fastenerArea: '1,500'
					}
				})
			]
		};
		const read = toEngine(draft, defaultSettings);
		expect(read.errors).toEqual([]);
		expect(read.job.builtYear).toBe(1962);
		// 1200 mm = 1200 / 25.4 in (exact)
		expect(read.job.rooms[0].shape).toMatchObject({ widthIn: expect.closeTo(1200 / 25.4, 9) });
		expect(read.job.rooms[0].repairs?.fasteners).toEqual({ areaSqFt: 1500 });
		draft.rooms[0].repairs.fastenerArea = '0,5';
		draft.rooms[0].shape = { kind: 'rect', width: '3,5', length: '10' };
		const refused = toEngine(draft, defaultSettings).errors.map((e) => [e.path, e.message]);
		expect(refused).toEqual([
			['rooms.0.shape.width', expect.stringContaining('use a point for decimals')],
			['rooms.0.repairs.fastenerArea', expect.stringContaining('use a point for decimals')]
		]);
	});

	it('refuses a zero length and a second room of the same name', () => {
		const draft = {
			builtYear: '',
			rooms: [room({ shape: { kind: 'rect', width: '0', length: '10' } }), room({}, 'r2')]
		};
		const paths = toEngine(draft, defaultSettings).errors.map((e) => [e.path, e.message]);
		expect(paths).toContainEqual(['rooms.0.shape.width', 'The width must be more than zero']);
		expect(paths).toContainEqual(['rooms.1.name', 'Another room is called "Kitchen"']);
	});

	it('refuses a length past 500 ft, the longest the engine takes', () => {
		const draft = {
			builtYear: '',
			rooms: [room({ shape: { kind: 'rect', width: '500\' 1"', length: '8333333333 ft' } })]
		};
		const read = toEngine(draft, defaultSettings);
		expect(read.errors.map((e) => [e.path, e.message])).toEqual([
			['rooms.0.shape.width', 'The width can be at most 500 ft (6000 in)'],
			['rooms.0.shape.length', 'The length can be at most 500 ft (6000 in)']
		]);
		expect(read.job.rooms).toEqual([]);
	});

	it('reads an L-shaped room as two rectangles, and sides with turns', () => {
		const draft = {
			builtYear: '',
			rooms: [
				room({
					shape: {
						kind: 'rects',
						rects: [
							{ x: '', y: '', width: '12', length: '8' },
							{ x: '0', y: '8', width: '5', length: '6' }
						]
					}
				}),
				{
					...room(
						{
							shape: {
								kind: 'sides',
								sides: [
									{ length: '10', turn: 'right' },
									{ length: '8', turn: 'right' },
									{ length: '10', turn: 'right' },
									{ length: '8', turn: 'right' }
								]
							}
						},
						'r2'
					),
					name: 'Den'
				}
			]
		};
		const { job, errors } = toEngine(draft, defaultSettings);
		expect(errors).toEqual([]);
		expect(job.rooms[0].shape).toEqual({
			kind: 'rects',
			rects: [
				{ xIn: 0, yIn: 0, widthIn: 144, lengthIn: 96 },
				{ xIn: 0, yIn: 96, widthIn: 60, lengthIn: 72 }
			]
		});
		expect(job.rooms[1].shape.kind).toBe('sides');
	});

	it('leaves the floor out when none is chosen, so the engine can say so by the room', () => {
		const { job } = toEngine(
			{ builtYear: '', rooms: [room({ shape: { kind: 'rect', width: '9', length: '9' } })] },
			defaultSettings
		);
		expect(job.rooms[0].floor).toBeUndefined();
	});

	it('fills what an older draft lacks with defaults', () => {
		const parsed = measureDraftSchema.parse({
			builtYear: '',
			rooms: [{ id: 'a', shape: { kind: 'rect' } }]
		});
		expect(parsed.rooms[0]).toMatchObject({
			name: '',
			underlayment: 'auto',
			repairs: { holes: [] }
		});
	});
});

describe('new rooms', () => {
	it('share no list with each other', () => {
		const a = emptyRoom('a');
		const b = emptyRoom('b');
		a.repairs.holes.push({ width: '3', length: '4' });
		a.readings.rh.push('80');
		expect(b.repairs.holes).toEqual([]);
		expect(b.readings.rh).toEqual([]);
	});
});

describe('the install details (issue 12)', () => {
	it('reads the slab, doorways, trim, fixtures, stairs, drop direction and I-joists', () => {
		const base = emptyRoom('r1', 'Basement');
		const draft = {
			builtYear: '',
			rooms: [
				{
					...base,
					shape: { kind: 'rect' as const, width: '20', length: '15' },
					floor: { productId: 'sheet-6', layout: 'straight' as const },
					subfloor: { kind: 'concrete' as const, thickness: '', spanRating: '' },
					install: {
						...base.install,
						rollDirection: 'y' as const,
						light: 'x' as const,
						slabId: ' Basement ',
						slabThickness: '4',
						slabDrying: 'both' as const,
						doorways: [{ width: '32', door: true, nextFloor: '1/2' }],
						baseboard: 'reset' as const,
						shoe: 'new' as const,
						furniture: true,
						appliances: '1',
						toilets: '2',
						stairs: '13'
					}
				},
				{
					...emptyRoom('r2', 'Bath'),
					shape: { kind: 'rect' as const, width: '6', length: '8' },
					joists: {
						size: '2x10' as const,
						species: 'hem_fir' as const,
						spacing: '16',
						span: '14',
						iJoist: true,
						ei: '300'
					}
				}
			]
		};
		const { job, errors } = toEngine(draft, defaultSettings);
		expect(errors).toEqual([]);
		const [b, bath] = job.rooms;
		expect(b.floor).toEqual({
			productId: 'sheet-6',
			layout: 'straight',
			rollDirection: 'y',
			light: 'x'
		});
		expect(b.subfloor.slab).toEqual({ id: 'Basement', thicknessIn: 4, drying: 'both' });
		expect(b.doorways).toEqual([{ widthIn: 32, door: true, nextFloorIn: 0.5 }]);
		expect(b.base).toEqual({ baseboard: 'reset', shoe: 'new' });
		expect(b).toMatchObject({ furniture: true, appliances: 1, toilets: 2, stairs: 13 });
		// EI typed in millions of lb·in²
		expect(bath.joists?.iJoist).toEqual({ eiLbIn2: 300e6 });
	});

	it('names the field of a count it cannot read', () => {
		const r = emptyRoom('r1', 'Hall');
		const { errors } = toEngine(
			{
				builtYear: '',
				rooms: [
					{
						...r,
						shape: { kind: 'rect', width: '4', length: '12' },
						install: { ...r.install, toilets: '2.5' }
					}
				]
			},
			defaultSettings
		);
		expect(errors.map((e) => e.path)).toEqual(['rooms.0.install.toilets']);
	});
});
