/**
 * The site measure editor's state: the draft as typed, what each field reads as, the live
 * estimate, and saving as you go. Every change is kept on the device first (localStorage) and
 * then saved to the server; a save made on a version someone else has saved over stops and
 * shows both inputs. Nothing typed is dropped on the way.
 */
import { afterPointer } from './pointer';
import { untrack } from 'svelte';
import { SvelteSet } from 'svelte/reactivity';
import { estimate, type EstimateResult, type PriceBook, type StoreSettings } from '$lib/estimating';
import { collectMessages, draftPathsOf, roomOutlineOf } from './check';
import { toEngine, type DraftError, type MeasureDraft, type RoomDraft } from './draft';
import { isoTime } from './format';
import { LocalDrafts, restorePlan, type DraftStorage } from './local';
import { compareMeasures, mergeMeasures, type FloorChoice, type Side } from './merge';
import { applyOp, type OpResult } from './ops';

/** The measure as the server holds it. */
export interface StoredMeasure {
	draft: MeasureDraft;
	version: number;
	updatedAt: string | Date | null;
	updatedByName: string | null;
}

export type SaveState =
	/** The server has everything typed. */
	| { kind: 'saved' }
	/** Changes kept on the device, waiting a moment before saving. */
	| { kind: 'pending' }
	| { kind: 'saving' }
	/** No connection: changes are kept on the device and saved when it returns. */
	| { kind: 'offline' }
	/** The server refused or failed; `retrying` when another try is planned. */
	| { kind: 'failed'; message: string; retrying: boolean }
	/** Someone else saved: autosave stops until the user chooses. */
	| { kind: 'conflict' };

export interface EditorOptions {
	jobId: string;
	stored: StoredMeasure;
	settings: StoreSettings;
	priceBook: PriceBook;
	floors: FloorChoice[];
	/** The signed-in user's name, for "Saved by". */
	userName: string;
	/** The room to show first (from the address), else the first room. */
	selected?: string | null;
	storage?: DraftStorage | null;
	fetch?: typeof fetch;
	/** Whether the device thinks it is online (navigator.onLine). */
	online?: () => boolean;
	/** Changes sent by a form that was refused (the page without JavaScript), to take back first. */
	pending?: { draft: MeasureDraft; baseVersion: number } | null;
	/** Wait after the last keystroke before saving, ms. */
	saveDelay?: number;
	estimateDelay?: number;
}

const plain = <T>(v: T): T => JSON.parse(JSON.stringify(v));

/** A response's message, or a sentence for its status. */
async function messageOf(res: Response): Promise<string> {
	const body = await res.json().catch(() => undefined);
	if (res.status === 401) return 'sign in again; your changes are kept on this device';
	if (res.status === 400 && body?.issues?.length)
		return `${body.message}: ${body.issues.map((i: { path: string; message: string }) => `${i.path} ${i.message}`).join('; ')}`;
	return body?.message ?? `the server answered ${res.status}`;
}

export class MeasureEditor {
	readonly jobId: string;
	readonly settings: StoreSettings;
	readonly priceBook: PriceBook;
	readonly floors: FloorChoice[];

	draft: MeasureDraft = $state({ builtYear: '', rooms: [] });
	/** The stored version the draft is based on (0: nothing saved yet). */
	version = $state(0);
	/** When the server last saved it (ISO time). */
	savedAt: string | null = $state(null);
	savedBy: string | null = $state(null);
	save: SaveState = $state({ kind: 'saved' });
	/** Their measure, when a save found that someone else saved in between. */
	conflict: { theirs: StoredMeasure; base?: MeasureDraft; mineVersion: number } | null =
		$state(null);
	selectedId: string | null = $state(null);
	/** The room just removed, to put back. */
	undo: { room: RoomDraft; index: number } | null = $state(null);
	/** Changes restored from the device on load (shown once). */
	restored = $state(false);
	/** False when the device refused to keep the changes (storage full or off). */
	keptOnDevice = $state(true);
	/** Fields left once, so their "Enter the ..." message may show. */
	touched = new SvelteSet<string>();
	/** Show every message, empty fields too (after Check or Save). */
	revealAll = $state(false);
	result: EstimateResult | null = $state.raw(null);
	engineErrors: DraftError[] = $state.raw([]);

