import { describe, expect, it } from 'vitest';
import { emptyRoom, type MeasureDraft, type RoomDraft } from './draft';
import { compareMeasures, mergeMeasures, picksFor, roomRows } from './merge';

function room(id: string, name: string, width = "10'"): RoomDraft {
	return { ...emptyRoom(id, name), shape: { kind: 'rect', width, length: "10'" } };
}

const m = (...rooms: RoomDraft[]): MeasureDraft => ({ builtYear: '', rooms });

describe('comparing two saves of a measure', () => {
	const base = m(room('a', 'Kitchen'), room('b', 'Hall'), room('c', 'Den'));

	it('finds, room by room, what differs and which side changed it', () => {
		const theirs = m(room('a', 'Kitchen', "12'"), room('b', 'Hall'), room('c', 'Den'));
		const mine = m(room('a', 'Kitchen'), room('b', 'Hallway'), room('c', 'Den'));
		const c = compareMeasures(theirs, mine, base);
		expect(c.changed).toBe(2);
		expect(c.rooms.map((r) => [r.id, r.status, r.suggested])).toEqual([
			['a', 'changed', 'theirs'],
			['b', 'changed', 'mine'],
			['c', 'same', 'mine']
		]);
		expect(c.rooms[0].differences).toEqual([
			{ label: 'Shape', theirs: "rectangle 12' × 10'", mine: "rectangle 10' × 10'" }
		]);
		expect(c.builtYear).toBeNull();
	});

	it('tells a room I removed from a room they added', () => {
		const theirs = m(
			room('a', 'Kitchen'),
			room('b', 'Hall'),
			room('c', 'Den'),
			room('d', 'Closet')
		);
		const mine = m(room('a', 'Kitchen'), room('c', 'Den'));
		const c = compareMeasures(theirs, mine, base);
		const byId = Object.fromEntries(c.rooms.map((r) => [r.id, r]));
		expect(byId.b).toMatchObject({ status: 'only-theirs', suggested: 'mine' });
		expect(byId.d).toMatchObject({ status: 'only-theirs', suggested: 'theirs' });
		expect(byId.d.differences[0]).toEqual({ label: 'Name', theirs: 'Closet', mine: '—' });
	});

	it('without a base, keeps mine where both differ and keeps rooms either side added', () => {
		const c = compareMeasures(
			m(room('a', 'K', "9'"), room('x', 'Theirs')),
			m(room('a', 'K'), room('y', 'Mine'))
		);
		expect(picksFor(c).rooms).toEqual({ a: 'mine', y: 'mine', x: 'theirs' });
	});

	it('names the year built when it differs', () => {
		const c = compareMeasures({ ...base, builtYear: '1962' }, { ...base, builtYear: '1965' });
		expect(c.builtYear).toEqual({ theirs: '1962', mine: '1965', suggested: 'mine' });
	});
});

describe('merging by room', () => {
	const theirs = m(room('a', 'Kitchen', "12'"), room('b', 'Hall'), room('d', 'Closet'));
	const mine = m(room('a', 'Kitchen'), room('n', 'New bath'), room('b', 'Hallway'));

	it('takes each room from the side picked, my new rooms after the room they followed', () => {
		const merged = mergeMeasures(theirs, mine, {
			rooms: { a: 'theirs', b: 'mine', d: 'theirs', n: 'mine' },
			builtYear: 'theirs'
		});
		expect(merged.rooms.map((r) => r.name)).toEqual(['Kitchen', 'New bath', 'Hallway', 'Closet']);
		expect(merged.rooms[0].shape).toMatchObject({ width: "12'" });
	});

	it('keep mine: my measure on top of theirs; keep theirs: theirs as it is', () => {
		const c = compareMeasures(theirs, mine);
		expect(mergeMeasures(theirs, mine, picksFor(c, 'mine'))).toEqual(mine);
		expect(mergeMeasures(theirs, mine, picksFor(c, 'theirs'))).toEqual(theirs);
	});

	it('leaves out a room picked from the side that does not have it', () => {
		const merged = mergeMeasures(theirs, mine, {
			rooms: { a: 'mine', b: 'mine', d: 'mine', n: 'theirs' },
			builtYear: 'mine'
		});
		expect(merged.rooms.map((r) => r.id)).toEqual(['a', 'b']);
	});
});

describe('a room as lines of text', () => {
	it('reads the floor by its name and kind', () => {
		const r = { ...room('a', 'Kitchen'), floor: { productId: 'f1', layout: 'diagonal' as const } };
		const rows = roomRows(r, [{ id: 'f1', name: 'Grey vinyl plank', kind: 'vinyl_plank' }]);
		expect(rows.find((x) => x.key === 'floor')?.value).toBe(
			'Grey vinyl plank (Vinyl plank), diagonal'
		);
	});
});
