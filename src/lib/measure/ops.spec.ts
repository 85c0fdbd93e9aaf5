import { describe, expect, it } from 'vitest';
import { emptyRoom, measureDraftSchema, type MeasureDraft, type ShapeDraft } from './draft';
import { applyFields, applyOp, convertShape, fieldId, freeName, valueAt } from './ops';

let n = 0;
const ids = () => `id${++n}`;

function draft(): MeasureDraft {
	return { builtYear: '', rooms: [emptyRoom('r1', 'Kitchen'), emptyRoom('r2', 'Hall')] };
}

describe('operations on the draft', () => {
	it('adds a room with a free name and selects it, its name field first', () => {
		const d = draft();
		d.rooms[1].name = 'Room 3';
		expect(applyOp(d, 'add-room', ids)).toEqual({
			selected: 'id1',
			focus: 'rooms.2.name'
		});
		expect(d.rooms[2].name).toBe('Room 3 2');
		expect(measureDraftSchema.safeParse(d).success).toBe(true);
	});

	it('duplicates a room right after it, with its own id and name', () => {
		const d = draft();
		d.rooms[0].shape = { kind: 'rect', width: "12'", length: "8'" };
		const r = applyOp(d, 'duplicate-room:r1', () => 'copy');
		expect(r.selected).toBe('copy');
		expect(d.rooms.map((x) => x.name)).toEqual(['Kitchen', 'Kitchen copy', 'Hall']);
		expect(d.rooms[1].shape).toEqual(d.rooms[0].shape);
		expect(d.rooms[1].shape).not.toBe(d.rooms[0].shape);
	});

	it('removes a room and says what was removed, so it can be put back', () => {
		const d = draft();
		const r = applyOp(d, 'remove-room:r1');
		expect(r.removed).toMatchObject({ index: 0, room: { id: 'r1', name: 'Kitchen' } });
		expect(r.selected).toBe('r2');
		expect(d.rooms.map((x) => x.id)).toEqual(['r2']);
	});

	it('moves rooms up and down, not past the ends', () => {
		const d = draft();
		applyOp(d, 'move-room:r2:up');
		expect(d.rooms.map((x) => x.id)).toEqual(['r2', 'r1']);
		applyOp(d, 'move-room:r2:up');
		expect(d.rooms.map((x) => x.id)).toEqual(['r2', 'r1']);
	});

	it('adds to and removes from the lists of a room', () => {
		const d = draft();
		expect(applyOp(d, 'add:rooms.0.repairs.holes').focus).toBe('rooms.0.repairs.holes.0.width');
		applyOp(d, 'add:rooms.0.repairs.holes');
		applyOp(d, 'add:rooms.0.repairs.seams');
		applyOp(d, 'add:rooms.0.remove');
		applyOp(d, 'add:rooms.0.readings.rh');
		expect(d.rooms[0].repairs.holes).toHaveLength(2);
		expect(d.rooms[0].repairs.seams).toEqual([{ length: '', width: '', depth: '' }]);
		expect(d.rooms[0].remove).toEqual(['carpet']);
		applyOp(d, 'remove:rooms.0.repairs.holes.0');
		expect(d.rooms[0].repairs.holes).toHaveLength(1);
		expect(measureDraftSchema.safeParse(d).success).toBe(true);
	});

	it('refuses lists the draft does not have and lists at their limit', () => {
		const d = draft();
		expect(applyOp(d, 'add:rooms.0.name')).toEqual({});
		expect(applyOp(d, 'add:rooms.9.repairs.holes')).toEqual({});
		expect(applyOp(d, 'add:__proto__.x')).toEqual({});
		for (let i = 0; i < 4; i++) applyOp(d, 'add:rooms.0.remove');
		expect(applyOp(d, 'add:rooms.0.remove').message).toMatch(/At most 4/);
	});

	it('turns joists on and off', () => {
		const d = draft();
		expect(applyOp(d, 'joists-on:0').focus).toBe('rooms.0.joists.spacing');
		expect(d.rooms[0].joists).toMatchObject({ spacing: '', span: '' });
		applyOp(d, 'joists-off:0');
		expect(d.rooms[0].joists).toBeNull();
	});

	it('carries the sizes over when a shape changes kind', () => {
		const room = emptyRoom('r', 'Den');
		room.shape = { kind: 'rect', width: "12'", length: "8'" };
		convertShape(room, 'rects');
		expect(room.shape).toEqual({
			kind: 'rects',
			rects: [{ x: '', y: '', width: "12'", length: "8'" }]
		});
		convertShape(room, 'sides');
		const walked = room.shape as ShapeDraft;
		expect(walked.kind === 'sides' && walked.sides.map((s) => s.length)).toEqual([
			"12'",
			"8'",
			"12'",
			"8'"
		]);
		convertShape(room, 'rect');
		expect(room.shape as ShapeDraft).toEqual({ kind: 'rect', width: "12'", length: "8'" });
	});

	it('names without clashing', () => {
		expect(freeName(draft(), 'kitchen')).toBe('kitchen 2');
		expect(freeName(draft(), 'Den')).toBe('Den');
	});
});

describe('posted fields into the draft (the form without JavaScript)', () => {
	it('writes the fields the draft has, by path, as the type they are', () => {
		const d = draft();
		applyOp(d, 'add:rooms.0.repairs.holes');
		applyFields(d, [
			['builtYear', '1962'],
			['rooms.0.name', 'Big kitchen'],
			['rooms.0.shape.width', '12\' 6"'],
			['rooms.0.repairs.holes.0.width', '3'],
			['rooms.0.trim', 'false'],
			['rooms.0.trim', 'true'],
			['rooms.0.notes', 'Dog door']
		]);
		expect(d.builtYear).toBe('1962');
		expect(d.rooms[0]).toMatchObject({
			name: 'Big kitchen',
			shape: { width: '12\' 6"' },
			trim: true,
			notes: 'Dog door',
			repairs: { holes: [{ width: '3', length: '' }] }
		});
	});

	it('changes a shape kind after its fields, carrying them over; ignores what the draft lacks', () => {
		const d = draft();
		applyFields(d, [
			['rooms.1.shape.kind', 'rects'],
			['rooms.1.shape.width', '5'],
			['rooms.1.shape.rects.0.width', '6'],
			['rooms.1.shape.rects.3.width', '9'],
			['rooms.1.joists.size', '2x8'],
			['rooms.5.name', 'Ghost'],
			['rooms.0.__proto__.polluted', 'yes'],
			['_draft', '{}']
		]);
		expect(d.rooms[1].shape).toEqual({
			kind: 'rects',
			rects: [{ x: '', y: '', width: '5', length: '' }]
		});
		expect(d.rooms[1].joists).toBeNull();
		expect(d.rooms).toHaveLength(2);
		expect(({} as Record<string, unknown>).polluted).toBeUndefined();
	});

	it('an unchecked box stays false (its hidden default is all that is sent)', () => {
		const d = draft();
		d.rooms[0].trim = true;
		applyFields(d, [['rooms.0.trim', 'false']]);
		expect(d.rooms[0].trim).toBe(false);
	});
});

describe('paths', () => {
	it('reads values by path and makes element ids of them', () => {
		const d = draft();
		expect(valueAt(d, 'rooms.1.name')).toBe('Hall');
		expect(valueAt(d, 'rooms.2.name')).toBeUndefined();
		expect(valueAt(d, 'rooms.constructor')).toBeUndefined();
		expect(fieldId('rooms.0.shape.width')).toBe('m-rooms-0-shape-width');
	});
});