	readonly reading = $derived.by(() => toEngine(this.draft, this.settings));
	readonly outlines = $derived.by(() =>
		this.draft.rooms.map((room) => roomOutlineOf(room, this.settings))
	);
	readonly messages = $derived(
		collectMessages(this.draft, {
			draft: this.reading.errors,
			outlines: this.outlines.flatMap((o, i) =>
				o.errors.map((e) => ({
					...e,
					path: `rooms.${i}.${e.path}`,
					roomId: this.draft.rooms[i].id
				}))
			),
			engine: this.engineErrors
		})
	);
	readonly selectedIndex = $derived(this.draft.rooms.findIndex((r) => r.id === this.selectedId));
	readonly selected = $derived(
		this.selectedIndex >= 0 ? this.draft.rooms[this.selectedIndex] : undefined
	);
	readonly comparison = $derived.by(() =>
		this.conflict
			? compareMeasures(this.conflict.theirs.draft, this.draft, this.conflict.base, this.floors)
			: null
	);

	private local: LocalDrafts;
	private pending: EditorOptions['pending'];
	private fetch: typeof fetch;
	private online: () => boolean;
	private userName: string;
	private saveDelay: number;
	private estimateDelay: number;
	/** The JSON of what the server holds at `version`. */
	private savedJson: string;
	private savedDraft: MeasureDraft;
	private lastJson = '';
	private inflight = false;
	private again = false;
	private attempt = 0;
	private saveTimer: ReturnType<typeof setTimeout> | undefined;
	private estimateTimer: ReturnType<typeof setTimeout> | undefined;

	constructor(o: EditorOptions) {
		this.jobId = o.jobId;
		this.settings = o.settings;
		this.priceBook = o.priceBook;
		this.floors = o.floors;
		this.userName = o.userName;
		this.local = new LocalDrafts(o.storage ?? null);
		this.pending = o.pending ? plain(o.pending) : null;
		this.fetch = o.fetch ?? ((...args) => fetch(...args));
		this.online = o.online ?? (() => true);
		this.saveDelay = o.saveDelay ?? 800;
		this.estimateDelay = o.estimateDelay ?? 200;
		this.draft = plain(o.stored.draft);
		this.version = o.stored.version;
		this.savedAt = isoTime(o.stored.updatedAt);
		this.savedBy = o.stored.updatedByName;
		this.savedDraft = plain(o.stored.draft);
		this.savedJson = JSON.stringify(o.stored.draft);
		this.lastJson = this.savedJson;
		const wanted = o.selected && this.draft.rooms.some((r) => r.id === o.selected);
		this.selectedId = wanted ? o.selected! : (this.draft.rooms[0]?.id ?? null);
	}

	/**
	 * On the device, after the page is shown: takes back changes kept here that the server does
	 * not have (saving them, or showing both when someone saved over them), and runs the estimate.
	 */
	start(): void {
		const kept = this.pending
			? { jobId: this.jobId, changedAt: 0, ...this.pending }
			: this.local.read(this.jobId);
		const plan = restorePlan(kept, { draft: this.savedDraft, version: this.version });
		if (plan.action === 'none') this.local.clear(this.jobId);
		else {
			const stored: StoredMeasure = {
				draft: this.savedDraft,
				version: this.version,
				updatedAt: this.savedAt,
				updatedByName: this.savedBy
			};
			this.draft = plan.draft;
			this.restored = true;
			if (!this.draft.rooms.some((r) => r.id === this.selectedId))
				this.selectedId = this.draft.rooms[0]?.id ?? null;
			// What the kept changes were made on is not known here: no base to compare with.
			if (plan.action === 'conflict') this.enterConflict(stored, kept!.baseVersion, undefined);
			this.changed(JSON.stringify(this.draft));
			if (plan.action === 'restore') void this.saveNow();
		}
		this.runEstimate();
	}

