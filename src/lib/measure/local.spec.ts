import { describe, expect, it } from 'vitest';
import { emptyRoom, type MeasureDraft } from './draft';
import { LocalDrafts, localKey, restorePlan, sameDraft, type DraftStorage } from './local';

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

const draft = (name: string): MeasureDraft => ({ builtYear: '', rooms: [emptyRoom('r1', name)] });

describe('changes kept on the device', () => {
	it('keeps one entry per job, keyed by the version it was made on', () => {
		const storage = memoryStorage();
		let now = 1;
		const local = new LocalDrafts(storage, () => now++);
		local.keep('job-a', 1, draft('Kitchen'));
		local.keep('job-a', 2, draft('Kitchen 2'));
		local.keep('job-b', 0, draft('Hall'));
		expect([...storage.map.keys()].sort()).toEqual([localKey('job-a', 2), localKey('job-b', 0)]);
		expect(local.read('job-a')).toMatchObject({ baseVersion: 2, draft: draft('Kitchen 2') });
		local.clear('job-a');
		expect(local.read('job-a')).toBeUndefined();
		expect(local.read('job-b')?.draft.rooms[0].name).toBe('Hall');
	});

	it('survives a full or missing storage, and ignores what it cannot read', () => {
		const full = memoryStorage();
		full.setItem = () => {
			throw new DOMException('full', 'QuotaExceededError');
		};
		expect(new LocalDrafts(full).keep('job', 0, draft('x'))).toBe(false);
		expect(new LocalDrafts(null).keep('job', 0, draft('x'))).toBe(false);
		expect(new LocalDrafts(null).read('job')).toBeUndefined();
		const odd = memoryStorage();
		odd.setItem(localKey('job', 0), '{not json');
		odd.setItem(
			localKey('job', 1),
			JSON.stringify({ jobId: 'job', baseVersion: 1, draft: { rooms: 'no' } })
		);
		expect(new LocalDrafts(odd).read('job')).toBeUndefined();
	});
});

describe('what to do on load with what the device kept', () => {
	const server = { draft: draft('Kitchen'), version: 3 };
	const entry = (name: string, baseVersion: number) => ({
		jobId: 'j',
		baseVersion,
		draft: draft(name),
		changedAt: 1
	});

	it('nothing kept, or what the server has already: nothing to do', () => {
		expect(restorePlan(undefined, server)).toEqual({ action: 'none' });
		expect(restorePlan(entry('Kitchen', 2), server)).toEqual({ action: 'none' });
	});

	it('changes on the server’s version: restore them (and save)', () => {
		expect(restorePlan(entry('Galley', 3), server)).toEqual({
			action: 'restore',
			draft: draft('Galley')
		});
		expect(restorePlan(entry('Galley', 4), { draft: draft(''), version: 0 }).action).toBe(
			'restore'
		);
	});

	it('changes on a version saved over since: show both', () => {
		expect(restorePlan(entry('Galley', 2), server).action).toBe('conflict');
	});

	it('compares drafts whatever the order of their keys', () => {
		const a = draft('K');
		const b = JSON.parse(JSON.stringify({ rooms: a.rooms, builtYear: a.builtYear }));
		expect(sameDraft(a, b)).toBe(true);
		expect(sameDraft(a, draft('L'))).toBe(false);
	});
});
