// The measure's JSON API and its form fallback, called as SvelteKit calls them: the handler gets
// a request event whose locals are what the hooks put there for a real member of a real store.
import { inStore } from '$lib/server/db/tenant';
import { isActionFailure, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import * as measures from '$lib/server/db/queries/measures';
import { emptyRoom, type MeasureDraft } from '$lib/measure/draft';
import {
	addMember,
	makeJob,
	makeStore,
	memberEvent,
	roomDraft,
	type Member,
	type TestStore
} from './factories';

let current: Partial<RequestEvent> | undefined;
vi.mock('$app/server', () => ({ getRequestEvent: () => current }));

const { GET, PUT } = await import('../../src/routes/api/v1/jobs/[id]/measure/+server');
const { actions } = await import('../../src/routes/app/jobs/[id]/measure/+page.server');

function event(who: Member, jobId: string, path: string, init?: RequestInit) {
	const e = memberEvent(who, path, { id: jobId }, init);
	current = e;
	return e;
}

const put = (who: Member, jobId: string, body: unknown) =>
	PUT(
		event(who, jobId, `/api/v1/jobs/${jobId}/measure`, {
			method: 'PUT',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify(body)
		}) as Parameters<typeof PUT>[0]
	);
const get = (who: Member, jobId: string) =>
	GET(event(who, jobId, `/api/v1/jobs/${jobId}/measure`) as Parameters<typeof GET>[0]);

const draft = (...rooms: MeasureDraft['rooms']): MeasureDraft => ({ builtYear: '1962', rooms });

let store: TestStore;
let other: TestStore;
let owner: Member;
let sales: Member;
let installer: Member;
let stranger: Member;

beforeAll(async () => {
	store = await makeStore('Measure API Floors');
	other = await makeStore('Other Measure Floors');
	owner = { user: store.owner, role: 'owner', store };
	sales = { user: await addMember(store.id, 'sales', 'Jonah Measure'), role: 'sales', store };
	installer = { user: await addMember(store.id, 'installer'), role: 'installer', store };
	stranger = { user: other.owner, role: 'owner', store: other };
});

describe('PUT and GET /api/v1/jobs/:id/measure', () => {
	it('saves on version 0, then on the version it got back, and reads it with who saved it', async () => {
		const job = await makeJob(store.id, owner.user.id);
		const empty = await get(sales, job.id);
		expect(await empty.json()).toMatchObject({ version: 0, draft: { rooms: [] } });

		const first = await put(sales, job.id, {
			baseVersion: 0,
			draft: draft(roomDraft('r1', 'Kitchen', 'some-floor'))
		});
		expect(first.status).toBe(200);
		const saved = await first.json();
		expect(saved).toEqual({ version: 1, updatedAt: expect.any(String) });

		const second = await put(owner, job.id, {
			baseVersion: 1,
			draft: draft(roomDraft('r1', 'Kitchen', 'some-floor', "14'"))
		});
		expect(await second.json()).toMatchObject({ version: 2 });
		const read = await (await get(sales, job.id)).json();
		expect(read).toMatchObject({ version: 2, updatedByName: store.owner.name });
		expect(read.draft.rooms[0].shape).toEqual({ kind: 'rect', width: "14'", length: "10'" });
	});

	it('a save on a version someone saved over is 409 with their measure, and writes nothing', async () => {
		const job = await makeJob(store.id, owner.user.id);
		await put(sales, job.id, { baseVersion: 0, draft: draft(roomDraft('r1', 'Hall', 'f')) });
		const late = await put(owner, job.id, {
			baseVersion: 0,
			draft: draft(roomDraft('r1', 'Hallway', 'f'))
		});
		expect(late.status).toBe(409);
		const body = await late.json();
		expect(body.message).toBe('Jonah Measure saved this measure while you were editing');
		expect(body.current).toMatchObject({
			version: 1,
			updatedByName: 'Jonah Measure',
			draft: { rooms: [{ name: 'Hall' }] }
		});
		expect((await inStore(store.id, (tx) => measures.read(tx, job.id)))?.draft.rooms[0].name).toBe(
			'Hall'
		);
	});

	it("another store's job is 404, and its measure is untouched", async () => {
		const job = await makeJob(store.id, owner.user.id);
		await put(owner, job.id, { baseVersion: 0, draft: draft(roomDraft('r1', 'Den', 'f')) });
		const taken = await put(stranger, job.id, {
			baseVersion: 1,
			draft: draft(roomDraft('r1', 'Taken', 'f'))
		});
		expect(taken.status).toBe(404);
		expect(await taken.json()).toEqual({ message: 'Not found' });
		expect((await get(stranger, job.id)).status).toBe(404);
		expect((await inStore(store.id, (tx) => measures.read(tx, job.id)))?.draft.rooms[0].name).toBe(
			'Den'
		);
		expect((await put(owner, crypto.randomUUID(), { baseVersion: 0, draft: draft() })).status).toBe(
			404
		);
	});

	it('a bad body is 400 with the path of each bad field; not JSON is 415', async () => {
		const job = await makeJob(store.id, owner.user.id);
		const bad = await put(owner, job.id, {
			baseVersion: -1,
			draft: {
				builtYear: '1962',
				rooms: [
					{ ...emptyRoom('a', 'X'), id: '', shape: { kind: 'oval' } },
					{ ...emptyRoom('b'), name: 7 }
				]
			}
		});
		expect(bad.status).toBe(400);
		const body = await bad.json();
		expect(body.issues.map((i: { path: string }) => i.path)).toEqual([
			'baseVersion',
			'draft.rooms.0.id',
			'draft.rooms.0.shape.kind',
			'draft.rooms.1.name'
		]);
		const text = await PUT(
			event(owner, job.id, `/api/v1/jobs/${job.id}/measure`, {
				method: 'PUT',
				headers: { 'content-type': 'text/plain' },
				body: 'rooms'
			}) as Parameters<typeof PUT>[0]
		);
		expect(text.status).toBe(415);
		expect(await inStore(store.id, (tx) => measures.read(tx, job.id))).toBeUndefined();
	});

	it('an installer may neither read nor save a measure', async () => {
		const job = await makeJob(store.id, owner.user.id);
		const refused = await put(installer, job.id, { baseVersion: 0, draft: draft() });
		expect(refused.status).toBe(403);
		expect((await get(installer, job.id)).status).toBe(403);
		expect(await inStore(store.id, (tx) => measures.read(tx, job.id))).toBeUndefined();
	});
});

describe('the measure form without JavaScript', () => {
	async function post(who: Member, jobId: string, fields: Record<string, string>, action = 'save') {
		const form = new FormData();
		for (const [k, v] of Object.entries(fields)) form.append(k, v);
		const e = event(who, jobId, `/app/jobs/${jobId}/measure?/${action}`, {
			method: 'POST',
			body: form
		});
		try {
			return await (actions as Record<string, (e: RequestEvent) => Promise<unknown>>)[action](e);
		} catch (thrown) {
			if (isRedirect(thrown)) return thrown;
			throw thrown;
		}
	}

	it('saves the fields typed and the button pressed (add a hole), then shows the room again', async () => {
		const job = await makeJob(store.id, owner.user.id);
		const drawn = draft(emptyRoom('r1', 'Kitchen'));
		const answer = await post(sales, job.id, {
			baseVersion: '0',
			_draft: JSON.stringify(drawn),
			room: 'r1',
			'rooms.0.shape.width': "12'",
			'rooms.0.shape.length': '8\' 6"',
			op: 'add:rooms.0.repairs.holes'
		});
		expect(isRedirect(answer) && answer.location).toBe(
			`/app/jobs/${job.id}/measure?room=r1#m-rooms-0-repairs-holes-0-width`
		);
		const stored = await inStore(store.id, (tx) => measures.read(tx, job.id));
		expect(stored?.version).toBe(1);
		expect(stored?.draft.rooms[0].shape).toEqual({ kind: 'rect', width: "12'", length: '8\' 6"' });
		expect(stored?.draft.rooms[0].repairs.holes).toEqual([{ width: '', length: '' }]);
	});

	it('a form drawn from an older version is refused with both, and nothing is written', async () => {
		const job = await makeJob(store.id, owner.user.id);
		await inStore(store.id, (tx) =>
			measures.save(tx, job.id, draft(emptyRoom('r1', 'Theirs')), 0, owner.user.id)
		);
		const answer = await post(sales, job.id, {
			baseVersion: '0',
			_draft: JSON.stringify(draft(emptyRoom('r1', 'Kitchen'))),
			'rooms.0.name': 'Mine'
		});
		expect(isActionFailure(answer) && answer.status).toBe(409);
		const data = (
			answer as { data: { conflict: { mine: MeasureDraft; current: { version: number } } } }
		).data;
		expect(data.conflict.mine.rooms[0].name).toBe('Mine');
		expect(data.conflict.current.version).toBe(1);
		expect((await inStore(store.id, (tx) => measures.read(tx, job.id)))?.draft.rooms[0].name).toBe(
			'Theirs'
		);

		// Choosing mine for the room saves it on top of theirs.
		const chosen = await post(
			sales,
			job.id,
			{
				baseVersion: '1',
				mineVersion: '0',
				_mine: JSON.stringify(data.conflict.mine),
				'pick.r1': 'mine',
				'pick.builtYear': 'mine'
			},
			'resolve'
		);
		expect(isRedirect(chosen)).toBe(true);
		expect(await inStore(store.id, (tx) => measures.read(tx, job.id))).toMatchObject({
			version: 2,
			draft: { rooms: [{ name: 'Mine' }] }
		});
	});

	it('removing a room asks first, then removes it', async () => {
		const job = await makeJob(store.id, owner.user.id);
		const two = draft(emptyRoom('r1', 'Kitchen'), emptyRoom('r2', 'Hall'));
		await inStore(store.id, (tx) => measures.save(tx, job.id, two, 0, owner.user.id));
		const ask = await post(sales, job.id, {
			baseVersion: '1',
			_draft: JSON.stringify(two),
			op: 'remove-room:r1'
		});
		expect(isRedirect(ask) && ask.location).toContain('remove=r1');
		expect((await inStore(store.id, (tx) => measures.read(tx, job.id)))?.draft.rooms).toHaveLength(
			2
		);
		await post(sales, job.id, {
			baseVersion: '1',
			_draft: JSON.stringify(two),
			op: 'remove-room-now:r1'
		});
		expect(
			(await inStore(store.id, (tx) => measures.read(tx, job.id)))?.draft.rooms.map((r) => r.id)
		).toEqual(['r2']);
	});
});