	/** Reads the whole draft (so an effect re-runs on any change) and reacts to a change. */
	watch(): void {
		const json = JSON.stringify(this.draft);
		untrack(() => this.changed(json));
	}

	/** The draft changed (its JSON given): keep it on the device, then save in a moment. */
	changed(json = JSON.stringify(this.draft)): void {
		if (json === this.lastJson) return;
		this.lastJson = json;
		this.scheduleEstimate();
		if (json === this.savedJson && !this.conflict) {
			this.local.clear(this.jobId);
			clearTimeout(this.saveTimer);
			if (!this.inflight) this.save = { kind: 'saved' };
			return;
		}
		// In a conflict the changes stay on the version they were made on, so a reload shows both again.
		const base = this.conflict ? this.conflict.mineVersion : this.version;
		this.keptOnDevice = this.local.keep(this.jobId, base, JSON.parse(json));
		if (this.conflict) return;
		if (this.save.kind === 'saved' || this.save.kind === 'pending') this.save = { kind: 'pending' };
		this.scheduleSave(this.saveDelay);
	}

	/** Whether something typed is not on the server yet. */
	get unsaved(): boolean {
		return JSON.stringify(this.draft) !== this.savedJson;
	}

	private scheduleSave(ms: number) {
		clearTimeout(this.saveTimer);
		this.saveTimer = setTimeout(() => void this.saveNow(), ms);
	}

	/** Saves now (unless someone else's save is waiting for the user's choice). */
	async saveNow(): Promise<void> {
		clearTimeout(this.saveTimer);
		if (this.conflict) return;
		if (this.inflight) {
			this.again = true;
			return;
		}
		const json = JSON.stringify(this.draft);
		if (json === this.savedJson) {
			this.local.clear(this.jobId);
			this.save = { kind: 'saved' };
			return;
		}
		const base = this.version;
		this.inflight = true;
		this.save = { kind: 'saving' };
		let res: Response;
		// The answer is read before the next save may go: on a slow phone its body can come in
		// well after its head, and a save sent meanwhile would name the old version.
		let body: { version: number; updatedAt: string; current?: StoredMeasure } | undefined;
		try {
			res = await this.fetch(`/api/v1/jobs/${this.jobId}/measure`, {
				method: 'PUT',
				headers: { 'content-type': 'application/json', accept: 'application/json' },
				body: `{"baseVersion":${base},"draft":${json}}`
			});
			if (res.ok) body = await res.json();
			else if (res.status === 409) body = await res.json().catch(() => undefined);
		} catch {
			this.inflight = false;
			this.save = { kind: 'offline' };
			this.retryLater();
			return;
		}
		this.inflight = false;
		if (res.ok && body) {
			this.attempt = 0;
			this.version = body.version;
			this.savedAt = String(body.updatedAt);
			this.savedBy = this.userName;
			this.savedJson = json;
			this.savedDraft = JSON.parse(json);
			if (JSON.stringify(this.draft) === json) {
				this.local.clear(this.jobId);
				this.save = { kind: 'saved' };
			} else {
				// Typed on while the save was on its way: keep that on the new version, save it next.
				this.keptOnDevice = this.local.keep(this.jobId, this.version, plain(this.draft));
				this.save = { kind: 'pending' };
				this.scheduleSave(this.again ? 0 : this.saveDelay);
			}
			this.again = false;
			return;
		}
		if (res.status === 409) {
			if (body?.current) {
				this.enterConflict(body.current, base, this.savedDraft);
				return;
			}
		}
		const message = await messageOf(res);
		const retrying = res.status >= 500 || res.status === 429;
		this.save = { kind: 'failed', message, retrying };
		if (retrying) this.retryLater();
	}

	/** Tries again later, waiting longer each time (2 s, 4 s ... up to a minute). */
	private retryLater() {
		const ms = Math.min(60_000, 2_000 * 2 ** this.attempt);
		this.attempt++;
		this.scheduleSave(ms);
	}

