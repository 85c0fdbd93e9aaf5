import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { defaultSettings } from '$lib/estimating';
import { samplePriceBook } from '$lib/estimating/sample';
import { emptyRoom, type MeasureDraft } from './draft';
import { MeasureEditor, type StoredMeasure } from './editor.svelte';
import { localKey, type DraftStorage } from './local';

/** A Storage held in a Map, like localStorage. */
function memoryStorage(): DraftStorage & { map: Map<string, string> } {
	const map = new Map<string, string>();
	return {
		map,
		get length() {
			return map.size;
		},
		key: (i) => [...map.keys()][i] ?? null,
		getItem: (k) => map.get(k) ?? null,
		setItem: (k, v) => void map.set(k, v),
		removeItem: (k) => void map.delete(k)
	};
}

const floors = samplePriceBook.floors.map(({ id, name, kind }) => ({ id, name, kind }));

function kitchen(width = "12'", length = "10'") {
	return {
		...emptyRoom('r1', 'Kitchen'),
		shape: { kind: 'rect' as const, width, length },
		floor: { productId: 'lvp-grey', layout: 'straight' as const }
	};
}

function stored(draft: MeasureDraft, version = 1, by = 'Jonah Pellew'): StoredMeasure {
	return { draft, version, updatedAt: '2030-01-01T10:41:00Z', updatedByName: by };
}

type Answer = { status: number; body: unknown } | 'offline';

/** A fetch that answers from a list, and records what was sent. */
function server(answers: Answer[]) {
	const sent: { baseVersion: number; draft: MeasureDraft }[] = [];
	const fetch = vi.fn(async (_url: string, init?: RequestInit) => {
		sent.push(JSON.parse(String(init?.body)));
		const next = answers.shift();
		if (!next || next === 'offline') throw new TypeError('Failed to fetch');
		return new Response(JSON.stringify(next.body), {
			status: next.status,
			headers: { 'content-type': 'application/json' }
		});
	});
	return { fetch: fetch as unknown as typeof globalThis.fetch, sent, calls: fetch };
}

function editor(
	opts: {
		draft?: MeasureDraft;
		version?: number;
		storage?: ReturnType<typeof memoryStorage>;
		answers?: Answer[];
	} = {}
) {
	const storage = opts.storage ?? memoryStorage();
	const s = server(opts.answers ?? []);
	const e = new MeasureEditor({
		jobId: 'job-1',
		stored: stored(opts.draft ?? { builtYear: '', rooms: [kitchen()] }, opts.version ?? 1),
		settings: defaultSettings,
		priceBook: samplePriceBook,
		floors,
		userName: 'Priya Lindqvist',
		storage,
		fetch: s.fetch,
		saveDelay: 50,
		estimateDelay: 0
	});
	return { e, storage, ...s };
}

