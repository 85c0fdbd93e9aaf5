/**
 * Unsaved changes kept on the device (localStorage) until the server confirms them, so a
 * refresh, a closed tab or a dropped connection loses nothing typed. One entry per job and
 * the version the changes were made on: `flushline:measure:<job id>:<base version>`.
 */
import { measureDraftSchema, type MeasureDraft } from './draft';

/** What a Storage needs to offer (localStorage, or a fake in specs). */
export type DraftStorage = Pick<Storage, 'getItem' | 'setItem' | 'removeItem' | 'key' | 'length'>;

export interface LocalEntry {
	jobId: string;
	/** The stored version the changes were made on (0: nothing was saved yet). */
	baseVersion: number;
	draft: MeasureDraft;
	/** When the last change was kept, ms since the epoch. */
	changedAt: number;
}

const PREFIX = 'flushline:measure:';

export function localKey(jobId: string, baseVersion: number) {
	return `${PREFIX}${jobId}:${baseVersion}`;
}

function keysOf(storage: DraftStorage, jobId: string): string[] {
	const keys: string[] = [];
	for (let i = 0; i < storage.length; i++) {
		const key = storage.key(i);
		if (key?.startsWith(`${PREFIX}${jobId}:`)) keys.push(key);
	}
	return keys;
}

/** A job's unsaved changes on this device; every call survives a missing or full storage. */
export class LocalDrafts {
	constructor(
		private storage: DraftStorage | null,
		private now: () => number = Date.now
	) {}

	/** Keeps the draft as the job's unsaved changes on `baseVersion`; false when the device refused. */
	keep(jobId: string, baseVersion: number, draft: MeasureDraft): boolean {
		if (!this.storage) return false;
		const entry: LocalEntry = { jobId, baseVersion, draft, changedAt: this.now() };
		try {
			this.storage.setItem(localKey(jobId, baseVersion), JSON.stringify(entry));
			for (const key of keysOf(this.storage, jobId))
				if (key !== localKey(jobId, baseVersion)) this.storage.removeItem(key);
			return true;
		} catch {
			return false;
		}
	}

	/** The newest unsaved changes of a job kept here, if any can be read. */
	read(jobId: string): LocalEntry | undefined {
		if (!this.storage) return undefined;
		let newest: LocalEntry | undefined;
		try {
			for (const key of keysOf(this.storage, jobId)) {
				const entry = parseEntry(this.storage.getItem(key), jobId);
				if (entry && (!newest || entry.changedAt > newest.changedAt)) newest = entry;
			}
		} catch {
			return undefined;
		}
		return newest;
	}

	/** Forgets the job's unsaved changes (the server has them now). */
	clear(jobId: string): void {
		if (!this.storage) return;
		try {
			for (const key of keysOf(this.storage, jobId)) this.storage.removeItem(key);
		} catch {
			// A storage that cannot be written cannot hold anything stale either.
		}
	}
}

function parseEntry(text: string | null, jobId: string): LocalEntry | undefined {
	if (!text) return undefined;
	try {
		const raw = JSON.parse(text);
		const draft = measureDraftSchema.safeParse(raw?.draft);
		if (!draft.success || raw.jobId !== jobId) return undefined;
		if (!Number.isInteger(raw.baseVersion) || raw.baseVersion < 0) return undefined;
		return {
			jobId,
			baseVersion: raw.baseVersion,
			// A copy: zod shares the lists of default objects between the rooms it fills in.
			draft: structuredClone(draft.data),
			changedAt: Number(raw.changedAt) || 0
		};
	} catch {
		return undefined;
	}
}

/** Two drafts hold the same input (key order aside). */
export function sameDraft(a: MeasureDraft, b: MeasureDraft): boolean {
	return canonical(a) === canonical(b);
}

function canonical(value: unknown): string {
	return JSON.stringify(value, (_key, v) =>
		v && typeof v === 'object' && !Array.isArray(v)
			? Object.fromEntries(
					Object.keys(v)
						.sort()
						.map((k) => [k, v[k]])
				)
			: v
	);
}

export type RestorePlan =
	/** Nothing kept here, or what is kept is what the server has: forget it. */
	| { action: 'none' }
	/** Changes made on the server's version: show them and save them. */
	| { action: 'restore'; draft: MeasureDraft }
	/** Changes made on an older version that someone has saved over since: show both. */
	| { action: 'conflict'; draft: MeasureDraft };

/** What to do on load with the changes kept on this device, given the server's measure. */
export function restorePlan(
	local: LocalEntry | undefined,
	server: { draft: MeasureDraft; version: number }
): RestorePlan {
	if (!local || sameDraft(local.draft, server.draft)) return { action: 'none' };
	// Nothing on the server (a new measure, or one that is gone): the kept changes are all there is.
	if (local.baseVersion === server.version || server.version === 0)
		return { action: 'restore', draft: local.draft };
	return { action: 'conflict', draft: local.draft };
}