	/** The connection is back: save what waits, now. */
	wentOnline(): void {
		this.attempt = 0;
		if (this.save.kind === 'offline' || (this.save.kind === 'failed' && this.save.retrying))
			void this.saveNow();
	}

	wentOffline(): void {
		if (this.unsaved && !this.conflict && this.save.kind !== 'saving')
			this.save = { kind: 'offline' };
	}

	private enterConflict(
		theirs: StoredMeasure,
		mineVersion: number,
		base: MeasureDraft | undefined
	) {
		clearTimeout(this.saveTimer);
		this.conflict = { theirs: plain(theirs), base, mineVersion };
		this.save = { kind: 'conflict' };
	}

	/**
	 * Settles a conflict: each room from the side picked, saved on top of their version. Keeping
	 * theirs for everything leaves nothing to save.
	 */
	resolve(picks: { rooms: Record<string, Side>; builtYear: Side }): void {
		if (!this.conflict) return;
		const { theirs } = this.conflict;
		const merged = mergeMeasures(theirs.draft, plain(this.draft), picks);
		this.version = theirs.version;
		this.savedAt = isoTime(theirs.updatedAt);
		this.savedBy = theirs.updatedByName;
		this.savedDraft = plain(theirs.draft);
		this.savedJson = JSON.stringify(theirs.draft);
		this.conflict = null;
		this.draft = merged;
		if (!merged.rooms.some((r) => r.id === this.selectedId))
			this.selectedId = merged.rooms[0]?.id ?? null;
		this.save = { kind: 'pending' };
		this.changed(JSON.stringify(merged));
		void this.saveNow();
	}

	/** Runs a button's operation on the draft; `remove-room` keeps the room to put back. */
	apply(op: string): OpResult {
		const result = applyOp(this.draft, op);
		if (result.removed) this.undo = result.removed;
		if (result.selected !== undefined) this.selectedId = result.selected ?? null;
		if (!this.draft.rooms.some((r) => r.id === this.selectedId))
			this.selectedId = this.draft.rooms[0]?.id ?? null;
		return result;
	}

	/** Puts the room just removed back where it was. */
	undoRemove(): void {
		if (!this.undo) return;
		const { room, index } = this.undo;
		if (!this.draft.rooms.some((r) => r.id === room.id))
			this.draft.rooms.splice(Math.min(index, this.draft.rooms.length), 0, room);
		this.selectedId = room.id;
		this.undo = null;
	}

	select(id: string): void {
		if (this.draft.rooms.some((r) => r.id === id)) this.selectedId = id;
	}

	touch(path: string): void {
		// A field left by pressing a button shows its message once the press has landed.
		afterPointer(() => this.touched.add(path));
	}

	/** The message to show by a field: empty fields only once left or after Check. */
	messageFor(path: string): string | undefined {
		const m = this.messages.fields[path];
		if (!m) return undefined;
		if (this.messages.empty.has(path) && !this.revealAll && !this.touched.has(path))
			return undefined;
		return m;
	}

	/** Messages of a group (a rectangle, a side, the shape) that belong to no single field. */
	groupMessages(prefix: string): string[] {
		return Object.entries(this.messages.fields)
			.filter(([p]) => p === prefix)
			.map(([, m]) => m);
	}

	private scheduleEstimate() {
		clearTimeout(this.estimateTimer);
		this.estimateTimer = setTimeout(() => this.runEstimate(), this.estimateDelay);
	}

	/** The engine on the readable rooms, with the store's settings and price book. */
	runEstimate(): void {
		const { job } = this.reading;
		const result = estimate({ job, settings: this.settings, priceBook: this.priceBook });
		this.result = result;
		this.engineErrors = draftPathsOf(this.draft, job, result.errors);
	}

	/** Stops timers (the page is going away; what is unsaved stays on the device). */
	stop(): void {
		clearTimeout(this.saveTimer);
		clearTimeout(this.estimateTimer);
	}
}