const saved = (version: number) => ({
	status: 200,
	body: { version, updatedAt: '2030-01-01T10:42:00Z' }
});

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe('the measure editor', () => {
	it('reads what is typed: the area, the reading and the message by the field', () => {
		const { e } = editor();
		e.start();
		expect(e.outlines[0].shape?.areaSqFt).toBe(120);
		e.draft.rooms[0].shape = { kind: 'rect', width: '12 ft 6 1/0 in', length: "10'" };
		expect(e.messageFor('rooms.0.shape.width')).toMatch(/bottom cannot be 0/);
		expect(e.outlines[0].shape).toBeUndefined();
	});

	it('keeps every change on the device at once, and forgets it when the server has it', async () => {
		const { e, storage, sent } = editor({ answers: [saved(2)] });
		e.start();
		e.draft.rooms[0].name = 'Big kitchen';
		e.changed();
		expect(e.save.kind).toBe('pending');
		const kept = JSON.parse(storage.getItem(localKey('job-1', 1))!);
		expect(kept.draft.rooms[0].name).toBe('Big kitchen');
		await vi.advanceTimersByTimeAsync(60);
		expect(sent).toEqual([{ baseVersion: 1, draft: expect.objectContaining({ builtYear: '' }) }]);
		expect(sent[0].draft.rooms[0].name).toBe('Big kitchen');
		expect(e.save.kind).toBe('saved');
		expect(e.version).toBe(2);
		expect(e.savedBy).toBe('Priya Lindqvist');
		expect(storage.map.size).toBe(0);
	});

	it('waits for the last keystroke: one save for a burst of typing', async () => {
		const { e, sent } = editor({ answers: [saved(2)] });
		e.start();
		for (const w of ['1', '12', "12'", "12' 6"]) {
			e.draft.rooms[0].shape = { kind: 'rect', width: w, length: "10'" };
			e.changed();
			await vi.advanceTimersByTimeAsync(10);
		}
		await vi.advanceTimersByTimeAsync(60);
		expect(sent.length).toBe(1);
		expect(sent[0].draft.rooms[0].shape).toMatchObject({ width: "12' 6" });
	});

	it('never saves on a version whose answer is still arriving (a slow phone)', async () => {
		// The server answers at once, but each answer's body takes 200 ms to come in; a change
		// typed meanwhile must wait for the new version, or it is refused as someone else's save.
		const sent: { baseVersion: number }[] = [];
		let version = 1;
		const fetch = vi.fn(async (_url: string, init?: RequestInit) => {
			sent.push(JSON.parse(String(init?.body)));
			const answer = { version: ++version, updatedAt: '2030-01-01T10:42:00Z' };
			const json = () => new Promise((resolve) => setTimeout(() => resolve(answer), 200));
			return { ok: true, status: 200, json } as unknown as Response;
		});
		const { e } = editor();
		Object.assign(e, { fetch });
		e.start();
		e.draft.rooms[0].name = 'Kitchen and nook';
		e.changed();
		await vi.advanceTimersByTimeAsync(60);
		expect(sent).toEqual([expect.objectContaining({ baseVersion: 1 })]);
		e.draft.rooms[0].notes = 'Nook under the window';
		e.changed();
		await vi.advanceTimersByTimeAsync(100);
		// Still reading the first answer: nothing more is sent on version 1.
		expect(sent.length).toBe(1);
		await vi.advanceTimersByTimeAsync(500);
		expect(sent.map((s) => s.baseVersion)).toEqual([1, 2]);
		expect(e.version).toBe(3);
		expect(e.save.kind).toBe('saved');
	});

	it('offline: keeps the changes on the device and saves them when the connection returns', async () => {
		const { e, storage, sent } = editor({ answers: ['offline', saved(2)] });
		e.start();
		e.draft.builtYear = '1962';
		e.changed();
		await vi.advanceTimersByTimeAsync(60);
		expect(e.save.kind).toBe('offline');
		expect(storage.map.size).toBe(1);
		e.wentOnline();
		await vi.advanceTimersByTimeAsync(0);
		expect(sent.length).toBe(2);
		expect(e.save.kind).toBe('saved');
		expect(storage.map.size).toBe(0);
	});

	it('retries a failing server, waiting longer each time', async () => {
		const { e, calls } = editor({
			answers: [
				{ status: 500, body: { message: 'Down' } },
				{ status: 500, body: { message: 'Down' } },
				saved(2)
			]
		});
		e.start();
		e.draft.builtYear = '1970';
		e.changed();
		await vi.advanceTimersByTimeAsync(60);
		expect(e.save).toEqual({ kind: 'failed', message: 'Down', retrying: true });
		await vi.advanceTimersByTimeAsync(2_000);
		expect(calls).toHaveBeenCalledTimes(2);
		await vi.advanceTimersByTimeAsync(3_000);
		expect(calls).toHaveBeenCalledTimes(2);
		await vi.advanceTimersByTimeAsync(1_000);
		expect(calls).toHaveBeenCalledTimes(3);
		expect(e.save.kind).toBe('saved');
	});

	it('restores changes kept on the device after a refresh, and saves them', async () => {
		const storage = memoryStorage();
		const first = editor({ storage });
		first.e.start();
		first.e.draft.rooms[0].name = 'Galley kitchen';
		first.e.changed();
		first.e.stop();
		// The page is reloaded before the save went out.
		const second = editor({ storage, answers: [saved(2)] });
		second.e.start();
		expect(second.e.restored).toBe(true);
		expect(second.e.draft.rooms[0].name).toBe('Galley kitchen');
		await vi.advanceTimersByTimeAsync(0);
		expect(second.sent[0]).toMatchObject({ baseVersion: 1 });
		expect(second.e.save.kind).toBe('saved');
	});

	it('shows both when changes kept on the device were made on a version saved over since', () => {
		const storage = memoryStorage();
		const first = editor({ storage });
		first.e.start();
		first.e.draft.rooms[0].name = 'Mine';
		first.e.changed();
		const theirs = { builtYear: '', rooms: [{ ...kitchen(), name: 'Theirs' }] };
		const second = editor({ storage, draft: theirs, version: 2 });
		second.e.start();
		expect(second.e.save.kind).toBe('conflict');
		expect(second.e.conflict?.theirs.version).toBe(2);
		expect(second.e.comparison?.rooms[0].differences).toEqual([
			{ label: 'Name', theirs: 'Theirs', mine: 'Mine' }
		]);
		// Still kept on the version it was made on, so a reload shows both again.
		expect(storage.getItem(localKey('job-1', 1))).not.toBeNull();
	});

	it('a save told that someone else saved stops autosaving and shows their measure', async () => {
		const theirs = stored({ builtYear: '', rooms: [kitchen("14'", "10'")] }, 2);
		const { e, calls } = editor({
			answers: [{ status: 409, body: { message: 'x', current: theirs } }]
		});
		e.start();
		e.draft.rooms[0].shape = { kind: 'rect', width: "13'", length: "10'" };
		e.changed();
		await vi.advanceTimersByTimeAsync(60);
		expect(e.save.kind).toBe('conflict');
		expect(e.conflict?.theirs.updatedByName).toBe('Jonah Pellew');
		expect(e.comparison?.rooms[0].differences).toEqual([
			{ label: 'Shape', theirs: "rectangle 14' × 10'", mine: "rectangle 13' × 10'" }
		]);
		e.draft.rooms[0].name = 'Still typing';
		e.changed();
		await vi.advanceTimersByTimeAsync(5_000);
		expect(calls).toHaveBeenCalledTimes(1);
	});

	it('keep mine saves my input on top of their version', async () => {
		const theirs = stored({ builtYear: '1950', rooms: [kitchen("14'", "10'")] }, 2);
		const { e, sent } = editor({
			answers: [{ status: 409, body: { message: 'x', current: theirs } }, saved(3)]
		});
		e.start();
		e.draft.rooms[0].shape = { kind: 'rect', width: "13'", length: "10'" };
		e.changed();
		await vi.advanceTimersByTimeAsync(60);
		e.resolve({ rooms: { r1: 'mine' }, builtYear: 'mine' });
		await vi.advanceTimersByTimeAsync(0);
		expect(sent[1]).toMatchObject({ baseVersion: 2, draft: { builtYear: '' } });
		expect(sent[1].draft.rooms[0].shape).toMatchObject({ width: "13'" });
		expect(e.save.kind).toBe('saved');
		expect(e.version).toBe(3);
	});

	it('keep theirs takes their measure and saves nothing', async () => {
		const theirs = stored({ builtYear: '', rooms: [kitchen("14'", "10'")] }, 2);
		const { e, calls, storage } = editor({
			answers: [{ status: 409, body: { message: 'x', current: theirs } }]
		});
		e.start();
		e.draft.rooms[0].shape = { kind: 'rect', width: "13'", length: "10'" };
		e.changed();
		await vi.advanceTimersByTimeAsync(60);
		e.resolve({ rooms: { r1: 'theirs' }, builtYear: 'theirs' });
		await vi.advanceTimersByTimeAsync(100);
		expect(calls).toHaveBeenCalledTimes(1);
		expect(e.draft.rooms[0].shape).toMatchObject({ width: "14'" });
		expect(e.version).toBe(2);
		expect(e.save.kind).toBe('saved');
		expect(storage.map.size).toBe(0);
	});

	it('a refused save says why and keeps the changes on the device', async () => {
		const { e, storage } = editor({
			answers: [{ status: 404, body: { message: 'Not found' } }]
		});
		e.start();
		e.draft.builtYear = '1999';
		e.changed();
		await vi.advanceTimersByTimeAsync(60);
		expect(e.save).toEqual({ kind: 'failed', message: 'Not found', retrying: false });
		expect(storage.map.size).toBe(1);
	});

	it('removes a room with undo, and puts it back where it was', () => {
		const { e } = editor({
			draft: { builtYear: '', rooms: [kitchen(), { ...emptyRoom('r2', 'Hall') }] }
		});
		e.apply('remove-room:r1');
		expect(e.draft.rooms.map((r) => r.id)).toEqual(['r2']);
		expect(e.selectedId).toBe('r2');
		e.undoRemove();
		expect(e.draft.rooms.map((r) => r.id)).toEqual(['r1', 'r2']);
		expect(e.selectedId).toBe('r1');
	});

	it('shows "Enter the ..." only for fields left once, or after Check', () => {
		const { e } = editor({ draft: { builtYear: '', rooms: [emptyRoom('r1', 'Hall')] } });
		expect(e.messageFor('rooms.0.shape.width')).toBeUndefined();
		e.touch('rooms.0.shape.width');
		expect(e.messageFor('rooms.0.shape.width')).toBe('Enter the width');
		expect(e.messageFor('rooms.0.shape.length')).toBeUndefined();
		e.revealAll = true;
		expect(e.messageFor('rooms.0.shape.length')).toBe('Enter the length');
	});

	it('runs the estimate and puts "Choose the new floor" by the floor of the room', () => {
		const { e } = editor({
			draft: {
				builtYear: '',
				rooms: [
					{ ...kitchen(), floor: { productId: '', layout: 'straight' } },
					{ ...kitchen("8'", "6'"), id: 'r2', name: 'Hall' }
				]
			}
		});
		e.start();
		expect(e.result?.rooms.find((r) => r.id === 'r2')?.areaSqFt).toBe(48);
		expect(e.messageFor('rooms.0.floor.productId')).toBe('Choose the new floor');
	});
});
